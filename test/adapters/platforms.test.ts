/**
 * One platform contract, run against every chat adapter over loopback HTTP with the real SDK:
 * authentication in both directions (a correctly signed request is answered, a forged one is
 * refused and nothing is processed), de-duplication of a redelivered event, privacy (nothing of the
 * message's identifiers is echoed, logged or stored) and the platform's rendering limits. The
 * terminal joins where the contract applies to it (privacy). Each driver says how its platform
 * signs, delivers and receives; the assertions are the same for all.
 *
 * Teams sends its replies with a token from Microsoft's login service, which no test can reach. So
 * Teams' authentication is checked on an adapter with an app ID and a local signing-key set (its
 * turn runs and the conversation answers; the reply cannot leave), and what the replies hold on a
 * second adapter with authentication off (TEAMS_LOCAL=1), as a developer runs it.
 *
 * "Nothing else arrives" is proven without sleeping: Teams answers the POST when its turn has
 * ended, and the Slack adapter tracks each event from before Bolt acknowledges it, so `drain()`
 * returns once every reply has been posted.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { oneShot } from "../../adapters/console/oneshot.js";
import { createSlackAdapter, type SlackAdapter } from "../../adapters/slack/app.js";
import { checkBlocks, LIMITS } from "../../adapters/slack/limits.js";
import { MemoryStore } from "../../adapters/store/memory.js";
import { createTeamsAdapter } from "../../adapters/teams/app.js";
import { CARD_BYTES } from "../../adapters/teams/render.js";
import { loadConfig } from "../../bot/config.js";
import { Conversation } from "../../bot/conversation.js";
import { drain } from "../../bot/inflight.js";
import { setLogSink } from "../../bot/log.js";
import { type HttpServer, startServer } from "../../bot/server.js";
import { cardProblems } from "../helpers/cards.js";
import { fixture } from "../helpers/fixtures.js";
import { type KeySet, localKeySet } from "../helpers/keys.js";
import { type FakeSlack, fakeSlack, postSigned } from "../helpers/slack.js";
import { type FakeConnector, fakeConnector, replay } from "../helpers/teams.js";

const SIGNING = "platform-contract-signing";
const APP_ID = "11111111-2222-3333-4444-555555555555";
const PANEL = "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310";
// Invented identifiers of the kinds the privacy guard looks for.
const IDENTIFIED = "bed 7 Mrs Quennell-Abara MRN 4471093 Na 121 glu 6 mmol/L urea 4 mmol/L";
const SECRETS = ["Quennell", "Abara", "4471093"];
// A long paste: every line a result, to press on each platform's size limits.
const LONG = Array.from(
  { length: 40 },
  (_, i) => `Sodium ${120 + (i % 20)} L (135 - 145 mmol/L) ${i % 2 ? "H" : ""}`,
).join("\n");

interface Delivery {
  /** The platform's answer to the HTTP request. */
  status: number;
}

interface Driver {
  name: string;
  /** Delivers a message the way the platform does; `id` repeats a delivery. */
  deliver(text: string, id?: string): Promise<Delivery>;
  /** Delivers a message to the authenticating adapter, correctly signed. */
  signed(text: string): Promise<Delivery>;
  /** The same delivery, forged: a wrong signature, or a token signed with another key. */
  forge(text: string): Promise<Delivery>;
  /** Waits until the adapter's work for what was delivered has ended. */
  settled(): Promise<void>;
  /** What the platform has received from Solute so far, one JSON string per message. */
  received(): string[];
  /** Checks one received message against the platform's rendering limits; problems, or []. */
  limits(message: string): string[];
}

const logs: string[] = [];
let store: MemoryStore;
let server: HttpServer;
let api: FakeSlack;
let connector: FakeConnector;
let keys: KeySet;
let slack: SlackAdapter;
let base: string;

beforeAll(async () => {
  setLogSink((l) => logs.push(l));
  api = await fakeSlack();
  connector = await fakeConnector();
  keys = await localKeySet();
  const config = loadConfig({
    SOLUTE_SECRET: "solute-secret-0123456789",
    SLACK_BOT_TOKEN: "xoxb-test",
    SLACK_SIGNING_SECRET: SIGNING,
    SLACK_API_URL: `${api.url}/api/`,
    MicrosoftAppId: APP_ID,
    MicrosoftAppPassword: "not-a-real-password",
    TEAMS_OPENID_METADATA_URL: keys.metadataUrl,
  });
  store = new MemoryStore();
  const bot = new Conversation(store, config);
  slack = createSlackAdapter({ config: config.slack!, bot });
  await slack.start();
  const teams = createTeamsAdapter({ config: config.teams!, bot });
  const local = loadConfig({ SOLUTE_SECRET: "solute-secret-0123456789", TEAMS_LOCAL: "1" });
  const teamsLocal = createTeamsAdapter({ config: local.teams!, bot });
  server = await startServer({
    port: 0,
    host: "127.0.0.1",
    routes: {
      "/slack/events": slack.handler!,
      "/api/messages": teams.handler,
      "/local/messages": teamsLocal.handler,
    },
    store,
  });
  base = `http://127.0.0.1:${server.port}`;
});

afterAll(async () => {
  setLogSink(() => {});
  await server.close();
  await slack.stop();
  await api.close();
  await connector.close();
  await keys.close();
});

