/**
 * `npm run fuzz`: drives the reader, the expression sandbox, each adapter's request parsing and
 * (in bench/fuzz-http.ts) the HTTP bodies that reach Bolt and botbuilder with generated inputs — a million by default, bounded by a count and a time. Checks that no
 * exception escapes, every answer is either a correct result or a clear problem, and time per
 * input stays bounded. `runFuzz` is also called by the tests with a small count.
 *
 *   npm run fuzz -- [--count 1000000] [--seconds 300] [--seed 42]
 */
import fc from "fast-check";
import { cleanText as slackText } from "../adapters/slack/events.js";
import { channelOf, mentionsBot, cleanText as teamsText } from "../adapters/teams/events.js";
import { evaluateExpression, normaliseExpression } from "../bot/expression.js";
import { setLogSink } from "../bot/log.js";
import { readMessage, renderInputs } from "../core/reader/index.js";
import { loadUnits } from "../core/units.js";

export interface FuzzReport {
  target: string;
  runs: number;
  failures: string[];
  maxMs: number;
}

const WORDS = [
  "Na",
  "na+",
  "K",
  "glu",
  "glucose",
  "BUN",
  "urea",
  "osm",
  "EtOH",
  "calc osm",
  "gap",
  "bed",
  "#",
  "Mr",
  "MRN",
  "DOB",
  "mg/dL",
  "mmol/L",
  "mEq/L",
  "g/L",
  "mOsm/kg",
  "<",
  ">",
  "=",
  ":",
  ",",
  ";",
  "/",
  "-",
  "\n",
  "check",
  "plan",
  "kg",
  "L",
  "ml",
  "0.9%",
];

/** Messages made of the words people type, numbers of every shape, and noise. */
export const message = fc.oneof(
  fc.string({ maxLength: 200 }),
  fc
    .array(
      fc.oneof(
        fc.constantFrom(...WORDS),
        fc.double({ min: -1e7, max: 1e7, noNaN: true }).map(String),
        fc.integer({ min: 0, max: 999_999_999 }).map(String),
        fc.string({ maxLength: 8 }),
      ),
      { maxLength: 40 },
    )
    .map((p) => p.join(" ")),
  fc.string({ unit: "binary", maxLength: 120 }),
);

/** Arithmetic-looking strings, valid and not, and the known attack shapes. */
const expression = fc.oneof(
  fc
    .array(
      fc.oneof(
        fc.integer({ min: 0, max: 2_000_000 }).map(String),
        fc.constantFrom(
          "+",
          "-",
          "*",
          "/",
          "(",
          ")",
          "^",
          ".",
          "×",
          "÷",
          "−",
          " ",
          "e",
          "[",
          "]",
          ",",
          "'",
          "x",
          "f(",
          "import(",
          "evaluate(",
          "createUnit(",
          "=",
        ),
      ),
      { maxLength: 30 },
    )
    .map((p) => p.join("")),
  fc.string({ maxLength: 60 }),
);

/** A small, independent evaluator for + − × ÷ and brackets: the oracle for the sandbox's answers. */
export function oracle(text: string): number | undefined {
  const s = normaliseExpression(text).replace(/\s+/g, "");
  let i = 0;
  const number = (): number | undefined => {
    const m = /^\d+(\.\d*)?|^\.\d+/.exec(s.slice(i));
    if (!m) return undefined;
    i += m[0].length;
    return Number(m[0]);
  };
  const factor = (): number | undefined => {
    if (s[i] === "-" || s[i] === "+") {
      const sign = s[i++] === "-" ? -1 : 1;
      const v = factor();
      return v === undefined ? undefined : sign * v;
    }
    if (s[i] === "(") {
      i++;
      const v = sum();
      if (s[i] !== ")") return undefined;
      i++;
      return v;
    }
    return number();
  };
  const product = (): number | undefined => {
    let v = factor();
    while (v !== undefined && (s[i] === "*" || s[i] === "/")) {
      const op = s[i++];
      const r = factor();
      if (r === undefined) return undefined;
      v = op === "*" ? v * r : v / r;
    }
    return v;
  };
  const sum = (): number | undefined => {
    let v = product();
    while (v !== undefined && (s[i] === "+" || s[i] === "-")) {
      const op = s[i++];
      const r = product();
      if (r === undefined) return undefined;
      v = op === "+" ? v + r : v - r;
    }
    return v;
  };
  const v = sum();
  return i === s.length ? v : undefined;
}

