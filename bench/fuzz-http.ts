/**
 * The bodies that reach Bolt and botbuilder, fuzzed over loopback: the real Slack and Teams
 * adapters behind Solute's server, a local fake Slack Web API, and generated bodies of every
 * JSON shape, forms with any `payload`, event and activity look-alikes and raw noise. Each body
 * must get an answer that is not a server error, and the server must still answer afterwards.
 */
import fc from "fast-check";
import { sign } from "../test/helpers/slack.js";
import { startStack } from "../test/helpers/stack.js";
import type { FuzzReport } from "./fuzz.js";

const SIGNING = "fuzz-signing-secret";

/** Statuses a body may get: answered, refused as malformed, too large, or not signed; never 5xx. */
const ALLOWED = new Set([200, 204, 400, 401, 403, 404, 413, 415]);
/** botbuilder answers an invoke it has no handler for with 501, as the Bot Framework specifies. */
const ALLOWED_TEAMS = new Set([...ALLOWED, 501]);

const jsonish = fc.oneof(
  fc.jsonValue({ maxDepth: 3 }),
  fc.record(
    {
      type: fc.constantFrom("event_callback", "url_verification", "block_actions", "view_submission", "x"),
      event: fc.record(
        {
          type: fc.constantFrom("app_mention", "message", "app_home_opened", "member_joined_channel"),
          text: fc.oneof(fc.string({ maxLength: 80 }), fc.constant("Na 128 glu 540 mg/dL"), fc.jsonValue()),
          channel: fc.oneof(fc.string({ maxLength: 12 }), fc.jsonValue()),
          user: fc.oneof(fc.string({ maxLength: 12 }), fc.constant(null)),
          ts: fc.oneof(fc.string({ maxLength: 12 }), fc.double()),
          channel_type: fc.constantFrom("im", "channel", "group"),
        },
        { requiredKeys: [] },
      ),
      actions: fc.array(fc.jsonValue({ maxDepth: 2 }), { maxLength: 3 }),
      challenge: fc.string({ maxLength: 20 }),
    },
    { requiredKeys: [] },
  ),
);

const activity = fc.record(
  {
    type: fc.oneof(
      fc.constantFrom("message", "invoke", "conversationUpdate", "event"),
      fc.string({ maxLength: 10 }),
    ),
    id: fc.string({ maxLength: 12 }),
    name: fc.constantFrom("task/fetch", "task/submit", "adaptiveCard/action", "x"),
    text: fc.oneof(fc.string({ maxLength: 80 }), fc.jsonValue()),
    value: fc.jsonValue({ maxDepth: 2 }),
    from: fc.oneof(fc.record({ id: fc.string({ maxLength: 10 }) }), fc.jsonValue()),
    conversation: fc.oneof(
      fc.record({
        id: fc.string({ maxLength: 10 }),
        conversationType: fc.constantFrom("personal", "channel"),
      }),
      fc.jsonValue(),
    ),
    channelData: fc.jsonValue({ maxDepth: 2 }),
    membersAdded: fc.jsonValue({ maxDepth: 2 }),
  },
  { requiredKeys: [] },
);

type Body = { path: "/slack/events" | "/api/messages"; type: string; text: string };

function bodies(serviceUrl: string): fc.Arbitrary<Body> {
  const slack = (type: string) => (text: string) => ({ path: "/slack/events" as const, type, text });
  return fc.oneof(
    jsonish.map((v) => JSON.stringify(v) ?? "null").map(slack("application/json")),
    fc
      .oneof(
        jsonish.map((v) => JSON.stringify(v) ?? "null"),
        fc.string({ maxLength: 60 }),
      )
      .map((p) => `payload=${encodeURIComponent(p)}`)
      .map(slack("application/x-www-form-urlencoded")),
    fc.string({ maxLength: 120 }).map(slack("application/x-www-form-urlencoded")),
    fc.string({ unit: "binary", maxLength: 120 }).map(slack("application/json")),
    // Activities never carry a serviceUrl of their own: replies may only go to 127.0.0.1.
    activity
      .map((a) => JSON.stringify({ ...a, serviceUrl }))
      .map((text) => ({ path: "/api/messages" as const, type: "application/json", text })),
    fc
      .oneof(
        fc.jsonValue({ maxDepth: 3 }).map((v) => JSON.stringify(v) ?? "null"),
        fc.string({ maxLength: 80 }),
      )
      .map((text) => ({ path: "/api/messages" as const, type: "application/json", text })),
  );
}

export async function runBodyFuzz(options: {
  count: number;
  seed: number;
  deadline: number;
}): Promise<FuzzReport> {
  const report: FuzzReport = { target: "HTTP bodies (Slack, Teams)", runs: 0, failures: [], maxMs: 0 };
  const stack = await startStack({
    signing: SIGNING,
    teams: true,
    env: { SOLUTE_SECRET: "fuzz-secret-0123456789abcdef", SOLUTE_RATE_LIMIT: "100000" },
  });
  const { api, base } = stack;
  try {
    // The fake Slack API stands in for the connector too: it accepts any POST.
    for (const b of fc.sample(bodies(`${api.url}/teams/`), { numRuns: options.count, seed: options.seed })) {
      if (Date.now() > options.deadline) break;
      report.runs++;
      const t = performance.now();
      try {
        const headers: Record<string, string> = { "content-type": b.type };
        if (b.path === "/slack/events") Object.assign(headers, sign(SIGNING, b.text));
        const res = await fetch(`${base}${b.path}`, { method: "POST", headers, body: b.text });
        await res.arrayBuffer();
        if (!(b.path === "/api/messages" ? ALLOWED_TEAMS : ALLOWED).has(res.status))
          report.failures.push(`${b.path} ${res.status}: ${JSON.stringify(b.text)}`);
      } catch (error) {
        report.failures.push(`${b.path} threw ${String(error)}: ${JSON.stringify(b.text)}`);
      }
      report.maxMs = Math.max(report.maxMs, performance.now() - t);
      if (report.failures.length >= 10) break;
    }
    const health = await fetch(`${base}/healthz`);
    if (health.status !== 200) report.failures.push(`/healthz answered ${health.status} afterwards`);
  } finally {
    await stack.close();
  }
  return report;
}