let serial = 0;
const slackDriver: Driver = {
  name: "Slack",
  deliver: async (text, id) => {
    const recorded = fixture("dm-slack.json").dmMessage;
    const body = JSON.stringify({
      ...recorded,
      event_id: id ?? `EvContract${++serial}`,
      event: { ...recorded.event, text },
    });
    return postSigned(`${base}/slack/events`, SIGNING, body, "application/json", {
      ...(id && { headers: { "x-slack-retry-num": "1", "x-slack-retry-reason": "http_timeout" } }),
    });
  },
  signed: (text) => slackDriver.deliver(text),
  forge: async (text) => {
    const recorded = fixture("dm-slack.json").dmMessage;
    const body = JSON.stringify({
      ...recorded,
      event_id: `EvForged${++serial}`,
      event: { ...recorded.event, text },
    });
    return postSigned(`${base}/slack/events`, SIGNING, body, "application/json", { badSignature: true });
  },
  settled: () => drain(),
  received: () =>
    api.calls.filter((c) => c.path === "/api/chat.postMessage").map((c) => JSON.stringify(c.body)),
  limits: (message) => {
    const body = JSON.parse(message) as { blocks?: Parameters<typeof checkBlocks>[0]; text?: string };
    const problems = checkBlocks(body.blocks ?? []);
    if ((body.text ?? "").length > LIMITS.fallbackText) problems.push("fallback text too long");
    return problems;
  },
};

const claims = () => ({
  iss: "https://api.botframework.com",
  aud: APP_ID,
  serviceurl: connector.serviceUrl,
  nbf: Math.floor(Date.now() / 1000) - 60,
  exp: Math.floor(Date.now() / 1000) + 600,
});
const teamsPost = (text: string, token: string | undefined, id?: string) =>
  fetch(`${base}${token ? "/api/messages" : "/local/messages"}`, {
    method: "POST",
    headers: { "content-type": "application/json", ...(token && { authorization: `Bearer ${token}` }) },
    body: JSON.stringify(
      replay(fixture("dm-teams.json").dmMessage, text, connector.serviceUrl, id ?? `contract-${++serial}`),
    ),
  });
const teamsDriver: Driver = {
  name: "Teams",
  deliver: (text, id) => teamsPost(text, undefined, id),
  signed: (text) => teamsPost(text, keys.sign(claims())),
  forge: (text) => teamsPost(text, keys.signWithOtherKey(claims())),
  // The POST is answered when the turn has ended.
  settled: async () => {},
  received: () => connector.sent.map((s) => JSON.stringify(s.activity)),
  limits: (message) => {
    const activity = JSON.parse(message) as { attachments?: { content: Record<string, unknown> }[] };
    const problems: string[] = [];
    for (const a of activity.attachments ?? []) {
      problems.push(...cardProblems(a.content));
      if (Buffer.byteLength(JSON.stringify(a.content)) > CARD_BYTES)
        problems.push("card over its size limit");
    }
    return problems;
  },
};

describe.each([slackDriver, teamsDriver])("$name: the platform contract", (driver) => {
  it("a correctly signed message is accepted and its turn runs", async () => {
    logs.length = 0;
    expect((await driver.signed(PANEL)).status).toBe(200);
    await driver.settled();
    expect(logs.some((l) => l.includes('"event":"reply"'))).toBe(true);
  });

  it("a message is answered, with the numbers", async () => {
    const before = driver.received().length;
    expect((await driver.deliver(PANEL)).status).toBe(200);
    await driver.settled();
    const replies = driver.received().slice(before);
    expect(replies).toHaveLength(1);
    expect(replies[0]).toContain("calculated 300.0");
  });

  it("a forged one is refused with 401, and nothing is processed", async () => {
    const before = driver.received().length;
    logs.length = 0;
    expect((await driver.forge(PANEL)).status).toBe(401);
    await driver.settled();
    expect(driver.received().length).toBe(before);
    expect(logs.some((l) => l.includes('"event":"reply"'))).toBe(false);
  });

  it("a redelivered message is answered once", async () => {
    const before = driver.received().length;
    const id = `${driver.name}-redelivered`;
    expect((await driver.deliver(PANEL, id)).status).toBe(200);
    expect((await driver.deliver(PANEL, id)).status).toBe(200);
    await driver.settled();
    expect(driver.received().length - before).toBe(1);
  });

  it("identifiers in a message are never echoed, logged or stored", async () => {
    const before = driver.received().length;
    logs.length = 0;
    await driver.deliver(IDENTIFIED);
    await driver.settled();
    const replies = driver.received().slice(before);
    expect(replies).toHaveLength(1);
    expect(replies[0]).toContain("121");
    const stored = store.dump();
    // The tagged calculation was logged: the scan below looks at a real record.
    expect(stored).toContain("bed 7");
    for (const secret of SECRETS) {
      expect(replies[0]).not.toContain(secret);
      expect(logs.join("\n")).not.toContain(secret);
      expect(stored).not.toContain(secret);
    }
  });

  it("a long paste stays inside the platform's rendering limits", async () => {
    const before = driver.received().length;
    await driver.deliver(LONG);
    await driver.settled();
    const replies = driver.received().slice(before);
    expect(replies.length).toBeGreaterThan(0);
    for (const r of replies) expect(driver.limits(r)).toEqual([]);
  });
});

describe("the terminal, where the contract applies", () => {
  it("identifiers are never echoed or logged", async () => {
    logs.length = 0;
    const out: string[] = [];
    await oneShot(
      [IDENTIFIED],
      (s) => out.push(s),
      (s) => out.push(s),
      () => new MemoryStore(),
    );
    expect(out.join("\n")).toContain("121");
    for (const secret of SECRETS) {
      expect(out.join("\n")).not.toContain(secret);
      expect(logs.join("\n")).not.toContain(secret);
    }
  });
});
