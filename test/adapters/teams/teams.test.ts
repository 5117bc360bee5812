import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { MemoryStore } from "../../../adapters/store/memory.js";
import { createTeamsAdapter } from "../../../adapters/teams/app.js";
import { type AdaptiveCard, CARD_BYTES, escapeMarkdown, renderCard } from "../../../adapters/teams/render.js";
import { loadConfig } from "../../../bot/config.js";
import { Conversation } from "../../../bot/conversation.js";
import { setLogSink } from "../../../bot/log.js";
import { emptyReply } from "../../../bot/reply.js";
import { type HttpServer, startServer } from "../../../bot/server.js";
import { CAUTIONS, SHORT_CAUTIONS } from "../../../core/cautions.js";
import { cardProblems } from "../../helpers/cards.js";
import { fixture } from "../../helpers/fixtures.js";
import { type KeySet, localKeySet } from "../../helpers/keys.js";
import { type FakeConnector, fakeConnector, replay } from "../../helpers/teams.js";
import { withoutTimes } from "../../helpers/times.js";

const PANEL = "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310";
const logs: string[] = [];
let connector: FakeConnector;
let server: HttpServer;
let store: MemoryStore;
let url: string;

beforeAll(() => setLogSink((l) => logs.push(l)));
afterAll(() => setLogSink(() => {}));

async function start(env: Record<string, string>) {
  const config = loadConfig({ SOLUTE_SECRET: "solute-secret-0123456789", ...env });
  store = new MemoryStore();
  const adapter = createTeamsAdapter({ config: config.teams!, bot: new Conversation(store, config) });
  server = await startServer({
    port: 0,
    host: "127.0.0.1",
    routes: { "/api/messages": adapter.handler },
    store,
  });
  url = `http://127.0.0.1:${server.port}/api/messages`;
}

const post = (body: unknown, headers: Record<string, string> = {}) =>
  fetch(url, {
    method: "POST",
    headers: { "content-type": "application/json", ...headers },
    body: typeof body === "string" ? body : JSON.stringify(body),
  });

beforeEach(async () => {
  connector = await fakeConnector();
});
afterEach(async () => {
  await server?.close();
  await connector.close();
});

