/** Solute on Redis: replicas sharing one log and one de-duplication, privacy, and an outage. */
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { createSlackAdapter, type SlackAdapter } from "../../../adapters/slack/app.js";
import { RedisStore } from "../../../adapters/store/redis.js";
import { loadConfig } from "../../../bot/config.js";
import { Conversation } from "../../../bot/conversation.js";
import { setLogSink } from "../../../bot/log.js";
import { type HttpServer, startServer } from "../../../bot/server.js";
import { fixture } from "../../helpers/fixtures.js";
import { startRedis, type TestRedis } from "../../helpers/redis.js";
import { BOT_USER_ID, type FakeSlack, fakeSlack, form, postSigned, sign } from "../../helpers/slack.js";
import { withoutTimes } from "../../helpers/times.js";

const SIGNING = "replica-signing-secret";
const logs: string[] = [];
let redis: TestRedis;
let api: FakeSlack;
const cleanups: (() => Promise<void>)[] = [];

beforeAll(async () => {
  setLogSink((l) => logs.push(l));
  redis = await startRedis();
  api = await fakeSlack();
});
afterEach(async () => {
  for (const c of cleanups.splice(0)) await c();
});
afterAll(async () => {
  setLogSink(() => {});
  await api.close();
  await redis.stop();
});

/** One replica: its own Redis connection, conversation, Bolt app and HTTP server. */
async function replica(): Promise<{ bot: Conversation; store: RedisStore; url: string }> {
  const config = loadConfig({
    SOLUTE_SECRET: "shared-secret-0123456789",
    REDIS_URL: redis.url,
    SLACK_BOT_TOKEN: "xoxb-test",
    SLACK_SIGNING_SECRET: SIGNING,
    SLACK_API_URL: `${api.url}/api/`,
  });
  const store = new RedisStore(redis.url);
  await store.connect();
  const bot = new Conversation(store, config);
  const slack: SlackAdapter = createSlackAdapter({ config: config.slack!, bot });
  await slack.start();
  const server: HttpServer = await startServer({
    port: 0,
    host: "127.0.0.1",
    routes: { "/slack/events": slack.handler! },
    store,
  });
  cleanups.push(async () => {
    await server.close();
    await store.close();
  });
  return { bot, store, url: `http://127.0.0.1:${server.port}/slack/events` };
}

const ask = (bot: Conversation, text: string) =>
  bot.handle({ text, channel: "C00FAKECHAN1", platform: "slack" });

describe("replicas sharing one Redis", () => {
  it("see one shift log", async () => {
    await redis.flush();
    const a = await replica();
    const b = await replica();
    await ask(a.bot, "bed 12 Na 118 glu 6 mmol/L urea 3 mmol/L osm 250");
    await ask(b.bot, "bed 12 Na 123");
    const fromA = await ask(a.bot, "handover");
    const fromB = await ask(b.bot, "handover");
    expect(fromA.headline).toBe("Handover: 1 case, 2 calculations in the last 16 h");
    expect(fromB.facts).toEqual(fromA.facts);
    expect((await ask(b.bot, "forget all")).headline).toMatch(/2 records removed/);
    expect((await ask(a.bot, "handover")).headline).toMatch(/nothing logged/);
  });

  it("share one de-duplication: a retry landing on the other replica is not answered again", async () => {
    await redis.flush();
    const a = await replica();
    const b = await replica();
    const before = api.calls.filter((c) => c.path === "/api/chat.postMessage").length;
    const recorded = fixture("channel-mention-slack.json").mention;
    const body = JSON.stringify({
      ...recorded,
      event_id: "EvREPLICA1",
      event: {
        ...recorded.event,
        type: "app_mention",
        text: `<@${BOT_USER_ID}> Na 140 glu 5 mmol/L urea 5 mmol/L`,
      },
    });
    await postSigned(a.url, SIGNING, body, "application/json");
    await postSigned(b.url, SIGNING, body, "application/json", {
      headers: { "x-slack-retry-num": "1", "x-slack-retry-reason": "http_timeout" },
    });
    await api.waitFor((c) => c.filter((x) => x.path === "/api/chat.postMessage").length > before);
    await new Promise((r) => setTimeout(r, 300));
    expect(api.calls.filter((c) => c.path === "/api/chat.postMessage").length).toBe(before + 1);
  });

  it("share channel settings and rate limits", async () => {
    await redis.flush();
    const a = await replica();
    const b = await replica();
    await ask(a.bot, "units si");
    expect((await ask(b.bot, "glucose 30 Na 130")).data!.assessment!.inputs.glucose).toBe(30);
    expect(await a.store.hit("rate:x", 1, 60_000)).toBe(true);
    expect(await b.store.hit("rate:x", 1, 60_000)).toBe(false);
  });
});

