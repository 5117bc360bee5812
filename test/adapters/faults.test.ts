/** Faults at the edges: the platforms' APIs answering 429 or 5xx, bad requests, and SIGTERM. */
import { spawn } from "node:child_process";
import { afterEach, describe, expect, it } from "vitest";
import { MemoryStore } from "../../adapters/store/memory.js";
import { createTeamsAdapter } from "../../adapters/teams/app.js";
import { loadConfig } from "../../bot/config.js";
import { Conversation } from "../../bot/conversation.js";
import { startServer } from "../../bot/server.js";
import { fixture } from "../helpers/fixtures.js";
import { BOT_USER_ID, type FakeSlack, postSigned } from "../helpers/slack.js";
import { cleanEnv, ROOT } from "../helpers/spawn.js";
import { startStack } from "../helpers/stack.js";
import { type FakeConnector, fakeConnector, replay } from "../helpers/teams.js";

const SIGNING = "faults-signing-secret";
const PANEL = "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310";
const cleanups: (() => Promise<void>)[] = [];
afterEach(async () => {
  for (const c of cleanups.splice(0)) await c();
});

async function slackStack(): Promise<{ api: FakeSlack; url: string }> {
  const { api, base, close } = await startStack({ signing: SIGNING });
  cleanups.push(close);
  return { api, url: `${base}/slack/events` };
}

function mention(id: string) {
  const recorded = fixture("channel-mention-slack.json").mention;
  return JSON.stringify({
    ...recorded,
    event_id: id,
    event: { ...recorded.event, type: "app_mention", text: `<@${BOT_USER_ID}> ${PANEL}` },
  });
}

const posts = (api: FakeSlack) => api.calls.filter((c) => c.path === "/api/chat.postMessage");

describe("Slack Web API faults", () => {
  it.each([
    [429, 1],
    [500, 2],
    [503, 1],
  ])("%i answered %i time(s), then OK: the reply is retried and posted once", async (status, times) => {
    const { api, url } = await slackStack();
    api.failNext("/api/chat.postMessage", status, times);
    await postSigned(url, SIGNING, mention(`EvFAULT${status}`), "application/json");
    await api.waitFor(
      (c) => c.filter((x) => x.path === "/api/chat.postMessage").length === times + 1,
      10_000,
    );
    await new Promise((r) => setTimeout(r, 300));
    expect(posts(api)).toHaveLength(times + 1);
  });

  it("a Web API that keeps failing: bounded retries, and calculations keep answering", async () => {
    const { api, url } = await slackStack();
    api.failNext("/api/chat.postMessage", 500, 1000);
    await postSigned(url, SIGNING, mention("EvDOWN"), "application/json");
    await new Promise((r) => setTimeout(r, 2500));
    // One try and two retries, then it gives up.
    expect(posts(api).length).toBe(3);
    const slash = new URLSearchParams({
      command: "/solute",
      text: PANEL,
      channel_id: "C1",
      user_id: "U1",
      team_id: "T1",
      response_url: `${api.url}/respond/z`,
      trigger_id: "t",
      token: "x",
    }).toString();
    const res = await postSigned(url, SIGNING, slash, "application/x-www-form-urlencoded");
    expect(JSON.parse(res.text).text).toContain("gap 10.0");
  });

  it("malformed, oversize and unknown requests: a clear status, nothing processed, still up", async () => {
    const { api, url } = await slackStack();
    expect((await postSigned(url, SIGNING, "{not json", "application/json")).status).toBeGreaterThanOrEqual(
      400,
    );
    const big = JSON.stringify({ type: "event_callback", pad: "x".repeat(300_000) });
    expect((await postSigned(url, SIGNING, big, "application/json")).status).toBe(413);
    const unknown = JSON.stringify({
      type: "event_callback",
      event_id: "EvUNK",
      event: { type: "reaction_added" },
    });
    expect((await postSigned(url, SIGNING, unknown, "application/json")).status).toBe(200);
    const missing = JSON.stringify({
      type: "event_callback",
      event_id: "EvMISS",
      event: { type: "app_mention" },
    });
    expect((await postSigned(url, SIGNING, missing, "application/json")).status).toBe(200);
    await new Promise((r) => setTimeout(r, 300));
    expect(posts(api)).toHaveLength(0);
    expect((await postSigned(url, SIGNING, mention("EvAFTER"), "application/json")).status).toBe(200);
    await api.waitFor((c) => c.some((x) => x.path === "/api/chat.postMessage"));
  });
});

