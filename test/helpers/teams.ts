/** A local fake of the Bot Framework connector on 127.0.0.1: records the activities the bot sends. */
import { createServer, type Server } from "node:http";
import type { AddressInfo } from "node:net";

export interface Sent {
  path: string;
  activity: Record<string, unknown>;
}

export interface FakeConnector {
  serviceUrl: string;
  sent: Sent[];
  failNext(status: number, times?: number): void;
  /** Delay every answer by this many milliseconds. */
  slow(ms: number): void;
  /** Every request that reached it, failed ones included. */
  attempts: number;
  waitFor(n: number, timeoutMs?: number): Promise<Sent[]>;
  close(): Promise<void>;
}

export async function fakeConnector(): Promise<FakeConnector> {
  const sent: Sent[] = [];
  let failures = { status: 0, times: 0 };
  let delayMs = 0;
  const state = { attempts: 0 };
  const server: Server = createServer((req, res) => {
    let raw = "";
    req.on("data", (d) => {
      raw += d;
    });
    req.on("end", async () => {
      state.attempts++;
      if (delayMs) await new Promise((r) => setTimeout(r, delayMs));
      if (failures.times > 0) {
        failures.times--;
        res.writeHead(failures.status, { "retry-after": "0" }).end();
        return;
      }
      sent.push({ path: decodeURIComponent(req.url ?? ""), activity: JSON.parse(raw || "{}") });
      res
        .writeHead(200, { "content-type": "application/json" })
        .end(JSON.stringify({ id: `reply-${sent.length}` }));
    });
  });
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", () => r()));
  return {
    serviceUrl: `http://127.0.0.1:${(server.address() as AddressInfo).port}/`,
    sent,
    failNext(status, times = 1) {
      failures = { status, times };
    },
    slow(ms) {
      delayMs = ms;
    },
    get attempts() {
      return state.attempts;
    },
    async waitFor(n, timeoutMs = 5000) {
      const until = Date.now() + timeoutMs;
      while (sent.length < n) {
        if (Date.now() > until) throw new Error(`timed out waiting for ${n} activities; got ${sent.length}`);
        await new Promise((r) => setTimeout(r, 10));
      }
      return sent;
    },
    close: () =>
      new Promise<void>((r) => {
        server.close(() => r());
        server.closeAllConnections();
      }),
  };
}

/** The recorded activity with its text swapped and its serviceUrl pointed at the fake connector. */
export function replay(
  recorded: Record<string, unknown>,
  text: string,
  serviceUrl: string,
  id = `${Date.now()}${Math.random()}`,
): Record<string, unknown> {
  return { ...recorded, id, text, serviceUrl };
}