describe("privacy on Redis", () => {
  it("no trace of message text, identifiers or platform IDs in any key or value, or in the logs", async () => {
    await redis.flush();
    logs.length = 0;
    const a = await replica();
    const recorded = fixture("channel-mention-slack.json").mention;
    const messages = [
      "bed 12 Mrs Oyelaran-Whitby DOB 14/02/1951 Na 118 glu 6 mmol/L urea 3 mmol/L osm 250",
      "bay 4B MRN 90817263 Na 139 glu 6.1 mmol/L urea 5.2 mmol/L osm 318 call 0161 496 0321",
      "#7C j.quist@example.org Na 126 aged 93",
    ];
    for (const [i, text] of messages.entries()) {
      const body = JSON.stringify({
        ...recorded,
        event_id: `EvPRIV${i}`,
        event: { ...recorded.event, type: "app_mention", text: `<@${BOT_USER_ID}> ${text}` },
      });
      await postSigned(a.url, SIGNING, body, "application/json");
    }
    const slash = {
      ...fixture("slash-commands-slack.json").slashCommandWithArgs,
      command: "/solute",
      text: "bed 12 Mr Haverleigh Na 121",
      response_url: `${api.url}/respond/p`,
    };
    const slashed = await postSigned(a.url, SIGNING, form(slash), "application/x-www-form-urlencoded");
    expect(slashed.text).not.toContain("Haverleigh");
    const until = Date.now() + 3000;
    const channel = await keyChannel(a.bot);
    while ((await a.store.listRecords(channel, Date.now())).length < 3 && Date.now() < until)
      await new Promise((r) => setTimeout(r, 20));
    const dump = withoutTimes(await redis.dump());
    expect(dump).toMatch(/solute:log:/);
    expect(dump).toContain("bed 12");
    expect(dump).toContain("4B");
    const forbidden = [
      "Oyelaran",
      "Whitby",
      "14/02/1951",
      "1951",
      "90817263",
      "0161",
      "496 0321",
      "quist",
      "example.org",
      "Haverleigh",
      "aged 93",
      "U00FAKEUSER1",
      "U00FAKEUSER2",
      "C00FAKECHAN1",
      "C00FAKECHAN3",
      "T00FAKE00AA",
      "testuser",
      "glu 6",
      "mmol/L urea",
      "Na 118",
    ];
    for (const s of forbidden) {
      expect(dump, s).not.toContain(s);
      expect(withoutTimes(logs.join("\n")), s).not.toContain(s);
    }
  });
});

/** The HMAC the conversation uses for the test channel (the store knows channels only by it). */
async function keyChannel(bot: Conversation): Promise<string> {
  const { channelKey } = await import("../../../bot/privacy.js");
  return channelKey(bot.config.secret, "slack", "C00FAKECHAN1");
}

describe("records read back from Redis", () => {
  it("are checked with the zod schema: a tampered or malformed record is skipped, not trusted", async () => {
    await redis.flush();
    const a = await replica();
    await ask(a.bot, "bed 12 Na 118");
    const channel = await keyChannel(a.bot);
    const { createClient } = await import("redis");
    const c = createClient({ url: redis.url });
    await c.connect();
    const far = Date.now() + 3_600_000;
    await c.zAdd(`solute:log:${channel}`, [
      {
        score: far,
        value: JSON.stringify({
          id: "x",
          record: {
            channel,
            tag: "bed 12",
            at: Date.now(),
            inputs: { sodium: 9000 },
            results: {},
            flags: [],
          },
        }),
      },
      {
        score: far,
        value: JSON.stringify({
          id: "y",
          record: {
            channel,
            tag: "bed 12",
            at: Date.now(),
            inputs: { sodium: 120 },
            results: {},
            flags: [],
            note: "free text",
          },
        }),
      },
      { score: far, value: "not json" },
    ]);
    await c.quit();
    const records = await a.store.listRecords(channel, Date.now());
    expect(records.map((r) => r.inputs.sodium)).toEqual([118]);
  });
});

