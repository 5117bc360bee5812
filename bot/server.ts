/**
 * The one HTTP server: the chat adapters mount their endpoints here (/slack/events,
 * /api/messages), beside /healthz (liveness) and /readyz (readiness, with the store's state).
 * Transport only: no body parsing here, so each SDK sees the raw request it expects.
 */
import { createServer, type IncomingMessage, type Server, type ServerResponse } from "node:http";
import type { AddressInfo } from "node:net";
import { errorCode, log } from "./log.js";
import type { Store } from "./store.js";

export type Handler = (req: IncomingMessage, res: ServerResponse) => void | Promise<void>;

export interface HttpServer {
  server: Server;
  port: number;
  close(graceMs?: number): Promise<void>;
}

/** How long /readyz waits for the store before it answers 503. */
export const READY_TIMEOUT_MS = 800;

export async function startServer(options: {
  port: number;
  host: string;
  routes: Record<string, Handler>;
  store: Store;
  /** What else must be ready: the unit tables, each chat platform ("slack": its state). */
  checks?: () => Record<string, { ready: boolean; code?: string }>;
}): Promise<HttpServer> {
  const { routes, store } = options;
  const server = createServer((req, res) => {
    const path = (req.url ?? "/").split("?")[0]!;
    if (path === "/healthz") {
      res.writeHead(200, { "content-type": "application/json" }).end('{"status":"ok"}');
      return;
    }
    if (path === "/readyz") {
      // Ready means ready: the store answers (within a bound), the unit tables are loaded, and
      // every configured platform is authenticated. Otherwise 503, naming what is not.
      let timer: NodeJS.Timeout | undefined;
      Promise.race([
        store.ready().catch(() => false),
        new Promise<boolean>((r) => {
          timer = setTimeout(() => r(false), READY_TIMEOUT_MS);
        }),
      ]).then((storeOk) => {
        clearTimeout(timer);
        const checks = options.checks?.() ?? {};
        const waiting = Object.entries(checks).filter(([, c]) => !c.ready);
        const ok = storeOk && waiting.length === 0;
        res.writeHead(ok ? 200 : 503, { "content-type": "application/json" }).end(
          JSON.stringify({
            status: ok ? "ready" : !storeOk ? "store-unavailable" : "not-ready",
            store: store.kind,
            ...(waiting.length > 0 && {
              waiting: Object.fromEntries(waiting.map(([name, c]) => [name, c.code ?? "starting"])),
            }),
          }),
        );
      });
      return;
    }
    const route = routes[path];
    if (!route) {
      res.writeHead(404).end();
      return;
    }
    Promise.resolve(route(req, res)).catch((error) => {
      log("error", "http.handler-failed", { code: errorCode(error) });
      if (!res.headersSent) res.writeHead(500).end();
    });
  });
  server.keepAliveTimeout = 65_000;
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(options.port, options.host, () => resolve());
  });
  const port = (server.address() as AddressInfo).port;
  log("info", "http.listening", { count: port });
  return {
    server,
    port,
    // Stops accepting at once; requests in flight finish (up to `graceMs`), then it resolves.
    close: (graceMs = 10_000) =>
      new Promise<void>((resolve) => {
        const force = setTimeout(() => server.closeAllConnections(), graceMs);
        force.unref();
        // Connections that finish their request become idle: close them as they do.
        const sweep = setInterval(() => server.closeIdleConnections(), 50);
        server.close(() => {
          clearTimeout(force);
          clearInterval(sweep);
          resolve();
        });
        server.closeIdleConnections();
      }),
  };
}
