/**
 * Entry point: `npm start`. Starts what the configuration asks for — Slack, Teams, or with neither,
 * the terminal chat — on one store (memory, or Redis when REDIS_URL is set).
 */
import { startConsole } from "../adapters/console/app.js";
import { type Config, ConfigError, loadConfig } from "./config.js";
import { Conversation } from "./conversation.js";
import { errorCode, log, setQuiet } from "./log.js";
import { makeStore, startPlatforms } from "./platforms.js";

/** A listen error as one line a person can act on. */
function startError(error: unknown, config: Config): string | undefined {
  const code = (error as { code?: string }).code;
  if (code === "EADDRINUSE") return `Solute cannot start: port ${config.port} is in use (PORT).`;
  if (code === "EACCES") return `Solute cannot start: not allowed to listen on port ${config.port} (PORT).`;
  if (code === "EADDRNOTAVAIL" || code === "ENOTFOUND" || code === "EAI_AGAIN")
    return `Solute cannot start: HOST ${config.host} is not an address of this machine.`;
  return undefined;
}

// A rejection nobody handled is logged with its code; the process stays up (the conversation,
// the store and the platforms each carry on without what failed).
process.on("unhandledRejection", (reason) =>
  log("error", "unhandled-rejection", { code: errorCode(reason) }),
);

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
  let running: Awaited<ReturnType<typeof startPlatforms>>;
  try {
    running = await startPlatforms(config);
  } catch (error) {
    const line = startError(error, config);
    if (!line) throw error;
    process.stderr.write(`${line}\n`);
    process.exit(1);
  }
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
