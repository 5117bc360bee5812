/**
 * `npm run bench`: measures Solute against its budgets on this machine and writes
 * docs/benchmarks.md. Servers run as the production build (dist/) in their own processes; load
 * comes from autocannon on 127.0.0.1. Ratios against bare reference apps, measured in the same run,
 * cancel most of the machine's noise.
 */
import { type ChildProcess, spawn, spawnSync } from "node:child_process";
import { createHmac } from "node:crypto";
import { mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { cpus, tmpdir, totalmem } from "node:os";
import { join } from "node:path";
import autocannon from "autocannon";
import { build } from "esbuild";
import { render as renderSlack } from "../adapters/slack/render.js";
import { MemoryStore } from "../adapters/store/memory.js";
import { RedisStore } from "../adapters/store/redis.js";
import { loadConfig } from "../bot/config.js";
import { Conversation } from "../bot/conversation.js";
import { setLogSink } from "../bot/log.js";
import { channelKey } from "../bot/privacy.js";
import { recordOf } from "../bot/shift.js";
import { assess } from "../core/assess.js";
import { readMessage } from "../core/reader/index.js";
import { loadUnits } from "../core/units.js";
import { startRedis } from "../test/helpers/redis.js";
import { CORPUS } from "./corpus.js";

setLogSink(() => {});
const quick = process.argv.includes("--quick");
/** --only=slack,teams runs just those (for working on one budget); the report is then not written. */
const only = process.argv
  .find((a) => a.startsWith("--only="))
  ?.slice(7)
  .split(",");
const want = (name: string) => !only || only.includes(name);
const DURATION = quick ? 3 : 10;
const SIGNING = "bench-signing-secret";
let nextPort = 41_000 + Math.floor(Math.random() * 2000);
const port = () => nextPort++;

interface Row {
  what: string;
  measure: string;
  ours: string;
  reference: string;
  ratio: string;
  budget: string;
  met: boolean;
}
const rows: Row[] = [];
const log = (s: string) => process.stderr.write(`${s}\n`);

function start(
  cmd: string,
  args: string[],
  env: Record<string, string>,
  readyPattern: RegExp,
): Promise<{ child: ChildProcess; ms: number }> {
  const started = performance.now();
  const child = spawn(cmd, args, {
    env: { PATH: process.env.PATH ?? "", ...env },
    stdio: ["ignore", "pipe", "pipe"],
  });
  return new Promise((resolve, reject) => {
    let seen = "";
    let ready = false;
    // Until ready, collect output to find the ready line; after it, drain and drop (the server's
    // own log lines must cost the measuring process nothing).
    const onData = (d: Buffer) => {
      if (ready) return;
      seen += d;
      if (readyPattern.test(seen)) {
        ready = true;
        seen = "";
        resolve({ child, ms: performance.now() - started });
      }
    };
    child.stdout!.on("data", onData);
    child.stderr!.on("data", onData);
    child.once("exit", (code) =>
      reject(new Error(`${args.join(" ")} exited ${code}: ${seen.slice(0, 500)}`)),
    );
    setTimeout(
      () => reject(new Error(`not ready: ${args.join(" ")}\n${seen.slice(0, 500)}`)),
      20_000,
    ).unref();
  });
}

async function stop(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null) return;
  const exited = new Promise((r) => child.once("exit", r));
  child.kill("SIGTERM");
  await Promise.race([exited, new Promise((r) => setTimeout(r, 3000))]);
  if (child.exitCode === null) child.kill("SIGKILL");
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

/** A request to send: the same each time, or made fresh for each request. */
type Shot = { body: string; headers: Record<string, string> };

async function load(
  url: string,
  shot: Shot | (() => Shot),
): Promise<{ rps: number; p99: number; errors: number; non2xx: number }> {
  const requests =
    typeof shot === "function"
      ? [
          {
            method: "POST" as const,
            // autocannon calls this for every request: each one differs (a fresh signature).
            setupRequest: (req: object) => ({ ...req, ...shot() }),
          },
        ]
      : undefined;
  const options = typeof shot === "function" ? { requests } : shot;
  // A short warm-up, then the measured run.
  await autocannon({ url, method: "POST", ...options, connections: 10, duration: 2 });
  const r = await autocannon({ url, method: "POST", ...options, connections: 10, duration: DURATION });
  return { rps: r.requests.average, p99: r.latency.p99, errors: r.errors + r.timeouts, non2xx: r.non2xx };
}

// --- engine ---------------------------------------------------------------------------------
async function helper(name: string, root = "."): Promise<string> {
  // Built like production (scripts/build.mjs): mathjs bundled and tree-shaken, the rest external.
  const pkg = JSON.parse(readFileSync("package.json", "utf8")) as { dependencies: Record<string, string> };
  await build({
    entryPoints: { [`bench-${name}`]: `${root}/bench/${name}.ts` },
    outdir: "dist",
    nodePaths: [`${process.cwd()}/node_modules`],
    bundle: true,
    format: "esm",
    platform: "node",
    target: "node20",
    external: Object.keys(pkg.dependencies).filter((d) => d !== "mathjs"),
    logLevel: "warning",
  });
  const child = spawn(process.execPath, ["--expose-gc", `dist/bench-${name}.js`], {
    stdio: ["ignore", "pipe", "inherit"],
  });
  let out = "";
  child.stdout!.on("data", (d) => {
    out += d;
  });
  await new Promise((r) => child.once("exit", r));
  return out;
}

/**
 * The reader before pasted reports were understood (issue 13), kept as the reference row until
 * the new reader is at least as fast: its source comes straight from git history, so nothing of
 * it lives in the tree. Both run the same corpus (bench/corpus.ts has not changed since).
 */
const PREVIOUS_READER = "183a439^";

function previousReader(): string | undefined {
  const dir = mkdtempSync(join(tmpdir(), "solute-previous-reader-"));
  const archive = spawnSync(
    "git",
    ["archive", PREVIOUS_READER, "core", "bot", "bench/engine.ts", "bench/corpus.ts"],
    {
      maxBuffer: 64 * 2 ** 20,
    },
  );
  if (archive.status !== 0) return undefined;
  const untar = spawnSync("tar", ["-x", "-C", dir], { input: archive.stdout });
  if (untar.status !== 0) return undefined;
  // The reader-alone bench is ours, pointed at the previous reader's module.
  const ours = readFileSync("bench/reader.ts", "utf8");
  writeFileSync(join(dir, "bench/reader.ts"), ours.replace("../core/reader/index.js", "../core/reader.js"));
  return dir;
}

/** Best of `rounds` runs of a bench helper, ours and the reference taken in turn (a shared machine drifts). */
async function alternating(
  name: string,
  root: string | undefined,
  rounds = 3,
): Promise<{ ours: number; ref?: number }> {
  let ours = 0;
  let ref: number | undefined;
  for (let i = 0; i < rounds; i++) {
    ours = Math.max(ours, (JSON.parse(await helper(name)) as { best: number }).best);
    if (root) ref = Math.max(ref ?? 0, (JSON.parse(await helper(name, root)) as { best: number }).best);
  }
  return { ours, ref };
}

async function engine(): Promise<void> {
  const previous = previousReader();
  if (!previous) log("engine: the previous reader could not be taken from git history (a shallow clone?)");
  const path = await alternating("engine", previous);
  const read = await alternating("reader", previous);
  if (previous) rmSync(previous, { recursive: true, force: true });
  const best = path.ours;
  const reader = read.ours;
  const reference = path.ref && read.ref ? { engine: path.ref, reader: read.ref } : undefined;
  const perSecond = (n: number | undefined) =>
    n ? `${Math.round(n).toLocaleString("en")} msg/s` : "not measured";
  const readerRatio = reference ? reader / reference.reader : undefined;
  rows.push({
    what: "reader",
    measure: `the reader alone, ${CORPUS.length} invented messages, one core (best of 3); reference: the reader before pasted reports (${PREVIOUS_READER})`,
    ours: perSecond(reader),
    reference: perSecond(reference?.reader),
    ratio: readerRatio ? `${readerRatio.toFixed(2)}×` : "—",
    budget: "≥ 1.0× the previous reader",
    met: readerRatio !== undefined && readerRatio >= 1,
  });
  // The whole path also does what later issues added after reading (findings, claims, crisis and
  // work-up rules, the first view): its ratio is reported, its budget is the absolute one.
  rows.push({
    what: "engine",
    measure: `read + compute + render, ${CORPUS.length} invented messages, one core (best of 3); reference: the same path at ${PREVIOUS_READER}, before the reasoning of later issues`,
    ours: perSecond(best),
    reference: perSecond(reference?.engine),
    ratio: reference ? `${(best / reference.engine).toFixed(2)}×` : "—",
    budget: "≥ 50,000 msg/s",
    met: best >= 50_000,
  });
  log(
    `engine: ${Math.round(best)} msg/s (previous ${Math.round(reference?.engine ?? 0)}); reader ${Math.round(reader)} (previous ${Math.round(reference?.reader ?? 0)})`,
  );
}

/** The environment for a server (Solute or the bare Bolt app) serving Slack over HTTP. */
function slackEnv(p: number, connector: string): Record<string, string> {
  return {
    PORT: String(p),
    HOST: "127.0.0.1",
    SLACK_BOT_TOKEN: "xoxb-bench",
    SLACK_SIGNING_SECRET: SIGNING,
    SLACK_API_URL: `${connector}/api/`,
    SOLUTE_SECRET: "bench-secret-0123456789",
    SOLUTE_RATE_LIMIT: "100000",
  };
}

// --- Slack HTTP path --------------------------------------------------------------------------
/**
 * Signed slash commands, each new (its own trigger_id and signature), as Slack sends them: one
 * request repeated would be dropped as a replay and measure nothing.
 */
function slackCommand(connector: string, text = "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310"): () => Shot {
  let sent = 0;
  return () => {
    const body = new URLSearchParams({
      command: "/solute",
      text,
      channel_id: "C0BENCH",
      user_id: "U0BENCH",
      team_id: "T0BENCH",
      response_url: `${connector}/respond`,
      trigger_id: `t${++sent}`,
      token: "x",
    }).toString();
    const ts = Math.floor(Date.now() / 1000);
    const signature = createHmac("sha256", SIGNING).update(`v0:${ts}:${body}`).digest("hex");
    return {
      body,
      headers: {
        "content-type": "application/x-www-form-urlencoded",
        "x-slack-request-timestamp": String(ts),
        "x-slack-signature": `v0=${signature}`,
      },
    };
  };
}

async function slack(connector: string): Promise<void> {
  const shot = slackCommand(connector);
  const env = (p: number) => slackEnv(p, connector);
  // The same answer as Solute gives, for a bare app that only sends it (its size, not its work).
  await loadUnits();
  const text = "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310";
  const reply = await new Conversation(
    new MemoryStore(),
    loadConfig({ SOLUTE_SECRET: "bench-secret-0123456789" }),
  ).handle({ text, channel: "C0BENCH", platform: "slack" });
  const answer = JSON.stringify({
    response_type: "ephemeral",
    ...renderSlack(reply, { source: text, offerPost: true }),
  });
  const results: Record<string, { rps: number; p99: number; errors: number; non2xx: number }> = {};
  const runs: [string, string, Record<string, string>][] = [
    ["bare", "bench/bare/bolt.mjs", {}],
    ["sameSize", "bench/bare/bolt.mjs", { ACK_BODY: answer }],
    ["ours", "dist/main.js", {}],
  ];
  for (const [name, script, extra] of runs) {
    const p = port();
    const { child } = await start(process.execPath, [script], { ...env(p), ...extra }, /"event":"ready"/);
    results[name] = await load(`http://127.0.0.1:${p}/slack/events`, shot);
    await stop(child);
  }
  const ours = results.ours!;
  const bare = results.bare!;
  const sameSize = results.sameSize!;
  const ratio = ours.rps / bare.rps;
  const p99ratio = ours.p99 / Math.max(bare.p99, 1);
  rows.push({
    what: "Slack HTTP path",
    measure: "signed slash commands through the real Bolt app, autocannon, 10 connections",
    ours: `${Math.round(ours.rps)} req/s, p99 ${ours.p99} ms`,
    reference: `bare Bolt ack: ${Math.round(bare.rps)} req/s, p99 ${bare.p99} ms; bare Bolt sending Solute's ${(answer.length / 1024).toFixed(1)} KB answer: ${Math.round(sameSize.rps)} req/s, p99 ${sameSize.p99} ms`,
    ratio: `${ratio.toFixed(2)} × throughput, ${p99ratio.toFixed(2)} × p99`,
    budget: "≥ 0.9 × throughput, p99 ≤ 1.2 ×",
    met: ratio >= 0.9 && p99ratio <= 1.2 && ours.errors + ours.non2xx === 0,
  });
  log(
    `slack: ours ${JSON.stringify(ours)} bare ${JSON.stringify(bare)} same-size ${JSON.stringify(sameSize)}`,
  );
}

// --- Teams path -------------------------------------------------------------------------------
async function teams(connector: string): Promise<void> {
  // Every activity has its own id, as Teams sends them: a repeated id is dropped as a redelivery.
  let sent = 0;
  const shot = (): Shot => ({
    body: JSON.stringify({
      type: "message",
      id: String(++sent),
      channelId: "msteams",
      serviceUrl: `${connector}/`,
      text: "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310",
      from: { id: "29:bench" },
      recipient: { id: "28:bench" },
      conversation: { id: "a:bench", conversationType: "personal" },
    }),
    headers: { "content-type": "application/json" },
  });
  const results: Record<string, { rps: number; p99: number; errors: number; non2xx: number }> = {};
  for (const [name, script] of [
    ["bare", "bench/bare/echo.mjs"],
    ["ours", "dist/main.js"],
  ] as const) {
    const p = port();
    const { child } = await start(
      process.execPath,
      [script],
      {
        PORT: String(p),
        HOST: "127.0.0.1",
        TEAMS_LOCAL: "1",
        SOLUTE_SECRET: "bench-secret-0123456789",
        SOLUTE_RATE_LIMIT: "100000",
      },
      /"event":"ready"/,
    );
    results[name] = await load(`http://127.0.0.1:${p}/api/messages`, shot);
    await stop(child);
  }
  const ratio = results.ours!.rps / results.bare!.rps;
  rows.push({
    what: "Teams path",
    measure: "activities through the real CloudAdapter to a local fake connector, autocannon, 10 connections",
    ours: `${Math.round(results.ours!.rps)} req/s, p99 ${results.ours!.p99} ms`,
    reference: `bare echo bot: ${Math.round(results.bare!.rps)} req/s, p99 ${results.bare!.p99} ms`,
    ratio: `${ratio.toFixed(2)} × throughput`,
    budget: "≥ 0.9 ×",
    met: ratio >= 0.9 && results.ours!.errors + results.ours!.non2xx === 0,
  });
  log(`teams: ours ${JSON.stringify(results.ours)} bare ${JSON.stringify(results.bare)}`);
}

// --- start-up ---------------------------------------------------------------------------------
async function startup(connector: string): Promise<void> {
  const times: Record<string, number[]> = { ours: [], bare: [] };
  for (let i = 0; i < (quick ? 3 : 7); i++) {
    for (const [name, script] of [
      ["bare", "bench/bare/bolt.mjs"],
      ["ours", "dist/main.js"],
    ] as const) {
      const p = port();
      const { child, ms } = await start(
        process.execPath,
        [script],
        slackEnv(p, connector),
        /"event":"ready"/,
      );
      times[name]!.push(ms);
      await stop(child);
    }
  }
  const ours = median(times.ours!);
  const bare = median(times.bare!);
  rows.push({
    what: "start-up",
    measure: "process start to ready (Slack over HTTP), median of runs",
    ours: `${Math.round(ours)} ms`,
    reference: `bare Bolt: ${Math.round(bare)} ms`,
    ratio: `${(ours / bare).toFixed(2)} ×`,
    budget: "≤ 1.3 ×",
    met: ours / bare <= 1.3,
  });
  log(`startup: ours ${times.ours!.map(Math.round)} bare ${times.bare!.map(Math.round)}`);
}

// --- first reply ------------------------------------------------------------------------------
/**
 * Ready means ready: the first answer after /readyz turns 200 against warm ones from the same
 * process. Each round starts the production build, waits for /readyz, times one signed command
 * (answered in the response), then 30 more; the row compares the median first with the median
 * warm answer over the rounds.
 */
async function firstReply(connector: string): Promise<void> {
  const firsts: number[] = [];
  const warm: number[] = [];
  for (let round = 0; round < (quick ? 3 : 7); round++) {
    const p = port();
    const { child } = await start(
      process.execPath,
      ["dist/main.js"],
      slackEnv(p, connector),
      /"event":"ready"/,
    );
    try {
      const base = `http://127.0.0.1:${p}`;
      while ((await fetch(`${base}/readyz`)).status !== 200) await new Promise((r) => setTimeout(r, 5));
      const shot = slackCommand(connector);
      const timed = async () => {
        const { body, headers } = shot();
        const t = performance.now();
        const res = await fetch(`${base}/slack/events`, { method: "POST", body, headers });
        const text = await res.text();
        if (res.status !== 200 || !text.includes("gap")) throw new Error(`first reply: ${res.status}`);
        return performance.now() - t;
      };
      firsts.push(await timed());
      for (let i = 0; i < 30; i++) warm.push(await timed());
    } finally {
      await stop(child);
    }
  }
  const first = median(firsts);
  const steady = median(warm);
  rows.push({
    what: "first reply",
    measure:
      "first signed command answered after /readyz is 200, against warm answers (Slack over HTTP), medians of runs",
    ours: `${first.toFixed(1)} ms`,
    reference: `warm: ${steady.toFixed(1)} ms`,
    ratio: `${(first / steady).toFixed(2)} ×`,
    budget: "≤ 1.0 × (no longer than a warm one)",
    met: first <= steady,
  });
  log(`first reply: ${firsts.map((t) => t.toFixed(1)).join(" ")} ms; warm median ${steady.toFixed(1)} ms`);
}

// --- chart ------------------------------------------------------------------------------------
async function chart(): Promise<void> {
  const { firstMs, warmMs, bytes } = JSON.parse(await helper("chart")) as {
    firstMs: number;
    warmMs: number;
    bytes: number;
  };
  rows.push({
    what: "chart",
    measure:
      "a two-day sodium course drawn to SVG and a greyscale PNG (d3, resvg), median of 40 warm; the first includes loading the chart code",
    ours: `${warmMs.toFixed(1)} ms warm, ${bytes.toLocaleString("en")} bytes`,
    reference: `first: ${firstMs.toFixed(0)} ms`,
    ratio: "—",
    budget: "≤ 50 ms warm",
    met: warmMs <= 50,
  });
  log(`chart: first ${firstMs.toFixed(1)} ms, warm ${warmMs.toFixed(1)} ms, ${bytes} bytes`);
}

// --- memory -----------------------------------------------------------------------------------
async function memory(): Promise<void> {
  const out = await helper("memory");
  const { samples } = JSON.parse(out) as { samples: { messages: number; rssMb: number }[] };
  const last = samples.at(-1)!;
  const second = samples[1]!;
  const growth = (last.rssMb - second.rssMb) / second.rssMb;
  rows.push({
    what: "memory",
    measure: "resident memory after 100,000 messages (memory store); growth from 20,000 to 100,000",
    ours: `${last.rssMb.toFixed(0)} MB, ${(growth * 100).toFixed(1)} % growth`,
    reference: "—",
    ratio: "—",
    budget: "≤ 150 MB, flat (≤ 10 % growth)",
    met: last.rssMb <= 150 && growth <= 0.1,
  });
  log(`memory: ${samples.map((s) => s.rssMb.toFixed(0)).join(" ")} MB`);
}

// --- handover ---------------------------------------------------------------------------------
/** The first view's budgets over the invented messages of bench/corpus.ts (also a unit test). */
async function replies(): Promise<void> {
  const { MemoryStore } = await import("../adapters/store/memory.js");
  const { Conversation } = await import("../bot/conversation.js");
  const { loadConfig } = await import("../bot/config.js");
  const { renderText, FIRST_VIEW } = await import("../bot/text.js");
  const { render } = await import("../adapters/slack/render.js");
  const { BUDGET_MESSAGES } = await import("./corpus.js");
  await loadUnits();
  const bot = new Conversation(new MemoryStore(), loadConfig({ SOLUTE_SECRET: "solute-secret-0123456789" }));
  let lines = 0;
  let chars = 0;
  let cautions = 0;
  let blocks = 0;
  for (const m of BUDGET_MESSAGES) {
    const reply = await bot.handle({ text: m, channel: "bench", platform: "console" });
    const text = renderText(reply);
    if (reply.kind === "result") {
      lines = Math.max(lines, text.split("\n").length);
      chars = Math.max(chars, text.length);
    }
    cautions = Math.max(cautions, text.split("\n").filter((l) => l.startsWith("⚠")).length);
    const b = render(reply, { source: m, offerPost: true }).blocks;
    const button = b.findIndex((x) => x.type === "actions");
    blocks = Math.max(blocks, button === -1 ? b.length : button);
  }
  rows.push({
    what: "first view",
    measure: `largest over ${BUDGET_MESSAGES.length} invented messages: calculation text lines / characters; caution lines; Slack blocks before the expand button`,
    ours: `${lines} lines, ${chars} chars; ${cautions} cautions; ${blocks} blocks`,
    reference: "—",
    ratio: "—",
    budget: `≤ ${FIRST_VIEW.lines} lines, ≤ ${FIRST_VIEW.characters} chars; ≤ 3; ≤ 8`,
    met: lines <= FIRST_VIEW.lines && chars <= FIRST_VIEW.characters && cautions <= 3 && blocks <= 8,
  });
}

/** The Teams card's height at phone width, rendered by adaptivecards in headless Chromium. */
async function card(): Promise<void> {
  const { measureCards, CARD_BUDGET_PX } = await import("./card.js");
  await loadUnits();
  const measures = await measureCards(!quick && !only);
  const readme = measures?.find((m) => m.name === "README example" && m.width === 360);
  rows.push({
    what: "Teams card",
    measure:
      "README example rendered by adaptivecards in headless Chromium at 360 px wide (screenshots in docs/)",
    ours: readme ? `${readme.height} px tall` : "chromium not installed",
    reference: "—",
    ratio: "—",
    budget: `≤ ${CARD_BUDGET_PX} px`,
    met: readme !== undefined && readme.height <= CARD_BUDGET_PX,
  });
}

async function handover(): Promise<void> {
  await loadUnits();
  const config = loadConfig({ SOLUTE_SECRET: "bench-secret-0123456789" });
  const redis = await startRedis();
  try {
    for (const [name, store] of [
      ["memory", new MemoryStore()],
      ["Redis", new RedisStore(redis.url)],
    ] as const) {
      if (store instanceof RedisStore) await store.connect();
      const bot = new Conversation(store, config);
      const channel = channelKey(config.secret, "slack", "C0HANDOVER");
      const now = Date.now();
      for (let i = 0; i < 10_000; i++) {
        const reading = readMessage(`Na ${120 + (i % 15)} glu 6 mmol/L urea 4 mmol/L osm ${270 + (i % 30)}`);
        await store.addRecord(
          recordOf(channel, `bed ${i % 200}`, now - (10_000 - i) * 1000, assess(reading.inputs)),
          16 * 3_600_000,
        );
      }
      const times: number[] = [];
      for (let k = 0; k < 7; k++) {
        const t = performance.now();
        const reply = await bot.handle({ text: "handover", channel: "C0HANDOVER", platform: "slack" });
        times.push(performance.now() - t);
        if (!reply.headline.includes("200 cases")) throw new Error(`unexpected handover: ${reply.headline}`);
      }
      const ms = median(times);
      rows.push({
        what: `handover (${name})`,
        measure: "summary over 10,000 records in 200 cases, median of 7",
        ours: `${ms.toFixed(1)} ms`,
        reference: "—",
        ratio: "—",
        budget: "≤ 50 ms",
        met: ms <= 50,
      });
      log(`handover ${name}: ${times.map((t) => t.toFixed(1)).join(" ")} ms`);
      await store.close();
    }
  } finally {
    await redis.stop();
  }
}

async function main(): Promise<void> {
  const connectorPort = port();
  const { child: connector } = await start(
    process.execPath,
    ["bench/fake-connector.mjs"],
    { PORT: String(connectorPort) },
    /ready/,
  );
  const connectorUrl = `http://127.0.0.1:${connectorPort}`;
  try {
    if (want("engine")) await engine();
    if (want("startup")) await startup(connectorUrl);
    if (want("first")) await firstReply(connectorUrl);
    if (want("slack")) await slack(connectorUrl);
    if (want("teams")) await teams(connectorUrl);
    if (want("memory")) await memory();
    if (want("handover")) await handover();
    if (want("replies")) await replies();
    if (want("card")) await card();
    if (want("chart")) await chart();
  } finally {
    await stop(connector);
  }
  const cpu = cpus();
  const machine = `${cpu.length} × ${cpu[0]?.model.trim() ?? "unknown CPU"}, ${(totalmem() / 2 ** 30).toFixed(0)} GiB, Node ${process.version}, ${process.platform}`;
  const table = [
    "| what | measure | Solute | reference | ratio | budget | met |",
    "|---|---|---|---|---|---|---|",
    ...rows.map(
      (r) =>
        `| ${r.what} | ${r.measure} | ${r.ours} | ${r.reference} | ${r.ratio} | ${r.budget} | ${r.met ? "yes" : "**no**"} |`,
    ),
  ].join("\n");
  process.stdout.write(`\n${table}\n\nmachine: ${machine}\n`);
  if (!quick && !only) {
    mkdirSync("docs", { recursive: true });
    writeFileSync(
      "docs/benchmarks.md",
      `# Benchmarks\n\nWritten by \`npm run bench\` on ${new Date().toISOString().slice(0, 10)}, on ${machine}.\nServers run from the production build (\`dist/\`) in their own processes; load from autocannon on\n127.0.0.1; ratios compare with bare reference apps (\`bench/bare/\`) measured in the same run.\n\n${table}\n\n${readFileSync("bench/notes.md", "utf8")}`,
    );
  }
  process.exitCode = rows.every((r) => r.met) ? 0 : 1;
}

await main();
