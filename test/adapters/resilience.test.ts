/**
 * Staying up when a dependency misbehaves, over loopback with the real SDKs: a Slack that cannot
 * authenticate, a frozen and a killed Redis, bodies that are not what a platform sends, bad
 * settings. Each test is bounded by the code's own timeouts, not by sleeps.
 */
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { createSlackAdapter } from "../../adapters/slack/app.js";
import { MemoryStore } from "../../adapters/store/memory.js";
import { RedisStore } from "../../adapters/store/redis.js";
import { loadConfig } from "../../bot/config.js";
import { Conversation } from "../../bot/conversation.js";
import { type HttpServer, startServer } from "../../bot/server.js";
import { startRedis, type TestRedis } from "../helpers/redis.js";
import { fakeSlack, postSigned } from "../helpers/slack.js";
import { cleanEnv, run } from "../helpers/spawn.js";
import { startStack } from "../helpers/stack.js";

const SIGNING = "slack-signing-secret-for-tests";
const cleanups: (() => Promise<void>)[] = [];
afterEach(async () => {
  for (const c of cleanups.splice(0)) await c();
});

describe("a Slack that cannot authenticate", () => {
  it("is retried with backoff and named by /readyz; Slack requests get 503; it recovers by itself", async () => {
    const api = await fakeSlack();
    let failing = true;
    api.methods["auth.test"] = () =>
      failing ? { ok: false, error: "invalid_auth" } : { ok: true, user_id: "U00FAKEBOT01", bot_id: "B1" };
    const config = loadConfig({
      SOLUTE_SECRET: "solute-secret-0123456789",
      SLACK_BOT_TOKEN: "xoxb-test",
      SLACK_SIGNING_SECRET: SIGNING,
      SLACK_API_URL: `${api.url}/api/`,
    });
    const store = new MemoryStore();
    const slack = createSlackAdapter({
      config: config.slack!,
      bot: new Conversation(store, config),
      backoffMs: 20,
    });
    await slack.start(); // never throws
    const server: HttpServer = await startServer({
      port: 0,
      host: "127.0.0.1",
      routes: { "/slack/events": slack.handler! },
      store,
      checks: () => ({ slack: slack.status() }),
    });
    cleanups.push(async () => {
      await server.close();
      await slack.stop();
      await api.close();
    });
    const base = `http://127.0.0.1:${server.port}`;
    expect(slack.status()).toEqual({ ready: false, code: "invalid_auth" });
    const ready = await fetch(`${base}/readyz`);
    expect(ready.status).toBe(503);
    expect(await ready.json()).toMatchObject({ waiting: { slack: "invalid_auth" } });
    expect((await fetch(`${base}/healthz`)).status).toBe(200);
    expect((await postSigned(`${base}/slack/events`, SIGNING, "{}", "application/json")).status).toBe(503);
    failing = false;
    const until = Date.now() + 5000;
    while (!slack.status().ready && Date.now() < until) await new Promise((r) => setTimeout(r, 10));
    expect(slack.status().ready).toBe(true);
    expect(api.calls.filter((c) => c.path === "/api/auth.test").length).toBeGreaterThanOrEqual(2);
    expect((await fetch(`${base}/readyz`)).status).toBe(200);
  });
});

describe("bodies that are not what a platform sends", () => {
  it("Slack: only an envelope with a type, a form with such a payload, a command or ssl_check passes", async () => {
    const { plausibleBody } = await import("../../adapters/slack/app.js");
    const json = (s: string) => plausibleBody(Buffer.from(s), "application/json");
    const form = (s: string) => plausibleBody(Buffer.from(s), "application/x-www-form-urlencoded");
    expect(json('{"type":"event_callback","event":{"type":"app_mention"}}')).toBe(true);
    // Bolt and the socket client read the event's type: an envelope without an event is refused.
    for (const event of ["null", "[]", "{}", '"x"'])
      expect(json(`{"type":"event_callback","event":${event}}`)).toBe(false);
    expect(json('{"actions":[],"challenge":"x"}')).toBe(false); // found by npm run fuzz: Bolt said 500
    expect(json('{"type":3}')).toBe(false);
    expect(form(`payload=${encodeURIComponent('{"type":"block_actions"}')}`)).toBe(true);
    expect(form(`payload=${encodeURIComponent("{}")}`)).toBe(false);
    expect(form("command=%2Fsolute&text=Na+128")).toBe(true);
    expect(form("ssl_check=1&token=x")).toBe(true);
    expect(form("text=Na+128")).toBe(false);
  });

  it.each(["null", "[]", "42", '"text"'])(
    "%s → 400 on Slack and Teams, nothing processed, still up",
    async (body) => {
      const { api, base, close } = await startStack({ signing: SIGNING, teams: true });
      cleanups.push(close);
      expect((await postSigned(`${base}/slack/events`, SIGNING, body, "application/json")).status).toBe(400);
      const payload = `payload=${encodeURIComponent(body)}`;
      expect(
        (await postSigned(`${base}/slack/events`, SIGNING, payload, "application/x-www-form-urlencoded"))
          .status,
      ).toBe(400);
      const t = await fetch(`${base}/api/messages`, {
        method: "POST",
        headers: { "content-type": "application/json" },
        body,
      });
      expect(t.status).toBe(400);
      expect((await fetch(`${base}/healthz`)).status).toBe(200);
      expect(api.calls.filter((c) => c.path !== "/api/auth.test")).toEqual([]);
    },
  );
});