async function timed(
  target: string,
  report: FuzzReport,
  limitMs: number,
  fn: () => string | undefined | Promise<string | undefined>,
): Promise<void> {
  const t = performance.now();
  let failure: string | undefined;
  try {
    failure = await fn();
  } catch (error) {
    failure = `threw ${(error as Error).name}`;
  }
  const ms = performance.now() - t;
  report.maxMs = Math.max(report.maxMs, ms);
  report.runs++;
  if (timeBudgets && ms > limitMs) failure = `${target} took ${ms.toFixed(0)} ms`;
  if (failure && report.failures.length < 20) report.failures.push(failure);
}

/** Time budgets are checked by npm run fuzz; the unit-test slice checks correctness only. */
let timeBudgets = true;

export async function runFuzz(options: {
  count: number;
  seconds: number;
  seed?: number;
  /** false in unit tests: a loaded machine must not fail a correct answer. */
  timeBudgets?: boolean;
}): Promise<FuzzReport[]> {
  timeBudgets = options.timeBudgets ?? true;
  await loadUnits();
  const deadline = Date.now() + options.seconds * 1000;
  const seed = options.seed ?? Date.now() % 2 ** 31;
  const share = { reader: 0.5, expression: 0.2, adapters: 0.3 };
  const reports: FuzzReport[] = [];

  const reader: FuzzReport = { target: "reader", runs: 0, failures: [], maxMs: 0 };
  for (const text of fc.sample(message, { numRuns: Math.round(options.count * share.reader), seed })) {
    if (Date.now() > deadline) break;
    await timed("reader", reader, 200, () => {
      const r = readMessage(text);
      // Either usable inputs or a clear problem; never a silent nothing for text with a digit.
      if (
        /\d/.test(text) &&
        Object.keys(r.inputs).length === 0 &&
        r.problems.length === 0 &&
        r.claims.length === 0 &&
        !r.tag
      ) {
        return "digits read as nothing, with no problem said";
      }
      // Whatever was read must read back the same (no value changed in transit).
      const again = readMessage(renderInputs(r.inputs)).inputs;
      return JSON.stringify(again) === JSON.stringify(r.inputs) ? undefined : "inputs do not read back";
    });
  }
  reports.push(reader);

  const sandbox: FuzzReport = { target: "expression sandbox", runs: 0, failures: [], maxMs: 0 };
  for (const text of fc.sample(expression, {
    numRuns: Math.round(options.count * share.expression),
    seed: seed + 1,
  })) {
    if (Date.now() > deadline) break;
    await timed("sandbox", sandbox, 200, async () => {
      const r = await evaluateExpression(text);
      const expected = oracle(text);
      let failure: string | undefined;
      if (r.ok) {
        if (expected === undefined || !Number.isFinite(expected))
          failure = "evaluated what the oracle refuses";
        else if (Math.abs(r.value - expected) > 1e-9 * Math.max(1, Math.abs(expected)))
          failure = "wrong value";
      } else if (!r.reason) failure = "refused without a reason";
      return failure && `${failure}: ${JSON.stringify(text)}`;
    });
  }
  reports.push(sandbox);

  const adapters: FuzzReport = { target: "adapter request parsing", runs: 0, failures: [], maxMs: 0 };
  const activity = fc.record(
    {
      text: fc.string({ maxLength: 200 }),
      conversation: fc.record(
        {
          id: fc.string({ maxLength: 60 }),
          conversationType: fc.constantFrom("channel", "personal", "groupChat", "x"),
        },
        { requiredKeys: [] },
      ),
      channelData: fc.record(
        {
          channel: fc.record({ id: fc.string({ maxLength: 40 }) }, { requiredKeys: [] }),
          teamsChannelId: fc.string({ maxLength: 40 }),
        },
        { requiredKeys: [] },
      ),
      entities: fc.array(
        fc.record(
          {
            type: fc.constantFrom("mention", "clientInfo"),
            mentioned: fc.record({ id: fc.string({ maxLength: 20 }) }, { requiredKeys: [] }),
          },
          { requiredKeys: [] },
        ),
        { maxLength: 4 },
      ),
      recipient: fc.record({ id: fc.string({ maxLength: 20 }) }, { requiredKeys: [] }),
    },
    { requiredKeys: [] },
  );
  const slackish = fc.oneof(
    message,
    fc
      .array(
        fc.constantFrom(
          "<@U1>",
          "<#C1|x>",
          "<!here>",
          "<http://x|y>",
          "&lt;",
          "&gt;",
          "&amp;",
          "<",
          ">",
          "|",
          "Na 128",
          " ",
        ),
        { maxLength: 30 },
      )
      .map((p) => p.join("")),
  );
  const n = Math.round(options.count * share.adapters);
  const slackInputs = fc.sample(slackish, { numRuns: Math.ceil(n / 2), seed: seed + 2 });
  const teamsInputs = fc.sample(activity, { numRuns: Math.floor(n / 2), seed: seed + 3 });
  for (const text of slackInputs) {
    if (Date.now() > deadline) break;
    await timed("slack", adapters, 200, () => {
      const out = slackText(text);
      return typeof out === "string" && !/<@[A-Z0-9]+>/.test(out) ? undefined : "mention left in text";
    });
  }
  for (const a of teamsInputs) {
    if (Date.now() > deadline) break;
    await timed("teams", adapters, 200, () => {
      const text = teamsText(a.text ?? "");
      const channel = channelOf(a);
      mentionsBot(a);
      return typeof text === "string" && typeof channel === "string" && !channel.includes(";")
        ? undefined
        : "bad channel or text";
    });
  }
  reports.push(adapters);
  // Over loopback, so far fewer: each is a real request through Bolt or botbuilder.
  const { runBodyFuzz } = await import("./fuzz-http.js");
  reports.push(
    await runBodyFuzz({
      count: Math.min(20_000, Math.round(options.count * 0.05)),
      seed: seed + 4,
      deadline,
    }),
  );
  return reports;
}

function arg(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  return i > 0 ? Number(process.argv[i + 1]) : fallback;
}

if (process.argv[1]?.endsWith("fuzz.ts")) {
  const started = Date.now();
  // Refused bodies are logged one line each: count them here instead of printing thousands.
  let logLines = 0;
  setLogSink(() => {
    logLines++;
  });
  const reports = await runFuzz({
    count: arg("count", 1_000_000),
    seconds: arg("seconds", 300),
    seed: arg("seed", 0) || undefined,
  });
  for (const r of reports) {
    process.stdout.write(
      `${r.target}: ${r.runs.toLocaleString("en")} inputs, ${r.failures.length} failures, slowest ${r.maxMs.toFixed(1)} ms\n`,
    );
    for (const f of r.failures) process.stdout.write(`  - ${f}\n`);
  }
  const total = reports.reduce((a, r) => a + r.runs, 0);
  process.stdout.write(
    `${total.toLocaleString("en")} inputs in ${((Date.now() - started) / 1000).toFixed(0)} s; ${logLines} log lines\n`,
  );
  process.exitCode = reports.some((r) => r.failures.length > 0) ? 1 : 0;
}
