/**
 * The shift log and the commands that use it: handover (this channel's shift summary by case tag),
 * trend (one tag's serial sodiums, checked against correction limits) and forget (clear the log).
 * A record holds only numbers, a checked case tag and a time; it expires after the shift.
 */
import type { Assessment } from "../core/assess.js";
import { CAUTIONS } from "../core/cautions.js";
import { fmt, num, signed } from "../core/format.js";
import { checkTag } from "../core/reader/index.js";
import type { Context, Conversation } from "./conversation.js";
import { errorCode, log } from "./log.js";
import { emptyReply, type Reply } from "./reply.js";
import type { ResultKey, ShiftRecord } from "./store.js";

const HOUR = 3_600_000;
const DAY = 24 * HOUR;
/** Below this span, two sodiums are too close together for a rate to mean anything. */
const MIN_RATE_SPAN = HOUR;

/** Correction limits for raising a low sodium, mmol/L per 24 h (REFERENCES.md §5). */
export const CORRECTION_LIMITS = {
  /** European guideline (Spasovski et al. 2014): at most 10 in the first 24 h, 8 in each 24 h after. */
  standard: 10,
  /** US panel (Verbalis et al. 2013): 8 per 24 h when osmotic-demyelination risk is high. */
  highRisk: 8,
} as const;

/** Finding codes worth handing over. */
const HANDOVER_FLAGS: Record<string, string> = {
  "toxicAlcohol.possible": "toxic alcohol possible",
  "gap.raised": "raised osmolal gap",
  "gap.dependsOnEthanolFactor": "gap raised or not depending on the ethanol factor",
  "pattern.earlyAlcohol": "high osmolal gap with a normal anion gap",
  "pattern.bothRaised": "both gaps raised",
  "dka.met": "DKA criteria met",
  "dka.undecided": "acidosis with high glucose, ketones not given",
  "hhs.met": "HHS criteria met",
  "dkaHhs.mixed": "mixed DKA and HHS",
  "critical.sodium.low": "critical low sodium",
  "critical.sodium.high": "critical high sodium",
  "critical.glucose.low": "critical low glucose",
  "critical.glucose.high": "critical high glucose",
  "critical.potassium.low": "critical low potassium",
  "critical.potassium.high": "critical high potassium",
  "hyponatraemia.hypotonic": "hypotonic hyponatraemia",
  "pseudohyponatraemia.possible": "possible pseudohyponatraemia",
};

export function recordOf(channel: string, tag: string, at: number, a: Assessment): ShiftRecord {
  const r = a.results;
  const results: Partial<Record<ResultKey, number>> = {};
  if (r.calculatedOsmolality) results.calculatedOsmolality = r.calculatedOsmolality.value;
  if (r.effectiveOsmolality) results.effectiveOsmolality = r.effectiveOsmolality.value;
  if (r.osmolalGap) results.osmolalGap = r.osmolalGap.value;
  if (r.anionGap) results.anionGap = r.anionGap.value;
  if (r.correctedSodium) {
    results.correctedSodiumKatz = r.correctedSodium.katz.value;
    results.correctedSodiumHillier = r.correctedSodium.hillier.value;
  }
  const flags = a.findings
    .map((f) => (f.code === "critical.value" && f.subject ? `critical.${f.subject}` : f.code))
    .filter((c) => c in HANDOVER_FLAGS);
  return { channel, tag, at, inputs: { ...a.inputs }, results, flags };
}

/** "3 h 20 min ago" — times are shown relative, never as dates. */
export function ago(ms: number): string {
  const minutes = Math.max(0, Math.round(ms / 60_000));
  if (minutes < 1) return "just now";
  if (minutes < 60) return `${minutes} min ago`;
  const h = Math.floor(minutes / 60);
  const m = minutes % 60;
  return m === 0 ? `${h} h ago` : `${h} h ${m} min ago`;
}

export interface SodiumTrend {
  points: { at: number; sodium: number }[];
  /** Change over the last 24 h (or the whole span, if shorter), mmol/L. */
  change: number;
  spanMs: number;
  /** mmol/L per hour over that span; undefined when the span is under an hour. */
  perHour?: number;
  warnings: string[];
}

