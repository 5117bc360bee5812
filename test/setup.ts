// Every test may convert units: load the unit machinery (mathjs) once, as the conversation does.
import fc from "fast-check";
import { beforeEach } from "vitest";
import { setLogSink } from "../bot/log.js";
import { loadUnits } from "../core/units.js";

// Property tests are seeded, so a failure can be replayed: FC_SEED=<seed> npm test. fast-check
// prints the seed and the shrunk counterexample of any failure; keep that input as a fixture.
const seed = Number(process.env.FC_SEED ?? 20261202);
fc.configureGlobal({ seed });

// Log lines are captured per test and shown only when that test fails.
let captured: string[] = [];
setLogSink((line) => captured.push(line));
beforeEach((ctx) => {
  captured = [];
  ctx.onTestFailed(() => {
    if (captured.length > 0) process.stderr.write(`${captured.join("\n")}\n`);
  });
});

await loadUnits();
