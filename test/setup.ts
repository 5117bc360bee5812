// Every test may convert units: load the unit machinery (mathjs) once, as the conversation does.
import fc from "fast-check";
import { loadUnits } from "../core/units.js";

// Property tests are seeded, so a failure can be replayed: FC_SEED=<seed> npm test. fast-check
// prints the seed and the shrunk counterexample of any failure; keep that input as a fixture.
const seed = Number(process.env.FC_SEED ?? 20261202);
fc.configureGlobal({ seed });

await loadUnits();