describe("Teams with authentication off (TEAMS_LOCAL=1, no app ID)", () => {
  beforeEach(() => start({ TEAMS_LOCAL: "1" }));

  it("a channel mention is answered in its reply thread, with the mention stripped", async () => {
    const recorded = fixture("channel-teams.json").mention;
    const activity = replay(recorded, `<at>Chat SDK Demo</at> ${PANEL}`, connector.serviceUrl);
    const res = await post(activity);
    expect(res.status).toBe(200);
    const [sent] = await connector.waitFor(1);
    // Replies go to the conversation (which names the thread) as a reply to the activity.
    expect(sent!.path).toBe(`/v3/conversations/${recorded.conversation.id}/activities/${activity.id}`);
    expect(sent!.activity.replyToId).toBe(activity.id);
    const card = (sent!.activity.attachments as { contentType: string; content: AdaptiveCard }[])[0]!;
    expect(card.contentType).toBe("application/vnd.microsoft.card.adaptive");
    expect(card.content.version).toBe("1.5");
    expect(cardProblems(card.content)).toEqual([]);
    expect(JSON.stringify(card.content.body)).toContain(
      "calculated 300.0 · effective 286.0 · gap 10.0 mOsm/kg",
    );
    expect(card.content.fallbackText).toContain("Read as: Na 128 mmol/L");
    expect(card.content.fallbackText).not.toContain("not understood");
    expect(JSON.stringify(card.content.actions)).toContain('"title":"More"');
    expect(JSON.stringify(card.content.actions)).toContain("2 × 128 + 29.97 + 14 = 300.0 mOsm/kg");
  });

  it("a trend's card carries the chart as an image with its alt text, inside Teams' size limit", async () => {
    const { PNG } = await import("pngjs");
    const recorded = fixture("channel-teams.json").mention;
    const activity = replay(
      recorded,
      "<at>Chat SDK Demo</at> trend bed 12 Na 110 (0 h) 114 (6 h) 118 (12 h)",
      connector.serviceUrl,
    );
    expect((await post(activity)).status).toBe(200);
    const [sent] = await connector.waitFor(1);
    const card = (sent!.activity.attachments as { content: AdaptiveCard }[])[0]!.content;
    expect(cardProblems(card)).toEqual([]);
    const image = card.body.find((b) => (b as { type: string }).type === "Image") as {
      url: string;
      altText: string;
    };
    expect(image.altText).toContain("Chart of the sodium for bed 12");
    expect(image.altText).toContain("110 at hour 0, 114 at hour 6, 118 at hour 12");
    expect(image.url.startsWith("data:image/png;base64,")).toBe(true);
    const png = PNG.sync.read(Buffer.from(image.url.split(",")[1]!, "base64"));
    expect([png.width, png.height]).toEqual([640, 360]);
    expect(JSON.stringify(card).length).toBeLessThan(CARD_BYTES);
    // The verdict still leads; the cautions still close the card.
    expect(JSON.stringify(card.body[0])).toContain("bed 12");
    expect(JSON.stringify(card.body.at(-1))).toContain(SHORT_CAUTIONS.general);
  });

  it("a card whose chart would not fit is sent without it, and says so", () => {
    const reply = emptyReply("trend", "bed 12: within the correction limits");
    const card = renderCard(reply, {
      images: [{ url: `data:image/png;base64,${"A".repeat(30_000)}`, altText: "x" }],
    });
    expect(JSON.stringify(card)).not.toContain("data:image/png");
    expect(JSON.stringify(card)).toContain("did not fit in a Teams card");
  });

  it("a channel message without a mention is left alone", async () => {
    const recorded = fixture("channel-teams.json").channel_post_action;
    const res = await post(replay({ ...recorded, value: undefined }, PANEL, connector.serviceUrl));
    expect(res.status).toBe(200);
    // The adapter answers the POST only when its turn has ended: whatever it sent has arrived.
    expect(connector.sent).toHaveLength(0);
  });

  it("a personal chat is answered without a mention (recorded payload)", async () => {
    const recorded = fixture("dm-teams.json").dmMessage;
    const activity = replay(recorded, PANEL, connector.serviceUrl);
    await post(activity);
    const [sent] = await connector.waitFor(1);
    expect(sent!.path).toContain(`/v3/conversations/${recorded.conversation.id}/activities/`);
    expect(JSON.stringify(sent!.activity)).toContain("gap 10.0");
  });

  it("a group chat is answered", async () => {
    const recorded = fixture("dm-teams.json").dmMessage;
    const activity = replay(
      {
        ...recorded,
        conversation: {
          ...recorded.conversation,
          conversationType: "groupChat",
          isGroup: true,
          id: "19:group@thread.v2",
        },
      },
      PANEL,
      connector.serviceUrl,
    );
    await post(activity);
    const [sent] = await connector.waitFor(1);
    expect(sent!.path).toContain("/v3/conversations/19:group@thread.v2/activities/");
    const card = (sent!.activity.attachments as { content: AdaptiveCard }[])[0]!.content;
    expect(cardProblems(card)).toEqual([]);
    expect(JSON.stringify(card.body)).toContain("calculated 300.0 · effective 286.0 · gap 10.0 mOsm/kg");
  });

  it("a redelivered activity is answered once", async () => {
    const activity = replay(fixture("dm-teams.json").dmMessage, PANEL, connector.serviceUrl, "same-id");
    expect((await post(activity)).status).toBe(200);
    expect((await post(activity)).status).toBe(200);
    // Both turns have ended when their POSTs are answered: one reply, not two.
    expect(connector.sent).toHaveLength(1);
    expect(JSON.stringify(connector.sent[0]!.activity)).toContain("gap 10.0");
  });

  it("malformed JSON → 400, oversize → 413, wrong method → 405, nothing processed", async () => {
    expect((await post("{not json")).status).toBe(400);
    expect((await post({ no: "type" })).status).toBe(400);
    expect((await post({ type: "message", text: "x".repeat(300_000) })).status).toBe(413);
    expect((await fetch(url)).status).toBe(405);
    expect(connector.sent).toHaveLength(0);
  });

  it("no message text, user ID or identifier in the logs or the store", async () => {
    logs.length = 0;
    const recorded = fixture("dm-teams.json").dmMessage;
    await post(replay(recorded, `Mrs Penhaligon DOB 4/5/1949 ${PANEL}`, connector.serviceUrl));
    const [sent] = await connector.waitFor(1);
    expect(JSON.stringify(sent!.activity)).not.toContain("Penhaligon");
    const everything = withoutTimes(logs.join("\n") + store.dump());
    for (const secret of [
      "Penhaligon",
      "1949",
      recorded.from.id,
      recorded.from.aadObjectId,
      recorded.conversation.id,
      "Test User",
      "glu 540",
    ]) {
      expect(everything).not.toContain(secret);
    }
  });
});

