/**
 * Entry point: `npm start`. Starts what the configuration asks for — Slack, Teams, or with neither,
 * the terminal chat — on one store (memory, or Redis when REDIS_URL is set).
 */
import { startConsole } from "../adapters/console/app.js";
import { MemoryStore } from "../adapters/store/memory.js";
import { ConfigError, loadConfig } from "./config.js";
import { Conversation } from "./conversation.js";
import { log, setQuiet } from "./log.js";

async function main(): Promise<void> {
  let config: ReturnType<typeof loadConfig>;
  try {
    config = loadConfig();
  } catch (e) {
    if (e instanceof ConfigError) {
      process.stderr.write(`${e.message}\n`);
      process.exit(1);
    }
    throw e;
  }
  const store = new MemoryStore();
  const bot = new Conversation(store, config);

  setQuiet(true);
  await startConsole(bot, process.stdin, process.stdout);
  await store.close();
  log("info", "stopped");
}

await main();