/** The serial sodium trend of one tag's records, checked against the correction limits. */
export function sodiumTrend(records: ShiftRecord[]): SodiumTrend | undefined {
  const points = records
    .filter((r) => r.inputs.sodium !== undefined)
    .map((r) => ({ at: r.at, sodium: r.inputs.sodium! }));
  if (points.length < 2) return undefined;
  const last = points.at(-1)!;
  // Baseline: the latest value at least 24 h before the last, else the earliest one.
  const before = points.filter((p) => p.at <= last.at - DAY).at(-1);
  const base = before ?? points[0]!;
  const spanMs = last.at - base.at;
  const change = last.sodium - base.sodium;
  const perHour = spanMs >= MIN_RATE_SPAN ? change / (spanMs / HOUR) : undefined;
  const warnings: string[] = [];
  if (change > 0) {
    const within = spanMs <= DAY ? `in ${fmt(spanMs / HOUR)} h` : "over 24 h";
    if (change > CORRECTION_LIMITS.standard) {
      warnings.push(
        `Sodium rose ${signed(change)} mmol/L ${within}: above the 10 mmol/L limit for the first 24 h (European guideline, Spasovski 2014; the US panel allows 10–12) — correcting too fast risks osmotic demyelination.`,
      );
    } else if (change > CORRECTION_LIMITS.highRisk) {
      warnings.push(
        `Sodium rose ${signed(change)} mmol/L ${within}: above the 8 mmol/L limit for patients at high risk of osmotic demyelination (Na ≤ 105, hypokalaemia, alcohol use disorder, malnutrition, liver disease; Verbalis 2013).`,
      );
    }
    if (perHour !== undefined && spanMs < DAY) {
      const projected = perHour * 24;
      if (projected > CORRECTION_LIMITS.highRisk && warnings.length === 0) {
        warnings.push(
          `At this rate (${signed(perHour, 2)} mmol/L per hour) 24 h would bring ${signed(projected)} mmol/L: above the 8 mmol/L high-risk limit${projected > CORRECTION_LIMITS.standard ? " and the 10 mmol/L standard limit" : ""}.`,
        );
      }
    }
  }
  return { points, change, spanMs, ...(perHour !== undefined && { perHour }), warnings };
}

function trendLine(trend: SodiumTrend, now: number): string {
  const series = trend.points
    .slice(-6)
    .map((p) => num(p.sodium))
    .join(" → ");
  const rate =
    trend.perHour !== undefined
      ? `, ${signed(trend.perHour, 2)} per hour`
      : " (too close together for a rate)";
  return `Na ${series} (first ${ago(now - trend.points[0]!.at)}): ${signed(trend.change)} mmol/L over ${fmt(trend.spanMs / HOUR)} h${rate}`;
}

const unavailable = (what: string): Reply => {
  const reply = emptyReply(
    "handover",
    `The shift log is unavailable just now, so the ${what} cannot be shown`,
  );
  reply.problems.push({
    code: "store.unavailable",
    message: "The shift log's store is not answering. Calculations still work; try again shortly.",
  });
  return reply;
};

async function load(bot: Conversation, ctx: Context): Promise<ShiftRecord[] | undefined> {
  try {
    return await bot.store.listRecords(ctx.channel, bot.clock());
  } catch (error) {
    log("warn", "store.log-unavailable", { code: errorCode(error) });
    return undefined;
  }
}

export async function handover(ctx: Context, bot: Conversation): Promise<Reply> {
  const records = await load(bot, ctx);
  if (!records) return unavailable("handover");
  const now = bot.clock();
  const byTag = new Map<string, ShiftRecord[]>();
  for (const r of records) {
    const list = byTag.get(r.tag);
    if (list) list.push(r);
    else byTag.set(r.tag, [r]);
  }
  const hours = Math.round(bot.config.shiftMs / HOUR);
  if (byTag.size === 0) {
    const reply = emptyReply("handover", `Handover: nothing logged in this channel in the last ${hours} h`);
    reply.notes.push(
      "Calculations are logged when the message carries a bed or bay tag, like: bed 12 Na 121 glu 6.2 mmol/L urea 3.1 mmol/L osm 254.",
    );
    reply.shareable = true;
    return reply;
  }
  const reply = emptyReply(
    "handover",
    `Handover: ${byTag.size} case${byTag.size === 1 ? "" : "s"}, ${records.length} calculation${records.length === 1 ? "" : "s"} in the last ${hours} h`,
  );
  const tags = [...byTag.keys()].sort((a, b) => a.localeCompare(b, "en", { numeric: true }));
  for (const tag of tags) {
    const list = byTag.get(tag)!;
    const last = list.at(-1)!;
    const parts: string[] = [];
    const i = last.inputs;
    const r = last.results;
    if (i.sodium !== undefined) parts.push(`Na ${num(i.sodium)}`);
    if (r.calculatedOsmolality !== undefined) parts.push(`calculated osm ${fmt(r.calculatedOsmolality)}`);
    if (r.effectiveOsmolality !== undefined) parts.push(`effective ${fmt(r.effectiveOsmolality)}`);
    if (r.osmolalGap !== undefined) parts.push(`gap ${fmt(r.osmolalGap)}`);
    if (r.correctedSodiumKatz !== undefined)
      parts.push(
        `corrected Na ${fmt(r.correctedSodiumKatz)}–${fmt(r.correctedSodiumHillier ?? r.correctedSodiumKatz)}`,
      );
    const flags = [...new Set(list.flatMap((x) => x.flags))].map((f) => HANDOVER_FLAGS[f]).filter(Boolean);
    reply.facts.push({
      label: `${tag} (${list.length}, latest ${ago(now - last.at)})`,
      value: parts.join(" · ") || "no results",
    });
    if (flags.length > 0) reply.interpretation.push(`${tag}: ${flags.join("; ")}.`);
    const trend = sodiumTrend(list);
    if (trend) {
      reply.interpretation.push(`${tag}: ${trendLine(trend, now)}.`);
      for (const w of trend.warnings) reply.interpretation.push(`${tag}: ${w}`);
    }
  }
  reply.notes.push("Type forget to clear this channel's log now; it clears itself after the shift.");
  reply.cautions = [CAUTIONS.general];
  reply.shareable = true;
  return reply;
}

