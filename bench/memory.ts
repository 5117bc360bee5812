/**
 * Memory under a long night: 100,000 messages through the conversation (memory store, the embedded
 * default), resident memory sampled after a collection every 10,000. Prints one JSON line.
 * Run by bench/run.ts, bundled like production (node --expose-gc).
 */
import { MemoryStore } from "../adapters/store/memory.js";
import { loadConfig } from "../bot/config.js";
import { Conversation } from "../bot/conversation.js";
import { setLogSink } from "../bot/log.js";
import { renderText } from "../bot/text.js";
import { CORPUS } from "./corpus.js";

setLogSink(() => {});
const gc = (globalThis as { gc?: () => void }).gc ?? (() => {});
const bot = new Conversation(
  new MemoryStore(),
  loadConfig({ SOLUTE_SECRET: "bench-secret-0123456789", SOLUTE_RATE_LIMIT: "100000" }),
);
const samples: { messages: number; rssMb: number; heapMb: number }[] = [];
const TOTAL = 100_000;
for (let i = 1; i <= TOTAL; i++) {
  const reply = await bot.handle({
    text: CORPUS[i % CORPUS.length]!,
    channel: `C${i % 40}`,
    platform: "slack",
  });
  renderText(reply);
  if (i % 10_000 === 0) {
    gc();
    const m = process.memoryUsage();
    samples.push({ messages: i, rssMb: m.rss / 2 ** 20, heapMb: m.heapUsed / 2 ** 20 });
  }
}
process.stdout.write(`${JSON.stringify({ samples })}\n`);
