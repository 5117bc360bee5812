/**
 * Slack as its users expect, against the real Bolt app over loopback and a local fake Web API:
 * buttons that change nothing, nothing cut, quiet by default, visible failure, safe destructive
 * commands, replays answered once, the senior's shortcut, App Home and the welcome.
 */
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { createSlackAdapter, type SlackAdapter } from "../../../adapters/slack/app.js";
import { checkBlocks } from "../../../adapters/slack/limits.js";
import { render } from "../../../adapters/slack/render.js";
import { MemoryStore } from "../../../adapters/store/memory.js";
import { loadConfig } from "../../../bot/config.js";
import { Conversation } from "../../../bot/conversation.js";
import { setLogSink } from "../../../bot/log.js";
import { channelKey } from "../../../bot/privacy.js";
import { type HttpServer, startServer } from "../../../bot/server.js";
import { fixture } from "../../helpers/fixtures.js";
import { BOT_USER_ID, type FakeSlack, fakeSlack, form, postSigned, sign } from "../../helpers/slack.js";

const SECRET = "slack-signing-secret-for-tests";
const SOLUTE_SECRET = "solute-secret-0123456789";
let api: FakeSlack;
let server: HttpServer;
let adapter: SlackAdapter;
let store: MemoryStore;
let bot: Conversation;
let url: string;

beforeAll(() => setLogSink(() => {}));
afterAll(() => setLogSink(() => {}));

beforeEach(async () => {
  api = await fakeSlack();
  store = new MemoryStore();
  const config = loadConfig({
    SOLUTE_SECRET,
    SLACK_BOT_TOKEN: "xoxb-test",
    SLACK_SIGNING_SECRET: SECRET,
    SLACK_API_URL: `${api.url}/api/`,
  });
  bot = new Conversation(store, config);
  adapter = createSlackAdapter({ config: config.slack!, bot });
  await adapter.start();
  server = await startServer({
    port: 0,
    host: "127.0.0.1",
    routes: { "/slack/events": adapter.handler! },
    store,
  });
  url = `http://127.0.0.1:${server.port}/slack/events`;
});
afterEach(async () => {
  await server.close();
  await adapter.stop();
  await api.close();
});

const slash = (text: string, channel = "C00FAKECHAN1") =>
  form({
    ...fixture("slash-commands-slack.json").slashCommandWithArgs,
    command: "/solute",
    text,
    channel_id: channel,
    response_url: `${api.url}/respond/1`,
  });
const event = (name: string) => JSON.stringify(fixture("interactions-slack.json")[name]);
const mention = (text: string, extra: Record<string, unknown> = {}) => {
  const recorded = fixture("channel-mention-slack.json").mention;
  return JSON.stringify({
    ...recorded,
    event_id: `Ev${Math.random().toString(36).slice(2)}`,
    event: { ...recorded.event, type: "app_mention", text: `<@${BOT_USER_ID}> ${text}`, ...extra },
  });
};
const records = async (channel = "C00FAKECHAN1") =>
  (await store.listRecords(channelKey(SOLUTE_SECRET, "slack", channel), Date.now())).length;
const press = (actionId: string, value: string, extra: Record<string, unknown> = {}) =>
  postSigned(
    url,
    SECRET,
    form({
      payload: JSON.stringify({
        type: "block_actions",
        team: { id: "T00FAKE00AA" },
        user: { id: "U00FAKEUSER1" },
        api_app_id: "A00FAKEAPP01",
        token: "x",
        trigger_id: "1.2.3",
        channel: { id: "C00FAKECHAN1" },
        container: { type: "message", message_ts: "1.1", channel_id: "C00FAKECHAN1", is_ephemeral: true },
        response_url: `${api.url}/respond/2`,
        actions: [{ type: "button", action_id: actionId, block_id: "b", value, action_ts: "1" }],
        ...extra,
      }),
    }),
    "application/x-www-form-urlencoded",
  );
type Button = { action_id: string; value: string; confirm?: unknown; style?: string };
const buttons = (text: string) =>
  (JSON.parse(text).blocks as { elements?: Button[] }[])
    .flatMap((b) => b.elements ?? [])
    .filter((e) => "action_id" in e);

