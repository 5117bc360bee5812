/** Entry point of the one-shot command: `npm run -s solute -- [--json] [--units si|conventional] "<message>"`. */
import { oneShot } from "../adapters/console/oneshot.js";
import { MemoryStore } from "../adapters/store/memory.js";

process.exitCode = await oneShot(
  process.argv.slice(2),
  (s) => process.stdout.write(`${s}\n`),
  (s) => process.stderr.write(`${s}\n`),
  () => new MemoryStore(),
);
