/**
 * Wires the chat platforms, the store and the HTTP server together for `npm start`. Each platform's
 * SDK and the Redis client are loaded only when configured, so start-up pays for what it uses.
 */
import { MemoryStore } from "../adapters/store/memory.js";
import { loadUnits } from "../core/units.js";
import type { Config } from "./config.js";
import { Conversation } from "./conversation.js";
import { drain } from "./inflight.js";
import { log } from "./log.js";
import { type Handler, startServer } from "./server.js";
import type { Store } from "./store.js";

/** The store the configuration asks for: Redis when REDIS_URL is set, else in memory. */
export async function makeStore(config: Config): Promise<Store> {
  if (!config.redisUrl) return new MemoryStore();
  const { RedisStore } = await import("../adapters/store/redis.js");
  const store = new RedisStore(config.redisUrl);
  await store.connect();
  const ok = await store.ready();
  log(ok ? "info" : "warn", "store.redis", { code: ok ? "ready" : "not-yet-reachable" });
  return store;
}

export interface Running {
  port?: number;
  stop(): Promise<void>;
}

/** Starts the chat platforms the configuration names; resolves once they are ready. */
export async function startPlatforms(config: Config): Promise<Running> {
  const store = await makeStore(config);
  const bot = new Conversation(store, config);
  const routes: Record<string, Handler> = {};
  const stops: (() => Promise<void>)[] = [];

  if (config.slack) {
    const { createSlackAdapter } = await import("../adapters/slack/app.js");
    const slack = createSlackAdapter({ config: config.slack, bot });
    if (slack.handler) routes["/slack/events"] = slack.handler;
    await slack.start();
    stops.push(() => slack.stop());
    log("info", config.slack.appToken ? "slack.socket-mode" : "slack.http", { platform: "slack" });
  }

  if (config.teams) {
    const { createTeamsAdapter } = await import("../adapters/teams/app.js");
    const teams = createTeamsAdapter({ config: config.teams, bot });
    routes["/api/messages"] = teams.handler;
    if (config.teams.local) {
      log("warn", "teams.authentication-off", { platform: "teams" });
      process.stderr.write(
        "\n*** Teams authentication is OFF (TEAMS_LOCAL=1): any request to /api/messages is answered. For local trials only. ***\n\n",
      );
    }
    log("info", "teams.http", { platform: "teams" });
  }

  const server = await startServer({ port: config.port, host: config.host, routes, store });
  log("info", "ready", { count: server.port });
  // Warm the unit machinery now, so the first message does not wait for it.
  void loadUnits();
  return {
    port: server.port,
    stop: async () => {
      // Stop accepting; let requests in flight finish, then the work they started; then close.
      await server.close();
      await drain();
      for (const stop of stops) await stop();
      await store.close();
    },
  };
}
