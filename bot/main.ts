/**
 * Entry point: `npm start`. Starts what the configuration asks for — Slack, Teams, or with neither,
 * the terminal chat — on one store (memory, or Redis when REDIS_URL is set).
 */
import { startConsole } from "../adapters/console/app.js";
import { type Config, ConfigError, loadConfig } from "./config.js";
import { Conversation } from "./conversation.js";
import { errorCode, log, setQuiet } from "./log.js";
import { makeStore, startPlatforms } from "./platforms.js";

async function main(): Promise<void> {
  let config: Config;
  try {
    config = loadConfig();
  } catch (e) {
    if (e instanceof ConfigError) {
      process.stderr.write(`${e.message}\n`);
      process.exit(1);
    }
    throw e;
  }
  if (!config.slack && !config.teams) {
    setQuiet(true);
    const store = await makeStore(config);
    await startConsole(new Conversation(store, config), process.stdin, process.stdout);
    await store.close();
    return;
  }
  setQuiet(config.logLevel === "warn");
  if (config.ephemeralSecret) log("warn", "config.ephemeral-secret");
  const running = await startPlatforms(config);
  // SIGTERM: stop accepting, let requests in flight finish, close the store, exit 0.
  let stopping = false;
  const shutdown = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    log("info", "stopping", { code: signal });
    try {
      await running.stop();
      log("info", "stopped");
      process.exit(0);
    } catch (error) {
      log("error", "stop-failed", { code: errorCode(error) });
      process.exit(1);
    }
  };
  process.once("SIGTERM", () => void shutdown("SIGTERM"));
  process.once("SIGINT", () => void shutdown("SIGINT"));
}

await main();
