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

export async function startServer(options: {
  port: number;
  host: string;
  routes: Record<string, Handler>;
  store: Store;
}): Promise<HttpServer> {
  const { routes, store } = options;
  const server = createServer((req, res) => {
    const path = (req.url ?? "/").split("?")[0]!;
    if (path === "/healthz") {
      res.writeHead(200, { "content-type": "application/json" }).end('{"status":"ok"}');
      return;
    }
    if (path === "/readyz") {
      store
        .ready()
        .catch(() => false)
        .then((ok) => {
          res
            .writeHead(ok ? 200 : 503, { "content-type": "application/json" })
            .end(JSON.stringify({ status: ok ? "ready" : "store-unavailable", store: store.kind }));
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