describe("Teams connector faults", () => {
  async function teamsStack(): Promise<{ connector: FakeConnector; url: string }> {
    const connector = await fakeConnector();
    const config = loadConfig({ SOLUTE_SECRET: "solute-secret-0123456789", TEAMS_LOCAL: "1" });
    const adapter = createTeamsAdapter({
      config: config.teams!,
      bot: new Conversation(new MemoryStore(), config),
    });
    const server = await startServer({
      port: 0,
      host: "127.0.0.1",
      routes: { "/api/messages": adapter.handler },
      store: new MemoryStore(),
    });
    cleanups.push(async () => {
      await server.close();
      await connector.close();
    });
    return { connector, url: `http://127.0.0.1:${server.port}/api/messages` };
  }
  const post = (url: string, body: unknown) =>
    fetch(url, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify(body),
    });

  it.each([429, 503])("%i once, then OK: the reply arrives once", async (status) => {
    const { connector, url } = await teamsStack();
    connector.failNext(status, 1);
    await post(url, replay(fixture("dm-teams.json").dmMessage, PANEL, connector.serviceUrl, `f${status}`));
    await connector.waitFor(1, 10_000);
    await new Promise((r) => setTimeout(r, 300));
    expect(connector.sent).toHaveLength(1);
    expect(connector.attempts).toBe(2);
  });

  it("a connector that keeps failing: bounded retries, the process stays up", async () => {
    const { connector, url } = await teamsStack();
    connector.failNext(500, 1000);
    const res = await post(
      url,
      replay(fixture("dm-teams.json").dmMessage, PANEL, connector.serviceUrl, "down"),
    );
    expect(res.status).toBeLessThan(600);
    expect(connector.attempts).toBeLessThanOrEqual(4);
    connector.failNext(500, 0);
    await post(url, replay(fixture("dm-teams.json").dmMessage, PANEL, connector.serviceUrl, "after"));
    await connector.waitFor(1);
  });
});

describe("SIGTERM", () => {
  it("stops accepting, finishes what is in flight, closes the store and exits 0", async () => {
    const connector = await fakeConnector();
    cleanups.push(() => connector.close());
    connector.slow(1500);
    const child = spawn(process.execPath, ["--import", "tsx", "bot/main.ts"], {
      cwd: ROOT,
      env: cleanEnv({
        TEAMS_LOCAL: "1",
        PORT: "0",
        HOST: "127.0.0.1",
        SOLUTE_SECRET: "solute-secret-0123456789",
      }),
      stdio: ["ignore", "ignore", "pipe"],
    });
    let err = "";
    const port = await new Promise<number>((resolve, reject) => {
      child.stderr.on("data", (d) => {
        err += d;
        const m = /"event":"ready"[^\n]*"count":(\d+)/.exec(err);
        if (m) resolve(Number(m[1]));
      });
      child.once("exit", () => reject(new Error(err)));
    });
    const url = `http://127.0.0.1:${port}/api/messages`;
    const inFlight = fetch(url, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify(replay(fixture("dm-teams.json").dmMessage, PANEL, connector.serviceUrl)),
    });
    await new Promise((r) => setTimeout(r, 400));
    const exited = new Promise<number | null>((r) => child.once("exit", (code) => r(code)));
    child.kill("SIGTERM");
    await new Promise((r) => setTimeout(r, 200));
    await expect(fetch(url, { method: "POST", body: "{}" })).rejects.toThrow();
    expect((await inFlight).status).toBe(200);
    expect(await exited).toBe(0);
    expect(connector.sent).toHaveLength(1);
    expect(err).toMatch(/"event":"stopped"/);
  }, 30_000);
});