describe("a Redis that hangs or loses its data", () => {
  let redis: TestRedis;
  beforeAll(async () => {
    redis = await startRedis();
  });
  afterAll(async () => {
    await redis.stop();
  });

  it("frozen (SIGSTOP): calculations answer without it, /readyz says 503 within a second, shutdown ends", async () => {
    if (!redis.owned) return;
    const store = new RedisStore(redis.url, Date.now, 150);
    await store.connect();
    const config = loadConfig({ SOLUTE_SECRET: "solute-secret-0123456789", REDIS_URL: redis.url });
    const bot = new Conversation(store, config);
    const server = await startServer({ port: 0, host: "127.0.0.1", routes: {}, store });
    redis.signal("SIGSTOP");
    try {
      const reply = await bot.handle({
        text: "bed 3 Na 121 glu 6 mmol/L urea 4 mmol/L",
        channel: "c",
        platform: "console",
      });
      expect(reply.facts.length).toBeGreaterThan(0);
      expect(reply.notes.join()).toMatch(/not logged/);
      const ready = await fetch(`http://127.0.0.1:${server.port}/readyz`);
      expect(ready.status).toBe(503);
      await server.close();
      await store.close();
    } finally {
      redis.signal("SIGCONT");
    }
  });

  it("restarted without persistence: the handover says the log starts after the reset", async () => {
    if (!redis.owned) return;
    const config = loadConfig({ SOLUTE_SECRET: "solute-secret-0123456789", REDIS_URL: redis.url });
    let now = Date.now();
    const store = new RedisStore(redis.url, () => now);
    await store.connect();
    const bot = new Conversation(store, config, () => now);
    await bot.handle({ text: "bed 1 Na 120", channel: "c", platform: "console" });
    now += 6 * 3_600_000;
    await redis.restart();
    await store.connect();
    const until = Date.now() + 5000;
    while (!(await store.ready()) && Date.now() < until) await new Promise((r) => setTimeout(r, 20));
    await bot.handle({ text: "bed 1 Na 124", channel: "c", platform: "console" });
    const h = await bot.handle({ text: "handover", channel: "c", platform: "console" });
    expect(h.problems.map((p) => p.code)).toContain("store.logReset");
    expect(h.problems.find((p) => p.code === "store.logReset")!.message).toMatch(/log starts just now/);
    await store.close();
  });
});

describe("bad settings stop start-up with one clear line", () => {
  it.each([
    [
      { REDIS_URL: "http://localhost:6379", SOLUTE_SECRET: "solute-secret-0123456789" },
      /REDIS_URL: must be a redis:\/\/ or rediss:\/\/ URL/,
    ],
    [{ HOST: "not a host!", TEAMS_LOCAL: "1" }, /HOST: must be an IP address or a host name/],
    [
      { NODE_ENV: "Production", TEAMS_LOCAL: "1", SOLUTE_SECRET: "solute-secret-0123456789" },
      /TEAMS_LOCAL: authentication cannot be turned off/,
    ],
    [
      { NODE_ENV: "prod", TEAMS_LOCAL: "1", SOLUTE_SECRET: "solute-secret-0123456789" },
      /TEAMS_LOCAL: authentication cannot be turned off/,
    ],
  ])("%j", async (env, message) => {
    const r = await run(process.execPath, ["--import", "tsx", "bot/main.ts"], { env: cleanEnv(env) });
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(message);
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });

  it("a port already in use", async () => {
    const busy = await startServer({ port: 0, host: "127.0.0.1", routes: {}, store: new MemoryStore() });
    try {
      const r = await run(process.execPath, ["--import", "tsx", "bot/main.ts"], {
        env: cleanEnv({ TEAMS_LOCAL: "1", PORT: String(busy.port), HOST: "127.0.0.1" }),
      });
      expect(r.code).toBe(1);
      expect(r.stderr).toMatch(new RegExp(`port ${busy.port} is in use`));
      expect(r.stderr).not.toMatch(/\n\s+at /);
    } finally {
      await busy.close();
    }
  });
});

describe("rate limits", () => {
  it("a 429 without Retry-After is retried with bounded backoff, for that call only", async () => {
    const { withBackoff } = await import("../../adapters/slack/app.js");
    let calls = 0;
    const limited = Object.assign(new Error("rate limited"), { code: "slack_webapi_rate_limited_error" });
    const value = await withBackoff(async () => {
      calls++;
      if (calls < 3) throw limited;
      return "posted";
    }, 1);
    expect([value, calls]).toEqual(["posted", 3]);
    calls = 0;
    await expect(
      withBackoff(async () => {
        calls++;
        throw limited;
      }, 1),
    ).rejects.toBe(limited);
    expect(calls).toBe(4);
    // Anything but a rate limit is not retried.
    calls = 0;
    await expect(
      withBackoff(async () => {
        calls++;
        throw new Error("x");
      }, 1),
    ).rejects.toThrow("x");
    expect(calls).toBe(1);
  });

  it("through the real client: a mention answered after a 429 without Retry-After", async () => {
    const { api, base, close } = await startStack({ signing: SIGNING });
    cleanups.push(close);
    api.failNext("/api/chat.postMessage", 429, 1, true);
    const { fixture } = await import("../helpers/fixtures.js");
    const recorded = fixture("channel-mention-slack.json").mention;
    const body = JSON.stringify({
      ...recorded,
      event_id: "EvRATE1",
      event: {
        ...recorded.event,
        type: "app_mention",
        text: "<@U00FAKEBOT01> Na 128 glu 6 mmol/L urea 4 mmol/L",
      },
    });
    await postSigned(`${base}/slack/events`, SIGNING, body, "application/json");
    await api.waitFor((c) => c.filter((x) => x.path === "/api/chat.postMessage").length === 2, 10_000);
  });
});
