import { CORPUS } from "./bench/corpus.ts";
import { computeReply } from "./bot/compute.ts";
import { renderText } from "./bot/text.ts";
import { assess } from "./core/assess.ts";
import { readMessage } from "./core/reader.ts";

const N = 300000;
let t = performance.now();
for (let i = 0; i < N; i++) {
  const m = CORPUS[i % CORPUS.length]!;
  const r = readMessage(m);
  const a = assess(r.inputs);
  renderText(computeReply(r, a, false));
}
console.log("full", ((N / (performance.now() - t)) * 1000).toFixed(0), "msg/s");
t = performance.now();
for (let i = 0; i < N; i++) readMessage(CORPUS[i % CORPUS.length]!);
console.log("read us", (((performance.now() - t) / N) * 1000).toFixed(2));