describe("buttons that change nothing", () => {
  it("More on a tagged answer expands it in place and logs nothing again", async () => {
    const res = await postSigned(
      url,
      SECRET,
      slash("bed 9 Na 128 glu 540 mg/dL urea 14 mmol/L osm 310"),
      "application/x-www-form-urlencoded",
    );
    expect(await records()).toBe(1);
    const more = buttons(res.text).find((b) => b.action_id === "solute_working")!;
    expect(more.value).toMatch(/^r1\./);
    expect(more.value).not.toMatch(/Na|bed|128/);
    await press("solute_working", more.value);
    const replaced = (await api.waitFor((c) => c.some((x) => x.path === "/respond/2"))).find(
      (c) => c.path === "/respond/2",
    )!;
    expect(replaced.body.replace_original).toBe(true);
    expect(JSON.stringify(replaced.body.blocks)).toContain("Working");
    expect(await records()).toBe(1);
  });

  it("an expired or unknown reply id is said, not guessed", async () => {
    await press("solute_working", "r1.doesnotexist");
    const note = (await api.waitFor((c) => c.some((x) => x.path === "/respond/2"))).find(
      (c) => c.path === "/respond/2",
    )!;
    expect(note.body.text).toMatch(/expired/);
  });
});

describe("nothing cut silently", () => {
  it("a handover of 30 beds shows all 30, within Block Kit's limits", async () => {
    for (let i = 1; i <= 30; i++)
      await bot.handle({ text: `bed ${i} Na ${120 + (i % 10)}`, channel: "C00FAKECHAN1", platform: "slack" });
    const reply = await bot.handle({ text: "handover more", channel: "C00FAKECHAN1", platform: "slack" });
    const message = render(reply, { working: true });
    expect(checkBlocks(message.blocks)).toEqual([]);
    const shown = JSON.stringify(message.blocks);
    for (let i = 1; i <= 30; i++) expect(shown, `bed ${i}`).toContain(`bed ${i} (`);
  });

  it("a trend of 12 sodiums shows all 12", async () => {
    const series = Array.from({ length: 12 }, (_, i) => `${110 + i} (${i * 2} h)`).join(" ");
    const reply = await bot.handle({ text: `trend Na ${series} more`, channel: "c", platform: "slack" });
    const shown = JSON.stringify(render(reply, { working: true }).blocks);
    for (let i = 0; i < 12; i++) expect(shown).toContain(`Na ${110 + i} mmol/L`);
  });

  it("mrkdwn's own characters are neutralised", () => {
    const reply = bot.handle({
      text: "check Na 131 glu 22 mmol/L urea 9 mmol/L 2*131 + 22 + 9 = 290",
      channel: "c",
      platform: "slack",
    });
    return reply.then((r) => {
      const shown = JSON.stringify(render(r, { working: true }).blocks);
      expect(shown).not.toMatch(/\d\*\d/);
      expect(render({ ...r, headline: "a < b & c > d" }).blocks[0]).toMatchObject({
        text: { text: "*a &lt; b &amp; c &gt; d*" },
      });
    });
  });
});

describe("quiet by default, failure visible", () => {
  it("a mention without lab values gets a private hint, not a public reply", async () => {
    await postSigned(url, SECRET, mention("thanks!"), "application/json");
    const hint = (await api.waitFor((c) => c.some((x) => x.path === "/api/chat.postEphemeral"))).find(
      (c) => c.path === "/api/chat.postEphemeral",
    )!;
    expect(hint.body.text).toMatch(/lab values/);
    expect(api.calls.filter((c) => c.path === "/api/chat.postMessage")).toHaveLength(0);
  });

  it("an empty /solute shows the help", async () => {
    const res = await postSigned(url, SECRET, slash(""), "application/x-www-form-urlencoded");
    expect(JSON.parse(res.text).text).toMatch(/^Solute: osmolality/);
  });

  it("a message in a DM thread is answered in that thread", async () => {
    const dm = fixture("dm-slack.json").dmMessage;
    const body = JSON.stringify({
      ...dm,
      event_id: "EvDMTHREAD1",
      event: { ...dm.event, text: "Na 128 glu 6 mmol/L urea 4 mmol/L", thread_ts: "1773320000.000200" },
    });
    await postSigned(url, SECRET, body, "application/json");
    const post = (await api.waitFor((c) => c.some((x) => x.path === "/api/chat.postMessage"))).find(
      (c) => c.path === "/api/chat.postMessage",
    )!;
    expect(post.body.thread_ts).toBe("1773320000.000200");
  });

  it("an answer that cannot be posted (not in channel) gives the asker a private note", async () => {
    api.methods["chat.postMessage"] = () => ({ ok: false, error: "not_in_channel" });
    await postSigned(url, SECRET, mention("Na 128 glu 6 mmol/L urea 4 mmol/L"), "application/json");
    const note = (await api.waitFor((c) => c.some((x) => x.path === "/api/chat.postEphemeral"))).find(
      (c) => c.path === "/api/chat.postEphemeral",
    )!;
    expect(note.body.text).toMatch(/invite me/);
  });
});

