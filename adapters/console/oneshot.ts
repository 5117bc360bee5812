/**
 * One message in, one answer out, for scripts:
 *   npm run -s solute -- [--json] [--units si|conventional] [--working] [--chart FILE] "<message>"
 * Exit 0 when any result was computed, 2 when nothing could be, 1 on a usage error.
 */
import { dirname } from "node:path";
import { parseArgs } from "node:util";
import { ConfigError, loadConfig } from "../../bot/config.js";
import { Conversation } from "../../bot/conversation.js";
import { computedAnything, toJson } from "../../bot/json.js";
import { setQuiet } from "../../bot/log.js";
import type { Store } from "../../bot/store.js";
import { writeCharts } from "./app.js";
import { render } from "./render.js";

const USAGE =
  'usage: npm run -s solute -- [--json] [--units si|conventional] [--working] [--chart FILE] "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310"\n  --chart FILE writes the chart of a trend (trend Na 118 at 22:00, 121 at 04:00) as a PNG';

export async function oneShot(
  argv: string[],
  out: (s: string) => void,
  err: (s: string) => void,
  makeStore: () => Store,
): Promise<number> {
  let parsed: ReturnType<typeof parse>;
  try {
    parsed = parse(argv);
  } catch {
    err(USAGE);
    return 1;
  }
  const { values, positionals } = parsed;
  const units = values.units;
  if (units !== undefined && units !== "si" && units !== "conventional") {
    err(`--units must be si or conventional\n${USAGE}`);
    return 1;
  }
  const message = positionals.join(" ").trim();
  if (!message || values.help) {
    err(USAGE);
    return message ? 0 : 1;
  }
  let config: ReturnType<typeof loadConfig>;
  try {
    config = loadConfig({ ...process.env, SOLUTE_DEFAULT_UNITS: units ?? process.env.SOLUTE_DEFAULT_UNITS });
  } catch (e) {
    err(e instanceof ConfigError ? e.message : USAGE);
    return 1;
  }
  setQuiet(true);
  const bot = new Conversation(makeStore(), config);
  const reply = await bot.handle({
    text: values.working ? `${message} working` : message,
    channel: "one-shot",
    platform: "console",
  });
  out(values.json ? JSON.stringify(toJson(reply), null, 2) : render(reply));
  if (values.chart !== undefined) {
    const lines = await writeCharts(reply, dirname(values.chart), values.chart);
    if (lines.length === 0)
      err("--chart: this answer has no chart (charts come with trend and handover <tag>).");
    // With --json, stdout stays pure JSON: where the chart went is said on stderr.
    for (const line of lines) (values.json ? err : out)(line);
  }
  return computedAnything(reply) ? 0 : 2;
}

function parse(argv: string[]) {
  return parseArgs({
    args: argv,
    allowPositionals: true,
    options: {
      json: { type: "boolean" },
      units: { type: "string" },
      working: { type: "boolean" },
      chart: { type: "string" },
      help: { type: "boolean", short: "h" },
    },
  });
}
