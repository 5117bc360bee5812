import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { createSlackAdapter, type SlackAdapter } from "../../../adapters/slack/app.js";
import { checkBlocks } from "../../../adapters/slack/limits.js";
import { MemoryStore } from "../../../adapters/store/memory.js";
import { loadConfig } from "../../../bot/config.js";
import { Conversation } from "../../../bot/conversation.js";
import { drain } from "../../../bot/inflight.js";
import { setLogSink } from "../../../bot/log.js";
import { type HttpServer, startServer } from "../../../bot/server.js";
import { SHORT_CAUTIONS } from "../../../core/cautions.js";
import { fixture } from "../../helpers/fixtures.js";
import { BOT_USER_ID, type FakeSlack, fakeSlack, form, postSigned } from "../../helpers/slack.js";
import { withoutTimes } from "../../helpers/times.js";

const SECRET = "slack-signing-secret-for-tests";
const PANEL = "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310";
const logs: string[] = [];

let api: FakeSlack;
let server: HttpServer;
let adapter: SlackAdapter;
let store: MemoryStore;
let url: string;

beforeAll(() => setLogSink((l) => logs.push(l)));
afterAll(() => setLogSink(() => {}));

beforeEach(async () => {
  api = await fakeSlack();
  store = new MemoryStore();
  const config = loadConfig({
    SOLUTE_SECRET: "solute-secret-0123456789",
    SLACK_BOT_TOKEN: "xoxb-test",
    SLACK_SIGNING_SECRET: SECRET,
    SLACK_API_URL: `${api.url}/api/`,
  });
  const bot = new Conversation(store, config);
  // The real Bolt app; it verifies its token with auth.test against the fake API.
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

/** The recorded slash command, with the text swapped for lab values and response_url pointed here. */
function slash(text: string): string {
  const p = {
    ...fixture("slash-commands-slack.json").slashCommandWithArgs,
    command: "/solute",
    text,
    response_url: `${api.url}/respond/1`,
  };
  return form(p);
}

function mention(text: string, extra: Record<string, unknown> = {}) {
  const recorded = fixture("channel-mention-slack.json").mention;
  return {
    ...recorded,
    event_id: `Ev${Math.random().toString(36).slice(2)}`,
    event_time: 1,
    event: { ...recorded.event, type: "app_mention", text: `<@${BOT_USER_ID}> ${text}`, ...extra },
  };
}

describe("slash command", () => {
  it("answers privately in the acknowledgement, with a button to post to the channel", async () => {
    const res = await postSigned(url, SECRET, slash(PANEL), "application/x-www-form-urlencoded");
    expect(res.status).toBe(200);
    // The answer is in the acknowledgement itself (Slack's 3 s budget is measured by npm run bench).
    const body = JSON.parse(res.text);
    expect(body.response_type).toBe("ephemeral");
    expect(body.text).toContain("calculated 300.0 · effective 286.0 · gap 10.0 mOsm/kg");
    const blocks = body.blocks as Parameters<typeof checkBlocks>[0];
    expect(checkBlocks(blocks)).toEqual([]);
    expect(JSON.stringify(blocks)).toContain("solute_post");
    expect(JSON.stringify(blocks)).toContain("solute_working");
    // The first view: the cautions, then the buttons; the full caution is behind "More".
    expect(blocks.at(-1)!.type).toBe("actions");
    expect(JSON.stringify(blocks.at(-2))).toContain(SHORT_CAUTIONS.general);
  });

  it("help and problems stay private, without a post button", async () => {
    for (const text of ["help", "glucose 30"]) {
      const body = JSON.parse(
        (await postSigned(url, SECRET, slash(text), "application/x-www-form-urlencoded")).text,
      );
      expect(body.response_type).toBe("ephemeral");
      expect(JSON.stringify(body.blocks)).not.toContain("solute_post");
    }
  });

  it("when the answer is slow, acks at once and answers through response_url", async () => {
    const slow = store.getSettings.bind(store);
    store.getSettings = async (c) => {
      await new Promise((r) => setTimeout(r, 2000));
      return slow(c);
    };
    const res = await postSigned(url, SECRET, slash(PANEL), "application/x-www-form-urlencoded");
    expect(res.status).toBe(200);
    expect(res.ms).toBeLessThan(2500);
    expect(res.text).toBe("");
    const call = (await api.waitFor((c) => c.some((x) => x.path === "/respond/1"))).find(
      (c) => c.path === "/respond/1",
    )!;
    expect(call.body.response_type).toBe("ephemeral");
    expect(call.body.text).toContain("gap 10.0");
  });

  it("the post-to-channel button posts the kept answer for the team, removes the private one, logs nothing", async () => {
    const value = await buttonValue("solute_post");
    const payload = postButton(value);
    expect(value).toMatch(/^r1\./);
    const res = await postSigned(
      url,
      SECRET,
      form({ payload: JSON.stringify(payload) }),
      "application/x-www-form-urlencoded",
    );
    expect(res.status).toBe(200);
    const posted = (await api.waitFor((c) => c.some((x) => x.path === "/api/chat.postMessage"))).find(
      (c) => c.path === "/api/chat.postMessage",
    )!;
    expect(posted.body.text).toContain("gap 10.0");
    const removed = (await api.waitFor((c) => c.some((x) => x.path === "/respond/2"))).find(
      (c) => c.path === "/respond/2",
    )!;
    expect(removed.body.delete_original).toBe(true);
    // The button carried no message text, and pressing it logged nothing.
    expect(value).not.toContain("Na 128");
  });
});

/** The post-to-channel button pressed on a private answer, as Slack sends it. */
function postButton(value: string) {
  return {
    type: "block_actions",
    team: { id: "T00FAKE00BB", domain: "acme" },
    user: { id: "U00FAKEUSER2" },
    api_app_id: "A00FAKEAPP03",
    token: "x",
    trigger_id: "1.2.3",
    channel: { id: "C00FAKECHAN3", name: "night" },
    container: { type: "message", message_ts: "1.1", channel_id: "C00FAKECHAN3", is_ephemeral: true },
    response_url: `${api.url}/respond/2`,
    actions: [{ type: "button", action_id: "solute_post", block_id: "b", value, action_ts: "1" }],
  };
}

/** A button's value from a real private answer to the slash command. */
async function buttonValue(actionId: string, text = PANEL): Promise<string> {
  const res = await postSigned(url, SECRET, slash(text), "application/x-www-form-urlencoded");
  const blocks = JSON.parse(res.text).blocks as {
    type: string;
    elements?: { action_id: string; value: string }[];
  }[];
  return blocks.flatMap((b) => b.elements ?? []).find((e) => e.action_id === actionId)!.value;
}

describe("mentions and direct messages", () => {
  it("a mention is answered in the thread of that message, with the mention stripped", async () => {
    const body = mention(PANEL);
    const res = await postSigned(url, SECRET, JSON.stringify(body), "application/json");
    expect(res.status).toBe(200);
    const post = (await api.waitFor((c) => c.some((x) => x.path === "/api/chat.postMessage"))).find(
      (c) => c.path === "/api/chat.postMessage",
    )!;
    expect(post.body.channel).toBe(body.event.channel);
    expect(post.body.thread_ts).toBe(body.event.ts);
    expect(post.body.text).toContain("calculated 300.0");
    expect(post.body.text).not.toContain("not understood");
    expect(checkBlocks(post.body.blocks as never)).toEqual([]);
  });

  it("a mention inside a thread answers in that thread", async () => {
    const body = mention(PANEL, { thread_ts: "1773320000.000100" });
    await postSigned(url, SECRET, JSON.stringify(body), "application/json");
    const post = (await api.waitFor((c) => c.some((x) => x.path === "/api/chat.postMessage"))).find(
      (c) => c.path === "/api/chat.postMessage",
    )!;
    expect(post.body.thread_ts).toBe("1773320000.000100");
  });

  it("a direct message is answered in the DM (recorded payload)", async () => {
    const recorded = fixture("dm-slack.json").dmMessage;
    const body = { ...recorded, event_id: "EvDM1", event: { ...recorded.event, text: PANEL } };
    await postSigned(url, SECRET, JSON.stringify(body), "application/json");
    const post = (await api.waitFor((c) => c.some((x) => x.path === "/api/chat.postMessage"))).find(
      (c) => c.path === "/api/chat.postMessage",
    )!;
    expect(post.body.channel).toBe(recorded.event.channel);
    expect(post.body.thread_ts).toBeUndefined();
    expect(post.body.text).toContain("calculated 300.0");
  });

  it("ignores its own and other bots' messages", async () => {
    const recorded = fixture("dm-slack.json").dmMessage;
    const body = {
      ...recorded,
      event_id: "EvBOT",
      event: { ...recorded.event, text: PANEL, bot_id: "B1", subtype: "bot_message" },
    };
    await postSigned(url, SECRET, JSON.stringify(body), "application/json");
    // The adapter counts an event as in flight before Bolt acknowledges it: drain() waits for it.
    await drain();
    expect(api.calls.filter((c) => c.path === "/api/chat.postMessage")).toHaveLength(0);
  });

  it("a retried delivery produces exactly one reply", async () => {
    const body = JSON.stringify(mention(PANEL));
    await postSigned(url, SECRET, body, "application/json");
    const retry = await postSigned(url, SECRET, body, "application/json", {
      headers: { "x-slack-retry-num": "1", "x-slack-retry-reason": "http_timeout" },
    });
    expect(retry.status).toBe(200);
    await drain();
    expect(api.calls.filter((c) => c.path === "/api/chat.postMessage")).toHaveLength(1);
  });

  it("a More press expands the public answer in place, and logs nothing", async () => {
    const payload = {
      type: "block_actions",
      team: { id: "T00FAKE00AA" },
      user: { id: "U00FAKEUSER1" },
      api_app_id: "A00FAKEAPP01",
      token: "x",
      trigger_id: "1.2.3",
      channel: { id: "C00FAKECHAN1" },
      container: {
        type: "message",
        message_ts: "1773327463.700000",
        thread_ts: "1773327463.619929",
        channel_id: "C00FAKECHAN1",
        is_ephemeral: false,
      },
      response_url: `${api.url}/respond/3`,
      actions: [
        {
          type: "button",
          action_id: "solute_working",
          block_id: "b",
          value: await buttonValue("solute_working"),
          action_ts: "1",
        },
      ],
    };
    await postSigned(
      url,
      SECRET,
      form({ payload: JSON.stringify(payload) }),
      "application/x-www-form-urlencoded",
    );
    const update = (await api.waitFor((c) => c.some((x) => x.path === "/api/chat.update"))).find(
      (c) => c.path === "/api/chat.update",
    )!;
    expect(update.body.ts).toBe("1773327463.700000");
    expect(JSON.stringify(update.body.blocks)).toContain("2 × 128 + 29.97 + 14 = 300.0 mOsm/kg");
    expect(api.calls.filter((c) => c.path === "/api/chat.postMessage")).toHaveLength(0);
  });
});

describe("request verification", () => {
  it.each([
    ["a wrong signature", { badSignature: true }],
    ["a timestamp 10 minutes old", { timestamp: Math.floor(Date.now() / 1000) - 600 }],
    ["a timestamp 10 minutes in the future", { timestamp: Math.floor(Date.now() / 1000) + 600 }],
  ])("%s → 401 and nothing processed", async (_, options) => {
    const res = await postSigned(url, SECRET, JSON.stringify(mention(PANEL)), "application/json", options);
    expect(res.status).toBe(401);
    await drain();
    expect(api.calls.filter((c) => c.path !== "/api/auth.test")).toEqual([]);
  });

  it("a missing timestamp → 401", async () => {
    const res = await fetch(url, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: "{}",
    });
    expect(res.status).toBe(401);
  });
});

describe("privacy", () => {
  it("no message text, user ID or identifier in the logs or the store", async () => {
    logs.length = 0;
    const body = mention(`Mr Blackwood MRN 7712093 ${PANEL}`);
    await postSigned(url, SECRET, JSON.stringify(body), "application/json");
    const slashed = await postSigned(
      url,
      SECRET,
      slash(`DOB 3/4/1957 ${PANEL}`),
      "application/x-www-form-urlencoded",
    );
    await api.waitFor((c) => c.some((x) => x.path === "/api/chat.postMessage"));
    const reply = api.calls.find((c) => c.path === "/api/chat.postMessage")!;
    const privateAnswer = { body: JSON.parse(slashed.text) };
    for (const answer of [reply, privateAnswer]) {
      for (const secret of ["Blackwood", "7712093", "1957"])
        expect(JSON.stringify(answer.body)).not.toContain(secret);
    }
    const everything = withoutTimes(logs.join("\n") + store.dump());
    for (const secret of [
      "Blackwood",
      "7712093",
      "1957",
      "U00FAKEUSER1",
      "U00FAKEUSER2",
      "C00FAKECHAN1",
      "C00FAKECHAN3",
      "glu 540",
      "testuser",
    ]) {
      expect(everything).not.toContain(secret);
    }
  });
});

describe("the chart of a sodium course", () => {
  const TREND = "trend bed 12 Na 110 (0 h) 114 (6 h) 118 (12 h)";
  /** The PNG as uploaded: raw bytes, from its signature to the end of its IEND chunk. */
  const pngIn = (bytes: Buffer) => {
    const start = bytes.indexOf(Buffer.from([0x89, 0x50, 0x4e, 0x47]));
    const end = bytes.indexOf(Buffer.from("IEND")) + 8;
    return bytes.subarray(start, end);
  };

  it("is uploaded into the reply's thread with its alt text, after the text reply", async () => {
    const { PNG } = await import("pngjs");
    const res = await postSigned(url, SECRET, JSON.stringify(mention(TREND)), "application/json");
    expect(res.status).toBe(200);
    const calls = await api.waitFor((c) => c.some((x) => x.path === "/api/files.completeUploadExternal"));
    const posted = calls.find((c) => c.path === "/api/chat.postMessage")!;
    const asked = calls.find((c) => c.path === "/api/files.getUploadURLExternal")!;
    const upload = calls.find((c) => c.path.startsWith("/upload/"))!;
    const done = calls.find((c) => c.path === "/api/files.completeUploadExternal")!;
    const thread = fixture("channel-mention-slack.json").mention.event.ts;
    expect(calls.indexOf(posted)).toBeLessThan(calls.indexOf(asked));
    expect(posted.body.thread_ts).toBe(thread);
    expect(String(posted.body.text)).toContain("bed 12");
    expect(asked.body.filename).toBe("sodium-bed-12.png");
    // Slack's argument is alt_txt (files.getUploadURLExternal), at most 1,000 characters.
    expect(String(asked.body.alt_txt)).toContain("Chart of the sodium for bed 12");
    expect(String(asked.body.alt_txt)).toContain("110 at hour 0, 114 at hour 6, 118 at hour 12");
    expect(String(asked.body.alt_txt).length).toBeLessThanOrEqual(1000);
    expect(Number(asked.body.length)).toBe(pngIn(upload.bytes).length);
    expect(done.body.thread_ts).toBe(thread);
    const png = PNG.sync.read(pngIn(upload.bytes));
    expect([png.width, png.height]).toEqual([640, 360]);
  });

  it("without files:write the text reply still comes, with one line saying how to enable charts", async () => {
    api.methods["files.getUploadURLExternal"] = () => ({ ok: false, error: "missing_scope" });
    await postSigned(url, SECRET, JSON.stringify(mention(TREND)), "application/json");
    const calls = await api.waitFor((c) => c.filter((x) => x.path === "/api/chat.postMessage").length >= 2);
    const posts = calls.filter((c) => c.path === "/api/chat.postMessage");
    expect(String(posts[0]!.body.text)).toContain("bed 12");
    expect(posts[1]!.body.text).toContain("files:write");
    expect(posts[1]!.body.thread_ts).toBe(posts[0]!.body.thread_ts);
    expect(calls.some((c) => c.path.startsWith("/upload/"))).toBe(false);
  });

  it("a private slash-command answer says how to get the chart, and uploads nothing", async () => {
    const body = JSON.parse(
      (await postSigned(url, SECRET, slash(TREND), "application/x-www-form-urlencoded")).text,
    );
    expect(JSON.stringify(body)).toContain("to get the chart of the course");
    expect(api.calls.some((c) => c.path.includes("files."))).toBe(false);
  });

  it("posting the private answer to the channel brings the chart, under the posted answer", async () => {
    const value = await buttonValue("solute_post", TREND);
    const payload = postButton(value);
    await postSigned(
      url,
      SECRET,
      form({ payload: JSON.stringify(payload) }),
      "application/x-www-form-urlencoded",
    );
    const calls = await api.waitFor((c) => c.some((x) => x.path === "/api/files.completeUploadExternal"));
    const posted = calls.find((c) => c.path === "/api/chat.postMessage")!;
    expect(JSON.stringify(posted.body)).not.toContain("to get the chart");
    const done = calls.find((c) => c.path === "/api/files.completeUploadExternal")!;
    expect(done.body.channel_id).toBe("C00FAKECHAN3");
    expect(done.body.thread_ts).toBeDefined();
  });

  it("a calculation without a course uploads nothing", async () => {
    await postSigned(url, SECRET, JSON.stringify(mention(PANEL)), "application/json");
    await api.waitFor((c) => c.some((x) => x.path === "/api/chat.postMessage"));
    expect(api.calls.some((c) => c.path.includes("files."))).toBe(false);
  });
});
