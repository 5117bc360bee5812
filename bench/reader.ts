/** The reader alone over the invented corpus, best of three runs (the engine row's first step). */
import { readMessage } from "../core/reader/index.js";
import { loadUnits } from "../core/units.js";
import { CORPUS } from "./corpus.js";

await loadUnits();

function run(n: number): number {
  const t = performance.now();
  for (let i = 0; i < n; i++) readMessage(CORPUS[i % CORPUS.length]!);
  return (n / (performance.now() - t)) * 1000;
}

run(50_000);
process.stdout.write(`${JSON.stringify({ best: Math.max(run(150_000), run(150_000), run(150_000)) })}\n`);