export async function trend(ctx: Context, bot: Conversation): Promise<Reply> {
  const code = ctx.rest.replace(/^#/, "").trim();
  const words = code.split(/\s+/);
  const prefix = ["bed", "bay", "room", "cubicle", "cube"].includes((words[0] ?? "").toLowerCase())
    ? `${words[0]!.toLowerCase()} `
    : "";
  const checked = checkTag(prefix ? (words[1] ?? "") : (words[0] ?? ""));
  if (!code || !checked.ok) {
    const reply = emptyReply("trend", "Which case? Name its tag");
    reply.problems.push({
      code: "trend.noTag",
      message: `Write the tag, like: trend bed 12 or trend #4B.${checked.ok ? "" : ` ${checked.reason}`}`,
    });
    return reply;
  }
  const tag = prefix + checked.tag;
  const records = await load(bot, ctx);
  if (!records) return unavailable("trend");
  const list = records.filter((r) => r.tag === tag);
  const t = sodiumTrend(list);
  const now = bot.clock();
  if (!t) {
    const reply = emptyReply("trend", `Trend for ${tag}: fewer than two sodiums logged this shift`);
    reply.notes.push(`Log sodiums with the tag, like: ${tag} Na 121.`);
    return reply;
  }
  const reply = emptyReply(
    "trend",
    `Sodium trend for ${tag}: ${signed(t.change)} mmol/L over ${fmt(t.spanMs / HOUR)} h`,
  );
  for (const p of t.points) reply.facts.push({ label: ago(now - p.at), value: `Na ${num(p.sodium)} mmol/L` });
  reply.interpretation.push(trendLine(t, now), ...t.warnings);
  if (t.warnings.length === 0 && t.change > 0) {
    reply.interpretation.push(
      `Within the correction limits so far (8 mmol/L per 24 h at high risk, 10 in the first 24 h otherwise).`,
    );
  }
  if (t.change < 0)
    reply.interpretation.push(
      "The limits above are for raising a low sodium; for a falling sodium follow your local protocol.",
    );
  reply.cautions = [
    "Serial sodiums show only what was logged here: recheck against the lab's results, count any not logged, and consider urine output and fluids given.",
    CAUTIONS.general,
  ];
  reply.shareable = true;
  return reply;
}

export async function forget(ctx: Context, bot: Conversation): Promise<Reply> {
  try {
    const n = await bot.store.forget(ctx.channel);
    const reply = emptyReply(
      "forget",
      `Shift log cleared: ${n} record${n === 1 ? "" : "s"} removed from this channel's log.`,
    );
    reply.shareable = true;
    return reply;
  } catch (error) {
    log("warn", "store.forget-failed", { code: errorCode(error) });
    return unavailable("log clearing");
  }
}

/** After a calculation with a case tag, log it; a store failure is said, never fatal. */
export async function logCalculation(ctx: Context, reply: Reply, bot: Conversation): Promise<void> {
  const reading = reply.data?.reading;
  const assessment = reply.data?.assessment;
  if (!reading?.tag || !assessment || Object.keys(assessment.inputs).length === 0) return;
  try {
    await bot.store.addRecord(
      recordOf(ctx.channel, reading.tag, bot.clock(), assessment),
      bot.config.shiftMs,
    );
    reply.notes.push(`Logged for the handover under ${reading.tag}.`);
  } catch (error) {
    log("warn", "store.log-unavailable", { code: errorCode(error) });
    reply.notes.push(
      "The shift log is unavailable just now: this calculation was not logged for the handover.",
    );
  }
}

export function registerShiftCommands(bot: Conversation): void {
  bot.command(["handover", "handoff"], handover);
  bot.command(["trend"], trend);
  bot.command(["forget"], forget);
  bot.afterCalculation.push((ctx, reply) => logCalculation(ctx, reply, bot));
}