const APP_ID = "11111111-2222-3333-4444-555555555555";

describe("Teams with an app ID (authentication on)", () => {
  let keys: KeySet;
  beforeEach(async () => {
    keys = await localKeySet();
    await start({
      MicrosoftAppId: APP_ID,
      MicrosoftAppPassword: "not-a-real-password",
      TEAMS_OPENID_METADATA_URL: keys.metadataUrl,
    });
  });
  afterEach(() => keys.close());

  /** A channel message without a mention: the turn runs and, rightly, answers nothing. */
  const unmentioned = () =>
    replay(
      { ...fixture("channel-teams.json").channel_post_action, value: undefined },
      PANEL,
      connector.serviceUrl,
    );
  const claims = (over: Record<string, unknown> = {}) => ({
    iss: "https://api.botframework.com",
    aud: APP_ID,
    serviceurl: connector.serviceUrl,
    nbf: Math.floor(Date.now() / 1000) - 60,
    exp: Math.floor(Date.now() / 1000) + 600,
    ...over,
  });

  it("an unsigned or malformed token is refused with 401 and nothing is processed", async () => {
    const res = await post(replay(fixture("dm-teams.json").dmMessage, PANEL, connector.serviceUrl));
    expect(res.status).toBe(401);
    const forged = await post(replay(fixture("dm-teams.json").dmMessage, PANEL, connector.serviceUrl), {
      authorization: "Bearer not.a.token",
    });
    expect(forged.status).toBe(401);
    // The response comes after the adapter's turn: nothing was sent by then, so nothing will be.
    expect(connector.sent).toHaveLength(0);
  });

  it("a token signed with the published key is accepted; one signed otherwise, expired or for another bot is not", async () => {
    const good = await post(unmentioned(), { authorization: `Bearer ${keys.sign(claims())}` });
    expect(good.status).toBe(200);
    for (const [why, token] of [
      ["another key", keys.signWithOtherKey(claims())],
      ["expired", keys.sign(claims({ exp: Math.floor(Date.now() / 1000) - 3600 }))],
      ["another bot", keys.sign(claims({ aud: "99999999-2222-3333-4444-555555555555" }))],
      ["another service URL", keys.sign(claims({ serviceurl: "https://elsewhere.example/" }))],
    ] as const) {
      const res = await post(replay(fixture("dm-teams.json").dmMessage, PANEL, connector.serviceUrl), {
        authorization: `Bearer ${token}`,
      });
      expect(res.status, why).toBe(401);
    }
    expect(connector.sent).toHaveLength(0);
    expect(logs.filter((l) => l.includes('"teams.refused"')).length).toBeGreaterThanOrEqual(4);
  });

  it("while the signing keys cannot be fetched, requests are refused with 503 and a clear log line", async () => {
    for (const outage of ["error", "closed"] as const) {
      keys.outage = outage;
      logs.length = 0;
      const res = await post(unmentioned(), { authorization: `Bearer ${keys.sign(claims())}` });
      expect(res.status, outage).toBe(503);
      expect(res.headers.get("retry-after")).toBe("10");
      expect(
        logs.some((l) => l.includes('"teams.auth-keys-unavailable"')),
        outage,
      ).toBe(true);
    }
    expect(connector.sent).toHaveLength(0);
    // Back up: the same token is accepted.
    keys.outage = undefined;
    const res = await post(unmentioned(), { authorization: `Bearer ${keys.sign(claims())}` });
    expect(res.status).toBe(200);
  });
});

