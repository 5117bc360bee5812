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
import { type Renderer, rehearse } from "./warm.js";

/** The store the configuration asks for: Redis when REDIS_URL is set, else in memory. */
export async function makeStore(config: Config): Promise<Store> {
  if (!config.redisUrl) return new MemoryStore();
  const { RedisStore } = await import("../adapters/store/redis.js");
  const store = new RedisStore(config.redisUrl, Date.now, config.storeTimeoutMs);
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
  let warm = false;
  const checks: Record<string, () => { ready: boolean; code?: string }> = {
    engine: () => ({ ready: warm, code: "warming" }),
  };
  const renderers: Renderer[] = [];
  // The unit tables load while the platforms start.
  const units = loadUnits();

  if (config.slack) {
    const { createSlackAdapter } = await import("../adapters/slack/app.js");
    const { render } = await import("../adapters/slack/render.js");
    renderers.push((reply, source) => render(reply, { source, offerPost: true }));
    const slack = createSlackAdapter({ config: config.slack, bot });
    if (slack.handler) routes["/slack/events"] = slack.handler;
    // Never fatal: a Slack that cannot authenticate is retried in the background and named by
    // /readyz, while Teams and the health endpoints keep serving.
    await slack.start();
    checks.slack = () => slack.status();
    stops.push(() => slack.stop());
    log("info", config.slack.appToken ? "slack.socket-mode" : "slack.http", { platform: "slack" });
  }

  if (config.teams) {
    const { createTeamsAdapter } = await import("../adapters/teams/app.js");
    const { renderCard } = await import("../adapters/teams/render.js");
    renderers.push((reply) => renderCard(reply));
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

  const server = await startServer({
    port: config.port,
    host: config.host,
    routes,
    store,
    checks: () => Object.fromEntries(Object.entries(checks).map(([k, c]) => [k, c()])),
  });
  // The unit tables load, then a rehearsal runs every path once (bot/warm.ts): /readyz turns 200
  // only after both, so the first message waits for nothing and meets compiled code.
  await units;
  await rehearse(
    config,
    config.slack ? "slack" : config.teams ? "teams" : "console",
    renderers,
    new MemoryStore(),
  );
  warm = true;
  log("info", "ready", { count: server.port });
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