describe("Redis stopped and restarted", () => {
  it("calculations keep answering, the handover says the log is unavailable, and it recovers by itself", async (ctx) => {
    if (!redis.owned) ctx.skip();
    await redis.flush();
    const a = await replica();
    await ask(a.bot, "bed 12 Na 118");
    await redis.stop();
    const calc = await ask(a.bot, "bed 12 Na 121 glu 6 mmol/L urea 3 mmol/L");
    expect(calc.facts.length).toBe(3);
    expect(calc.notes.join()).toMatch(/not logged/);
    expect((await ask(a.bot, "handover")).problems[0]!.code).toBe("store.unavailable");
    expect(await a.store.ready()).toBe(false);
    // Readiness says so while liveness stays up.
    const probe = await startServer({ port: 0, host: "127.0.0.1", routes: {}, store: a.store });
    expect((await fetch(`http://127.0.0.1:${probe.port}/readyz`)).status).toBe(503);
    expect((await fetch(`http://127.0.0.1:${probe.port}/healthz`)).status).toBe(200);
    await redis.restart();
    const until = Date.now() + 10_000;
    while (!(await a.store.ready()) && Date.now() < until) await new Promise((r) => setTimeout(r, 50));
    expect(await a.store.ready()).toBe(true);
    expect((await fetch(`http://127.0.0.1:${probe.port}/readyz`)).status).toBe(200);
    await probe.close();
    await ask(a.bot, "bed 12 Na 124");
    // Redis kept nothing on disk, so the log starts again from the restart.
    expect((await ask(a.bot, "handover")).headline).toBe("Handover: 1 case, 1 calculation in the last 16 h");
  });
});

describe("replays across replicas", () => {
  it("a signed slash command delivered to two replicas three times is answered and logged once", async () => {
    await redis.flush();
    const a = await replica();
    const b = await replica();
    const body = form({
      ...fixture("slash-commands-slack.json").slashCommandWithArgs,
      command: "/solute",
      text: "bed 6 Na 122 glu 6 mmol/L urea 4 mmol/L",
      response_url: `${api.url}/respond/r`,
    });
    const headers = { ...sign(SIGNING, body), "content-type": "application/x-www-form-urlencoded" };
    const answered: string[] = [];
    for (const target of [a.url, b.url, a.url]) {
      const res = await fetch(target, { method: "POST", headers, body });
      expect(res.status).toBe(200);
      answered.push(await res.text());
    }
    expect(answered.filter((t) => t.includes("blocks"))).toHaveLength(1);
    const { channelKey } = await import("../../../bot/privacy.js");
    const id = fixture("slash-commands-slack.json").slashCommandWithArgs.channel_id as string;
    expect(await b.store.listRecords(channelKey(b.bot.config.secret, "slack", id), Date.now())).toHaveLength(
      1,
    );
  });
});

describe("keys expire when their record does", () => {
  it("the log and its start expire at the latest record's expiry; a shorter record does not shorten them", async () => {
    await redis.flush();
    const store = new RedisStore(redis.url);
    await store.connect();
    cleanups.push(() => store.close());
    const at = Date.now();
    const ttl = 12 * 3_600_000;
    const rec = (offset: number, ttlMs: number) =>
      store.addRecord(
        { channel: "k1", tag: "bed 3", at: at + offset, inputs: { sodium: 120 }, results: {}, flags: [] },
        ttlMs,
      );
    await rec(0, ttl);
    // PEXPIRETIME gives the absolute expiry, so the check does not depend on how long the test took.
    expect(await redis.expiresAt("solute:log:k1")).toBe(at + ttl);
    expect(await redis.expiresAt("solute:logstart:k1")).toBe(at + ttl);
    await rec(1000, ttl);
    expect(await redis.expiresAt("solute:log:k1")).toBe(at + 1000 + ttl);
    expect(await redis.expiresAt("solute:logstart:k1")).toBe(at + 1000 + ttl);
    await rec(2000, 1000);
    expect(await redis.expiresAt("solute:log:k1")).toBe(at + 1000 + ttl);
  });

  it("a saved reply and a de-duplication mark carry their TTL", async () => {
    await redis.flush();
    const store = new RedisStore(redis.url);
    await store.connect();
    cleanups.push(() => store.close());
    await store.saveReply("r1", "{}", 60_000);
    await store.firstSeen("e1", 30_000);
    const { createClient } = await import("redis");
    const c = createClient({ url: redis.url });
    await c.connect();
    const [reply, seen] = [await c.pTTL("solute:reply:r1"), await c.pTTL("solute:seen:e1")];
    await c.quit();
    // A TTL only counts down: at most what was set, and set (-1 would mean no expiry).
    expect(reply).toBeGreaterThan(0);
    expect(reply).toBeLessThanOrEqual(60_000);
    expect(seen).toBeGreaterThan(0);
    expect(seen).toBeLessThanOrEqual(30_000);
  });
});