describe("destructive and channel-wide commands", () => {
  it("forget asks with a confirm dialog; confirmed, the log is cleared and the channel is told, naming no one", async () => {
    await bot.handle({ text: "bed 4 Na 121", channel: "C00FAKECHAN1", platform: "slack" });
    const res = await postSigned(url, SECRET, slash("forget"), "application/x-www-form-urlencoded");
    expect(JSON.parse(res.text).response_type).toBe("ephemeral");
    const clear = buttons(res.text).find((b) => b.action_id === "solute_forget")!;
    expect(clear.style).toBe("danger");
    expect(clear.confirm).toBeDefined();
    expect(await records()).toBe(1);
    await press("solute_forget", clear.value);
    const told = (await api.waitFor((c) => c.some((x) => x.path === "/api/chat.postMessage"))).find(
      (c) => c.path === "/api/chat.postMessage",
    )!;
    expect(told.body.text).toMatch(/shift log was cleared: 1 record removed/);
    expect(JSON.stringify(told.body)).not.toContain("U00FAKEUSER1");
    expect(await records()).toBe(0);
  });

  it("a units change is announced to the channel", async () => {
    const res = await postSigned(url, SECRET, slash("units si"), "application/x-www-form-urlencoded");
    expect(JSON.parse(res.text).response_type).toBe("in_channel");
  });
});

describe("replays", () => {
  it("a signed slash command delivered three times is answered and logged once", async () => {
    const body = slash("bed 5 Na 121 glu 6 mmol/L urea 4 mmol/L");
    const headers = sign(SECRET, body);
    const statuses: number[] = [];
    const texts: string[] = [];
    for (let i = 0; i < 3; i++) {
      const res = await fetch(url, {
        method: "POST",
        headers: { ...headers, "content-type": "application/x-www-form-urlencoded" },
        body,
      });
      statuses.push(res.status);
      texts.push(await res.text());
    }
    expect(statuses).toEqual([200, 200, 200]);
    expect(texts.filter((t) => t.includes("blocks"))).toHaveLength(1);
    expect(await records()).toBe(1);
  });
});

describe("for the senior, App Home and the welcome", () => {
  it("the message shortcut checks the message where it stands and answers privately", async () => {
    const payload = {
      ...fixture("interactions-slack.json").messageShortcut,
      response_url: `${api.url}/respond/9`,
    };
    await postSigned(
      url,
      SECRET,
      form({ payload: JSON.stringify(payload) }),
      "application/x-www-form-urlencoded",
    );
    const answer = (await api.waitFor((c) => c.some((x) => x.path === "/respond/9"))).find(
      (c) => c.path === "/respond/9",
    )!;
    expect(answer.body.response_type).toBe("ephemeral");
    // 2 × 131 + 22 + 9 = 293 [D]: the junior's 290 does not hold.
    expect(answer.body.text).toMatch(/calculated osmolality 290 does not hold/);
    expect(await records()).toBe(0);
  });

  it("App Home publishes how to use Solute and its privacy", async () => {
    await postSigned(url, SECRET, event("appHomeOpened"), "application/json");
    const view = (await api.waitFor((c) => c.some((x) => x.path === "/api/views.publish"))).find(
      (c) => c.path === "/api/views.publish",
    )!;
    expect(JSON.stringify(view.body)).toMatch(/Privacy/);
    expect(view.body.user_id).toBe("U00FAKEUSER1");
  });

  it("a short welcome when the bot joins a channel", async () => {
    await postSigned(url, SECRET, event("botJoinedChannel"), "application/json");
    const post = (await api.waitFor((c) => c.some((x) => x.path === "/api/chat.postMessage"))).find(
      (c) => c.path === "/api/chat.postMessage",
    )!;
    expect(post.body.channel).toBe("C00FAKECHAN4");
    expect(post.body.text).toMatch(/Solute is here/);
  });
});
