// Every test may convert units: load the unit machinery (mathjs) once, as the conversation does.
import { loadUnits } from "../core/units.js";

await loadUnits();
