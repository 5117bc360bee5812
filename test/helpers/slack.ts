/**
 * A local fake of Slack's Web API and response_url endpoint on 127.0.0.1, recording what reaches
 * it, and helpers to sign requests the way Slack does (v0 HMAC-SHA256 of "v0:timestamp:body").
 */
import { createHmac } from "node:crypto";
import { createServer, type Server } from "node:http";
import type { AddressInfo } from "node:net";

export interface Call {
  path: string;
  body: Record<string, unknown>;
  /** The request body as sent (a file upload is multipart binary). */
  bytes: Buffer;
}

export interface FakeSlack {
  url: string;
  calls: Call[];
  /** Extra handlers by API method, e.g. "apps.connections.open". */
  methods: Record<string, () => Record<string, unknown>>;
  /** Answer the next N calls to a path with this status (and Retry-After: 0, unless `noRetryAfter`). */
  failNext(path: string, status: number, times?: number, noRetryAfter?: boolean): void;
  waitFor(predicate: (calls: Call[]) => boolean, timeoutMs?: number): Promise<Call[]>;
  close(): Promise<void>;
}

export const BOT_USER_ID = "U00FAKEBOT01";

export async function fakeSlack(): Promise<FakeSlack> {
  const calls: Call[] = [];
  const failures = new Map<string, { status: number; times: number; noRetryAfter?: boolean }>();
  const methods: FakeSlack["methods"] = {};
  const server: Server = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on("data", (d: Buffer) => {
      chunks.push(d);
    });
    req.on("end", () => {
      const bytes = Buffer.concat(chunks);
      const raw = bytes.toString("utf8");
      const path = req.url ?? "/";
      let body: Record<string, unknown> = {};
      const type = req.headers["content-type"] ?? "";
      try {
        body = type.includes("json") ? JSON.parse(raw || "{}") : Object.fromEntries(new URLSearchParams(raw));
        for (const k of ["blocks", "attachments"])
          if (typeof body[k] === "string") body[k] = JSON.parse(body[k] as string);
      } catch {
        body = { raw };
      }
      calls.push({ path, body, bytes });
      const fail = failures.get(path);
      if (fail && fail.times > 0) {
        fail.times--;
        res
          .writeHead(fail.status, {
            "content-type": "application/json",
            ...(fail.noRetryAfter ? {} : { "retry-after": "0" }),
          })
          .end('{"ok":false,"error":"fake_failure"}');
        return;
      }
      const method = path.replace(/^\/api\//, "");
      let answer: Record<string, unknown> = { ok: true };
      if (methods[method]) answer = methods[method]!();
      else if (method === "auth.test")
        answer = {
          ok: true,
          user_id: BOT_USER_ID,
          bot_id: "B00FAKEBOT1",
          team_id: "T00FAKE00AA",
          user: "solute",
        };
      else if (method === "chat.postMessage")
        answer = { ok: true, ts: `${Date.now() / 1000}`, channel: body.channel };
      // The files upload flow (files.uploadV2 in @slack/web-api): a URL to send the bytes to, then completion.
      else if (method === "files.getUploadURLExternal") {
        const id = `F0CHART${calls.filter((c) => c.path.endsWith("files.getUploadURLExternal")).length}`;
        answer = { ok: true, upload_url: `${url}/upload/${id}`, file_id: id };
      } else if (method === "files.completeUploadExternal")
        answer = { ok: true, files: JSON.parse(String(body.files ?? "[]")) };
      res.writeHead(200, { "content-type": "application/json" }).end(JSON.stringify(answer));
    });
  });
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", () => r()));
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  return {
    url,
    calls,
    methods,
    failNext(path, status, times = 1, noRetryAfter = false) {
      failures.set(path, { status, times, noRetryAfter });
    },
    async waitFor(predicate, timeoutMs = 5000) {
      const until = Date.now() + timeoutMs;
      while (!predicate(calls)) {
        if (Date.now() > until)
          throw new Error(`timed out; calls so far: ${JSON.stringify(calls.map((c) => c.path))}`);
        await new Promise((r) => setTimeout(r, 10));
      }
      return calls;
    },
    close: () =>
      new Promise<void>((r) => {
        server.close(() => r());
        server.closeAllConnections();
      }),
  };
}

export function sign(
  secret: string,
  body: string,
  timestamp = Math.floor(Date.now() / 1000),
): Record<string, string> {
  const signature = `v0=${createHmac("sha256", secret).update(`v0:${timestamp}:${body}`).digest("hex")}`;
  return { "x-slack-request-timestamp": String(timestamp), "x-slack-signature": signature };
}

export async function postSigned(
  url: string,
  secret: string,
  body: string,
  contentType: "application/json" | "application/x-www-form-urlencoded",
  options: { timestamp?: number; headers?: Record<string, string>; badSignature?: boolean } = {},
): Promise<{ status: number; text: string; ms: number }> {
  const headers = {
    "content-type": contentType,
    ...sign(options.badSignature ? "wrong-secret" : secret, body, options.timestamp),
    ...options.headers,
  };
  const started = performance.now();
  const res = await fetch(url, { method: "POST", headers, body });
  return { status: res.status, text: await res.text(), ms: performance.now() - started };
}

export function form(fields: Record<string, string>): string {
  return new URLSearchParams(fields).toString();
}
