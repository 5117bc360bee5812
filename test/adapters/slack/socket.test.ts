import type { AddressInfo } from "node:net";
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { type WebSocket, WebSocketServer } from "ws";
import { loadConfig } from "../../../bot/config.js";
import { setLogSink } from "../../../bot/log.js";
import { type Running, startPlatforms } from "../../../bot/platforms.js";
import { fixture } from "../../helpers/fixtures.js";
import { BOT_USER_ID, type FakeSlack, fakeSlack } from "../../helpers/slack.js";

const PANEL = "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310";

let api: FakeSlack;
let wss: WebSocketServer;
let sockets: WebSocket[];
let acks: string[];
let ackBodies: Record<string, unknown>[];
let running: Running | undefined;

beforeEach(async () => {
  api = await fakeSlack();
  sockets = [];
  acks = [];
  ackBodies = [];
  wss = new WebSocketServer({ host: "127.0.0.1", port: 0 });
  await new Promise<void>((r) => wss.once("listening", () => r()));
  const wsUrl = `ws://127.0.0.1:${(wss.address() as AddressInfo).port}/link`;
  api.methods["apps.connections.open"] = () => ({ ok: true, url: wsUrl });
  wss.on("connection", (ws) => {
    sockets.push(ws);
    ws.on("message", (data) => {
      const msg = JSON.parse(String(data)) as { envelope_id?: string };
      if (msg.envelope_id) acks.push(msg.envelope_id);
      ackBodies.push(msg);
    });
    ws.send(
      JSON.stringify({
        type: "hello",
        num_connections: 1,
        debug_info: { host: "local" },
        connection_info: { app_id: "A00FAKEAPP01" },
      }),
    );
  });
});

afterEach(async () => {
  await running?.stop();
  running = undefined;
  for (const s of sockets) s.terminate();
  await new Promise<void>((r) => wss.close(() => r()));
  await api.close();
});

async function connected(): Promise<WebSocket> {
  running = await startPlatforms(
    loadConfig({
      SOLUTE_SECRET: "solute-secret-0123456789",
      SLACK_BOT_TOKEN: "xoxb-test",
      SLACK_APP_TOKEN: "xapp-test",
      SLACK_API_URL: `${api.url}/api/`,
      PORT: "0",
      HOST: "127.0.0.1",
    }),
  );
  const until = Date.now() + 5000;
  while (sockets.length === 0 && Date.now() < until) await new Promise((r) => setTimeout(r, 10));
  return sockets[0]!;
}

describe("Socket Mode (npm start with SLACK_APP_TOKEN)", () => {
  it("connects, acks an event envelope, and answers a mention in its thread", async () => {
    const ws = await connected();
    const recorded = fixture("channel-mention-slack.json").mention;
    const payload = {
      ...recorded,
      event_id: "EvSOCK1",
      event: { ...recorded.event, type: "app_mention", text: `<@${BOT_USER_ID}> ${PANEL}` },
    };
    ws.send(
      JSON.stringify({
        envelope_id: "env-1",
        type: "events_api",
        accepts_response_payload: false,
        retry_attempt: 0,
        retry_reason: "",
        payload,
      }),
    );
    const post = (await api.waitFor((c) => c.some((x) => x.path === "/api/chat.postMessage"))).find(
      (c) => c.path === "/api/chat.postMessage",
    )!;
    expect(acks).toContain("env-1");
    expect(post.body.thread_ts).toBe(recorded.event.ts);
    expect(post.body.text).toContain("calculated 300.0");
  });

  it("a retried envelope with the same event produces one reply", async () => {
    const ws = await connected();
    const recorded = fixture("dm-slack.json").dmMessage;
    const payload = { ...recorded, event_id: "EvSOCK2", event: { ...recorded.event, text: PANEL } };
    ws.send(JSON.stringify({ envelope_id: "env-2", type: "events_api", retry_attempt: 0, payload }));
    ws.send(
      JSON.stringify({
        envelope_id: "env-3",
        type: "events_api",
        retry_attempt: 1,
        retry_reason: "timeout",
        payload,
      }),
    );
    await api.waitFor((c) => c.some((x) => x.path === "/api/chat.postMessage"));
    await new Promise((r) => setTimeout(r, 300));
    expect(acks).toEqual(expect.arrayContaining(["env-2", "env-3"]));
    expect(api.calls.filter((c) => c.path === "/api/chat.postMessage")).toHaveLength(1);
  });

  it("answers a slash command privately over the socket", async () => {
    const ws = await connected();
    const command = {
      ...fixture("slash-commands-slack.json").slashCommandWithArgs,
      command: "/solute",
      text: PANEL,
      response_url: `${api.url}/respond/s`,
    };
    ws.send(
      JSON.stringify({
        envelope_id: "env-4",
        type: "slash_commands",
        accepts_response_payload: true,
        payload: command,
      }),
    );
    const until = Date.now() + 5000;
    while (!acks.includes("env-4") && Date.now() < until) await new Promise((r) => setTimeout(r, 10));
    // The answer travels in the envelope's acknowledgement.
    const ack = ackBodies.find((a) => a.envelope_id === "env-4") as {
      payload: { response_type: string; text: string };
    };
    expect(ack.payload.response_type).toBe("ephemeral");
    expect(ack.payload.text).toContain("gap 10.0");
  });

  it("acknowledges and drops an envelope whose payload is not what Slack sends, and keeps serving", async () => {
    const logs: string[] = [];
    setLogSink((l) => logs.push(l));
    try {
      const ws = await connected();
      const bad: unknown[] = [null, [], 5, "text", {}, { event: {} }];
      for (const [i, payload] of bad.entries())
        ws.send(JSON.stringify({ envelope_id: `bad-${i}`, type: "events_api", retry_attempt: 0, payload }));
      const until = Date.now() + 5000;
      while (acks.filter((a) => a.startsWith("bad-")).length < bad.length && Date.now() < until)
        await new Promise((r) => setTimeout(r, 10));
      expect(acks.filter((a) => a.startsWith("bad-")).sort()).toEqual(bad.map((_, i) => `bad-${i}`));
      // Frames that are not envelopes at all: nothing to acknowledge, still refused.
      for (const frame of ["null", "[1]", "7", '"x"', '{"type":"events_api"}']) ws.send(frame);
      const refused = () => logs.filter((l) => l.includes('"slack.refused"') && l.includes('"malformed"'));
      while (refused().length < bad.length + 5 && Date.now() < until)
        await new Promise((r) => setTimeout(r, 10));
      expect(refused()).toHaveLength(bad.length + 5);
      expect(logs.some((l) => l.includes("listener-failed") || l.includes("unhandled"))).toBe(false);
      // Still serving: a good mention is answered.
      const recorded = fixture("channel-mention-slack.json").mention;
      const payload = {
        ...recorded,
        event_id: "EvSOCK9",
        event: { ...recorded.event, type: "app_mention", text: `<@${BOT_USER_ID}> ${PANEL}` },
      };
      ws.send(JSON.stringify({ envelope_id: "env-9", type: "events_api", retry_attempt: 0, payload }));
      await api.waitFor((c) => c.some((x) => x.path === "/api/chat.postMessage"));
    } finally {
      setLogSink(() => {});
    }
  });

  it("serves /healthz beside the socket", async () => {
    await connected();
    const res = await fetch(`http://127.0.0.1:${running!.port}/healthz`);
    expect(res.status).toBe(200);
  });
});