describe("the Adaptive Card", () => {
  it("validates with the Adaptive Cards library, version 1.5 at most, every block wrapping", async () => {
    const config = loadConfig({ SOLUTE_SECRET: "solute-secret-0123456789" });
    const bot = new Conversation(new MemoryStore(), config);
    for (const text of [
      PANEL,
      `${PANEL} working`,
      "help",
      "glucose 30",
      "check Na 128 calc osm 290",
      "units si",
    ]) {
      const card = renderCard(await bot.handle({ text, channel: "c", platform: "teams" }));
      expect(cardProblems(card), text).toEqual([]);
      const blocks = JSON.stringify(card).match(/"type":"TextBlock"[^}]*}/g) ?? [];
      for (const b of blocks) expect(b).toContain('"wrap":true');
    }
  });

  it("ends with the cautions: the short one up front, the full one behind More", () => {
    const reply = emptyReply("result", "h");
    reply.cautions = [CAUTIONS.general];
    const card = renderCard(reply);
    expect(JSON.stringify(card.body.at(-1))).toContain(SHORT_CAUTIONS.general);
    expect(JSON.stringify(card.actions)).toContain(CAUTIONS.general);
  });

  it("escapes every character Teams Markdown gives meaning to", () => {
    const reply = emptyReply("check", "2*131 + 22*1 + 9 = 293 _x_ ~y~ `z` [a](b) # h > q | t \\ e");
    const shown = (renderCard(reply).body[0] as { text: string }).text;
    expect(shown).toBe("2\\*131 + 22\\*1 + 9 = 293 \\_x\\_ \\~y\\~ \\`z\\` \\[a\\](b) # h > q | t \\\\ e");
    expect(escapeMarkdown("- item\n1. first\n# not a heading\n> not a quote")).toBe(
      "\\- item\n1\\. first\n\\# not a heading\n\\> not a quote",
    );
  });

  it("the card checker catches what it should", () => {
    expect(cardProblems({ type: "AdaptiveCard", body: [] })).toContain("no version");
    expect(cardProblems({ type: "AdaptiveCard", version: "1.6", body: [] })).toContain("version 1.6 > 1.5");
    expect(
      cardProblems({
        type: "AdaptiveCard",
        version: "1.5",
        body: [{ type: "TextBlock", text: "x", color: "purple" }],
      }).length,
    ).toBeGreaterThan(0);
  });
});

describe("Teams as its users expect (TEAMS_LOCAL=1)", () => {
  beforeEach(() => start({ TEAMS_LOCAL: "1" }));
  const withService = (a: Record<string, unknown>) => ({ ...a, serviceUrl: connector.serviceUrl });

  it("a short welcome when the bot is added", async () => {
    const res = await post(withService(fixture("interactions-teams.json").botAdded));
    expect(res.status).toBe(200);
    const [sent] = await connector.waitFor(1);
    expect(sent!.activity.text).toMatch(/Solute is here/);
  });

  it("the message action checks the message where it stands, privately, in a task module", async () => {
    const res = await post(withService(fixture("interactions-teams.json").messageAction));
    expect(res.status).toBe(200);
    const body = (await res.json()) as {
      task: { type: string; value: { card: { content: { body: unknown } } } };
    };
    expect(body.task.type).toBe("continue");
    // 2 × 131 + 22 + 9 = 293 [D]: the junior's 290 does not hold.
    expect(JSON.stringify(body.task.value.card.content.body)).toMatch(
      /calculated osmolality 290 does not hold/,
    );
    // Nothing was posted to the conversation, and nothing logged.
    expect(connector.sent).toHaveLength(0);
  });

  it("forget answers with a confirm card; its button clears the log and says so", async () => {
    const recorded = fixture("dm-teams.json").dmMessage;
    await post(replay(recorded, "bed 3 Na 121", connector.serviceUrl));
    await post(replay(recorded, "forget", connector.serviceUrl));
    const sent = await connector.waitFor(2);
    const card = (sent[1]!.activity.attachments as { content: AdaptiveCard }[])[0]!.content;
    const submit = (card.actions ?? []).find((a) => a.type === "Action.Submit")!;
    expect(submit).toMatchObject({ title: "Clear the whole log", data: { solute: "forget-all" } });
    await post({ ...replay(recorded, "", connector.serviceUrl), text: undefined, value: submit.data });
    const after = await connector.waitFor(3);
    expect(JSON.stringify(after[2]!.activity)).toMatch(/shift log was cleared: 1 record removed/);
  });

  it("a mention without lab values gets one short line, not a card", async () => {
    const recorded = fixture("channel-teams.json").mention;
    await post(replay(recorded, "<at>Chat SDK Demo</at> thanks!", connector.serviceUrl));
    const [sent] = await connector.waitFor(1);
    expect(sent!.activity.attachments ?? []).toHaveLength(0);
    expect(sent!.activity.text).toMatch(/Mention me with lab values/);
  });
});

describe("a card Teams refuses", () => {
  beforeEach(() => start({ TEAMS_LOCAL: "1" }));
  it("is followed by the verdict in plain text, not by silence", async () => {
    connector.failNext(400, 1);
    await post(replay(fixture("dm-teams.json").dmMessage, PANEL, connector.serviceUrl));
    const sent = await connector.waitFor(1);
    expect(sent.at(-1)!.activity.text).toMatch(/could not post its full answer/);
  });
});
