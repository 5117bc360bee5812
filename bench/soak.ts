/**
 * `npm run soak`: mixed Slack and Teams traffic at 200 requests/s for 60 s against the production
 * build with Redis, all on 127.0.0.1. Passes when there are zero errors, every Slack request is
 * acknowledged well inside Slack's 3 s, every malformed body mixed in gets 400, and no injected identifier, message text or platform ID
 * shows up in the server's logs or anywhere in Redis. Prints its figures.
 *
 *   npm run soak -- [--seconds 60] [--rate 200]
 * `runSoak` is also called by the tests with a short, slow slice.
 */
import { type ChildProcess, spawn } from "node:child_process";
import { createHmac } from "node:crypto";
import { createServer } from "node:net";
import autocannon from "autocannon";
import { startRedis } from "../test/helpers/redis.js";

export interface SoakReport {
  seconds: number;
  requests: { slack: number; teams: number };
  errors: number;
  non2xx: number;
  slackAckMs: { p50: number; p99: number; max: number };
  teamsMs: { p50: number; p99: number; max: number };
  leaks: string[];
  /** Bodies no platform sends, mixed into the traffic: how many, and how many got their 400. */
  refused: { sent: number; answered400: number; otherwise: number };
  passed: boolean;
}

const SIGNING = "soak-signing-secret";
/** Planted in some messages: none may appear in logs or the store. */
const PLANTED = [
  "Mrs Quarrington-Vale",
  "MRN 70312288",
  "DOB 11/09/1948",
  "07700 900431",
  "q.vale@example.org",
];
const PANELS = [
  "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310",
  "bed 12 Na 121 K 3.4 glu 6.2 mmol/L urea 3.1 mmol/L osm 254",
  "bay 4B Na 139 glu 6.1 mmol/L urea 5.2 mmol/L osm 318 EtOH 230 mg/dL",
  "check Na 131 glu 22 mmol/L urea 9 mmol/L calc osm 300",
  "plan Na 118 70 kg woman adult 1 L 0.9% NaCl",
  "handover",
];

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createServer();
    s.listen(0, "127.0.0.1", () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

function text(n: number): string {
  const panel = PANELS[n % PANELS.length]!;
  return n % 7 === 0 ? `${PLANTED[n % PLANTED.length]} ${panel}` : panel;
}

function sign(body: string): Record<string, string> {
  const ts = Math.floor(Date.now() / 1000);
  return {
    "x-slack-request-timestamp": String(ts),
    "x-slack-signature": `v0=${createHmac("sha256", SIGNING).update(`v0:${ts}:${body}`).digest("hex")}`,
  };
}

export async function runSoak(options: {
  seconds: number;
  rate: number;
  server: string[];
}): Promise<SoakReport> {
  const redis = await startRedis();
  const fakePort = await freePort();
  const port = await freePort();
  const children: ChildProcess[] = [];
  const logs: string[] = [];
  try {
    const fake = spawn(process.execPath, ["bench/fake-connector.mjs"], {
      env: { PATH: process.env.PATH ?? "", PORT: String(fakePort) },
      stdio: ["ignore", "pipe", "inherit"],
    });
    children.push(fake);
    await new Promise((r) => fake.stdout!.once("data", r));
    const [cmd, ...args] = options.server;
    const server = spawn(cmd!, args, {
      env: {
        PATH: process.env.PATH ?? "",
        PORT: String(port),
        HOST: "127.0.0.1",
        REDIS_URL: redis.url,
        SOLUTE_SECRET: "soak-secret-0123456789",
        SOLUTE_RATE_LIMIT: "100000",
        SLACK_BOT_TOKEN: "xoxb-soak",
        SLACK_SIGNING_SECRET: SIGNING,
        SLACK_API_URL: `http://127.0.0.1:${fakePort}/api/`,
        TEAMS_LOCAL: "1",
      },
      stdio: ["ignore", "pipe", "pipe"],
    });
    children.push(server);
    server.stdout!.on("data", (d) => logs.push(String(d)));
    await new Promise<void>((resolve, reject) => {
      server.stderr!.on("data", (d) => {
        logs.push(String(d));
        if (/"event":"ready"/.test(logs.join(""))) resolve();
      });
      server.once("exit", (code) =>
        reject(new Error(`server exited ${code}: ${logs.join("").slice(0, 500)}`)),
      );
    });

    let n = 0;
    // Every 13th request is a body no platform sends (null, an array, payload=null, an envelope
    // without a type): each must get 400 while the traffic around it is answered as usual.
    const refused = { sent: 0, answered400: 0, otherwise: 0 };
    const base = `http://127.0.0.1:${port}`;
    type Built = { body: string; headers: Record<string, string>; expect?: number };
    /** Half the rate at one endpoint; `build` makes each request's body and headers afresh. */
    const traffic = (path: string, build: (i: number) => Built) =>
      autocannon({
        url: `${base}${path}`,
        connections: 8,
        duration: options.seconds,
        overallRate: options.rate / 2,
        requests: [
          {
            method: "POST",
            setupRequest: (req, context: { expect?: number }) => {
              const i = n++;
              const built = i % 13 === 12 ? malformed(path, i) : build(i);
              context.expect = built.expect;
              if (built.expect !== undefined) refused.sent++;
              return { ...req, body: built.body, headers: { ...req.headers, ...built.headers } };
            },
            onResponse: (status: number, _body: string, context: { expect?: number }) => {
              if (context.expect === undefined) return;
              if (status === context.expect) refused.answered400++;
              else refused.otherwise++;
            },
          },
        ],
      });
    const malformed = (path: string, i: number): Built => {
      const shapes = ["null", "[]", "42", '{"actions":[],"challenge":"x"}'];
      const raw = shapes[i % shapes.length]!;
      const form = path === "/slack/events" && i % 2 === 0;
      const body = form ? `payload=${encodeURIComponent(raw)}` : raw;
      const type = form ? "application/x-www-form-urlencoded" : "application/json";
      return {
        body,
        headers: { "content-type": type, ...(path === "/slack/events" ? sign(body) : {}) },
        expect: 400,
      };
    };
    const slack = traffic("/slack/events", (i) => {
      let body: string;
      let type: string;
      if (i % 3 === 0) {
        body = new URLSearchParams({
          command: "/solute",
          text: text(i),
          channel_id: `C0SOAK${i % 5}`,
          user_id: "U0SOAKUSER",
          team_id: "T0SOAK",
          response_url: `http://127.0.0.1:${fakePort}/respond`,
          trigger_id: "t",
          token: "x",
        }).toString();
        type = "application/x-www-form-urlencoded";
      } else {
        body = JSON.stringify({
          type: "event_callback",
          team_id: "T0SOAK",
          api_app_id: "A0SOAK",
          event_id: `Ev0SOAK${i}`,
          event_time: 1,
          event: {
            type: "app_mention",
            user: "U0SOAKUSER",
            text: `<@U0BENCHBOT> ${text(i)}`,
            ts: `${1700000000 + i}.000100`,
            channel: `C0SOAK${i % 5}`,
            event_ts: `${1700000000 + i}.000100`,
          },
        });
        type = "application/json";
      }
      return { body, headers: { "content-type": type, ...sign(body) } };
    });
    const teams = traffic("/api/messages", (i) => {
      const body = JSON.stringify({
        type: "message",
        id: `soak-${i}`,
        channelId: "msteams",
        serviceUrl: `http://127.0.0.1:${fakePort}/`,
        text: text(i),
        from: { id: "29:soakuser", name: "Soak User" },
        recipient: { id: "28:soakbot" },
        conversation: { id: `a:soak${i % 5}`, conversationType: "personal" },
      });
      return { body, headers: { "content-type": "application/json" } };
    });
    const [s, t] = await Promise.all([slack, teams]);
    await new Promise((r) => setTimeout(r, 500));
    const dump = await redis.dump();
    const seen = logs.join("") + dump;
    const leaks = [
      ...PLANTED,
      ...PLANTED.flatMap((p) => p.split(/\s+/).filter((w) => w.length >= 6)),
      "U0SOAKUSER",
      "C0SOAK",
      "29:soakuser",
      "Soak User",
      "a:soak",
      "glu 540",
      "Na 128 ",
    ].filter((x) => seen.includes(x));
    const errors = s.errors + s.timeouts + t.errors + t.timeouts;
    // The refused bodies' 400s are expected; any other non-2xx is not.
    const non2xx = s.non2xx + t.non2xx - refused.answered400;
    const report: SoakReport = {
      seconds: options.seconds,
      requests: { slack: s.requests.total, teams: t.requests.total },
      errors,
      non2xx,
      slackAckMs: { p50: s.latency.p50, p99: s.latency.p99, max: s.latency.max },
      teamsMs: { p50: t.latency.p50, p99: t.latency.p99, max: t.latency.max },
      leaks: [...new Set(leaks)],
      refused: { ...refused },
      passed: false,
    };
    report.passed =
      errors === 0 &&
      non2xx === 0 &&
      refused.sent > 0 &&
      refused.otherwise === 0 &&
      report.slackAckMs.max < 1000 &&
      report.leaks.length === 0 &&
      s.requests.total > 0 &&
      t.requests.total > 0;
    return report;
  } finally {
    for (const c of children.reverse()) {
      c.kill("SIGTERM");
      await new Promise((r) => (c.exitCode !== null ? r(null) : c.once("exit", r)));
    }
    await redis.stop();
  }
}

function arg(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? Number(process.argv[i + 1]) : fallback;
}

if (process.argv[1]?.endsWith("soak.ts")) {
  const r = await runSoak({
    seconds: arg("seconds", 60),
    rate: arg("rate", 200),
    server: [process.execPath, "dist/main.js"],
  });
  const lines = [
    `soak: ${r.seconds} s at ${arg("rate", 200)} requests/s, Slack and Teams, Redis`,
    `requests: Slack ${r.requests.slack}, Teams ${r.requests.teams}; errors ${r.errors}; non-2xx ${r.non2xx}`,
    `Slack acknowledgement: p50 ${r.slackAckMs.p50} ms, p99 ${r.slackAckMs.p99} ms, max ${r.slackAckMs.max} ms (Slack allows 3000)`,
    `bodies no platform sends: ${r.refused.sent}, answered 400: ${r.refused.answered400}, otherwise: ${r.refused.otherwise}`,
    `Teams: p50 ${r.teamsMs.p50} ms, p99 ${r.teamsMs.p99} ms, max ${r.teamsMs.max} ms`,
    `identifiers, message text or platform IDs found in logs or Redis: ${r.leaks.length === 0 ? "none" : r.leaks.join(", ")}`,
    r.passed ? "PASSED" : "FAILED",
  ];
  process.stdout.write(`${lines.join("\n")}\n`);
  process.exitCode = r.passed ? 0 : 1;
}
