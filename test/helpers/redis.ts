/**
 * A real redis-server for the tests, started on a free port of 127.0.0.1 with nothing kept on disk
 * (.ci/run installs redis-server when it is missing). With REDIS_URL set, that server is used
 * instead, and the tests that stop and restart Redis are skipped.
 */
import { type ChildProcess, spawn } from "node:child_process";
import { createServer } from "node:net";
import { createClient } from "redis";

export interface TestRedis {
  url: string;
  /** False when REDIS_URL points at a server the tests must not stop. */
  owned: boolean;
  stop(): Promise<void>;
  restart(): Promise<void>;
  /** Sends a signal to the server (SIGSTOP freezes it, SIGCONT thaws it); owned servers only. */
  signal(name: NodeJS.Signals): void;
  /** When a key expires, in Unix ms (Redis PEXPIRETIME): -1 without expiry, -2 when absent. */
  expiresAt(key: string): Promise<number>;
  /** Every key and its value(s), for privacy scans. */
  dump(): Promise<string>;
  flush(): Promise<void>;
}

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once("error", reject);
    s.listen(0, "127.0.0.1", () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

/**
 * Waits until the server answers PING. A client that never connected is left alone (destroying it
 * throws); one that connected is closed. A server that exits while starting fails at once.
 */
async function waitForPing(url: string, child?: ChildProcess, timeoutMs = 10_000): Promise<void> {
  const until = Date.now() + timeoutMs;
  let exited: number | null | undefined;
  child?.once("exit", (code) => {
    exited = code;
  });
  child?.once("error", () => {
    exited = null;
  });
  for (;;) {
    if (exited !== undefined) throw new Error(`redis-server exited while starting (code ${exited})`);
    const client = createClient({ url, socket: { reconnectStrategy: false, connectTimeout: 500 } });
    client.on("error", () => {});
    try {
      await client.connect();
      await client.ping();
      await client.quit();
      return;
    } catch {
      if (client.isOpen) client.destroy();
      if (Date.now() > until) throw new Error(`redis at ${url} did not answer within ${timeoutMs} ms`);
      await new Promise((r) => setTimeout(r, 50));
    }
  }
}

export async function startRedis(): Promise<TestRedis> {
  const external = process.env.REDIS_URL;
  let url = external ?? "";
  let child: ChildProcess | undefined;
  let port = 0;
  const launch = async () => {
    child = spawn(
      "redis-server",
      [
        "--port",
        String(port),
        "--bind",
        "127.0.0.1",
        "--save",
        "",
        "--appendonly",
        "no",
        "--protected-mode",
        "no",
      ],
      { stdio: "ignore" },
    );
    await waitForPing(url, child);
  };
  if (!external) {
    port = await freePort();
    url = `redis://127.0.0.1:${port}`;
    await launch();
  }
  const withClient = async <T>(fn: (c: ReturnType<typeof createClient>) => Promise<T>): Promise<T> => {
    const c = createClient({ url });
    c.on("error", () => {});
    await c.connect();
    try {
      return await fn(c);
    } finally {
      await c.quit();
    }
  };
  const stop = async () => {
    if (!child) return;
    const exited = new Promise((r) => child!.once("exit", r));
    child.kill("SIGKILL");
    await exited;
    child = undefined;
  };
  return {
    url,
    owned: !external,
    stop,
    signal: (name) => {
      child?.kill(name);
    },
    restart: async () => {
      await stop();
      await launch();
    },
    expiresAt: (key) => withClient((c) => c.pExpireTime(key)),
    flush: () => withClient(async (c) => void (await c.flushDb())),
    dump: () =>
      withClient(async (c) => {
        const out: string[] = [];
        for await (const keys of c.scanIterator({ MATCH: "*", COUNT: 100 })) {
          for (const key of ([] as string[]).concat(keys)) {
            const type = await c.type(key);
            let value: unknown;
            if (type === "string") value = await c.get(key);
            else if (type === "zset") value = await c.zRange(key, 0, -1);
            else if (type === "hash") value = await c.hGetAll(key);
            else if (type === "list") value = await c.lRange(key, 0, -1);
            else if (type === "set") value = await c.sMembers(key);
            out.push(`${key} ${JSON.stringify(value)}`);
          }
        }
        return out.join("\n");
      }),
  };
}
