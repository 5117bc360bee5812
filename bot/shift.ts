/**
 * The shift log, shared by the commands that use it (commands/handover.ts, trend.ts, forget.ts and
 * plan.ts): records, episodes, the sodium points of a case and the logging of tagged calculations.
 * A record holds only numbers, a checked case tag, a time and finding codes. Sodium series live
 * for SOLUTE_SERIES_HOURS (at least 48 h), so the 24 h and 48 h limits are judged on whole days;
 * the handover summarises the last SOLUTE_SHIFT_HOURS.
 */
import type { Assessment } from "../core/assess.js";
import { type CorrectionTrend, correctionTrend, type SodiumPoint } from "../core/correction.js";
import { fmt, num, signed } from "../core/format.js";
import { checkTag } from "../core/reader/index.js";
import type { Bot, Context } from "./commands/context.js";
import { errorCode } from "./log.js";
import { emptyReply, type Reply } from "./reply.js";
import type { ResultKey, ShiftRecord } from "./store.js";

const HOUR = 3_600_000;
/** Flags of marker records: a new episode on a reused bed, and a case at high risk. */
export const EPISODE_START = "episode.start";
export const HIGH_RISK = "risk.high";
const DEFAULT_SERIES_MS = 48 * HOUR;

/** Finding codes worth handing over. */
export const HANDOVER_FLAGS: Record<string, string> = {
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

/** A marker record: numbers none, a flag only. */
function marker(channel: string, tag: string, at: number, flag: string): ShiftRecord {
  return { channel, tag, at, inputs: {}, results: {}, flags: [flag] };
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

/** "in 9 h 40 min" — when an open window closes, relative to now. */
function inTime(ms: number): string {
  const text = ago(ms);
  return text === "just now" ? "now" : `in ${text.replace(" ago", "")}`;
}

export interface Episode {
  tag: string;
  records: ShiftRecord[];
  /** When the episode began: its first sodium, or the "new" marker. */
  startedAt?: number;
  highRisk: boolean;
}

/** One case's current episode: the records after its last "new" marker. */
export function episodeOf(records: readonly ShiftRecord[], tag: string): Episode {
  const mine = records.filter((r) => r.tag === tag);
  let startedAt: number | undefined;
  for (const r of mine)
    if (r.flags.includes(EPISODE_START) && (startedAt === undefined || r.at > startedAt)) startedAt = r.at;
  // Only what was logged after the marker belongs to the new episode.
  const episode =
    startedAt === undefined
      ? mine
      : mine.filter((r) => r.at > startedAt! && !r.flags.includes(EPISODE_START));
  const firstSodium = episode.find((r) => r.inputs.sodium !== undefined);
  return {
    tag,
    records: episode,
    // It began at its "new" marker, or else at its first sodium (which is hour 0 either way).
    ...((startedAt ?? firstSodium?.at) !== undefined && { startedAt: startedAt ?? firstSodium?.at }),
    highRisk: episode.some((r) => r.flags.includes(HIGH_RISK)),
  };
}

/** The episode's sodiums as the correction model's points, hour 0 at its first sodium. */
export function pointsOf(episode: Episode): { points: SodiumPoint[]; firstAt?: number } {
  const withSodium = episode.records.filter((r) => r.inputs.sodium !== undefined);
  const firstAt = withSodium[0]?.at;
  if (firstAt === undefined) return { points: [] };
  return {
    firstAt,
    points: withSodium.map((r) => ({
      hours: (r.at - firstAt) / HOUR,
      sodium: r.inputs.sodium!,
      ...(r.inputs.glucose !== undefined && { glucose: r.inputs.glucose }),
    })),
  };
}

/** The episode's trend at `now`, with windows that close at clock-free relative times. */
export function episodeTrend(episode: Episode, now: number, highRisk = false): CorrectionTrend | undefined {
  const { points, firstAt } = pointsOf(episode);
  if (firstAt === undefined) return undefined;
  return correctionTrend(points, {
    highRisk: highRisk || episode.highRisk,
    nowHours: (now - firstAt) / HOUR,
    clock: (h) => inTime(firstAt + h * HOUR - now),
  });
}

/** The verdict first: too fast, worsening, or where the open window stands. */
export function trendHeadline(tag: string, t: CorrectionTrend): string {
  const first = t.findings[0];
  const measure = t.measure === "correctedSodium" ? "corrected sodium" : "sodium";
  if (first?.code === "correction.tooFast") {
    const w = t.windows.find((x) => x.exceeded);
    return w
      ? `Too fast: ${tag} ${measure} ${signed((t.direction === "lowering" ? -1 : 1) * w.change)} in hours ${num(w.fromHours)}–${num(w.toHours)} (limit ${w.limit})`
      : `Too fast: ${tag} ${measure} over 48 h`;
  }
  if (first?.code === "correction.worsening")
    return `Worsening: ${tag} ${measure} ${fmt(t.baseline)} → ${fmt(t.points.at(-1)!.sodium)}`;
  const open = t.windows.find((w) => w.open);
  if (open && t.roomLeft) {
    const sign = t.direction === "lowering" ? -1 : 1;
    const sofar = `${signed(sign * open.change)} so far in hours ${num(open.fromHours)}–${num(open.toHours)}`;
    // The verdict first: a window used up, or a rate that would pass the limit, is never "so far".
    if (t.roomLeft.mmol <= 0) return `At the limit: ${tag} ${measure} ${sofar}; no more allowed`;
    const projected = t.projected ? sign * t.projected.atWindowEnd : 0;
    if (projected > open.limit)
      return `On course to be too fast: ${tag} ${measure} ${sofar} (${signed(t.projected!.perHour, 2)} an hour); ${fmt(t.roomLeft.mmol)} more allowed`;
    return `${tag}: ${sofar}; ${fmt(t.roomLeft.mmol)} more allowed`;
  }
  return `${tag}: within the correction limits`;
}

/** The trend as the JSON contract's `trend` object. */
export function trendJson(t: CorrectionTrend) {
  return {
    direction: t.direction,
    measure: t.measure,
    baseline: t.baseline,
    highRisk: t.highRisk,
    points: t.points.map((p) => ({
      hours: p.hours,
      sodium: p.sodium,
      ...(p.glucose !== undefined && { glucose: p.glucose }),
    })),
    windows: t.windows.map(({ fromHours, toHours, change, limit, exceeded, open, start, estimated }) => ({
      fromHours,
      toHours,
      start,
      change,
      limit,
      exceeded,
      open,
      ...(estimated && { estimated }),
    })),
    ...(t.roomLeft && { roomLeft: t.roomLeft }),
    ...(t.projected && { projected: t.projected }),
  };
}

/**
 * Says so when the log starts inside the window being judged: a new deployment, or a store that
 * lost its data (Redis restarted without persistence). Undefined when the whole window is there.
 */
export async function logGap(bot: Bot, ctx: Context, windowStart: number): Promise<string | undefined> {
  let start: number | undefined;
  try {
    start = await bot.store.logStart(ctx.channel);
  } catch {
    return undefined;
  }
  const now = bot.clock();
  if (start === undefined)
    return "This channel's log has no start mark: earlier records may be gone (the store may have been reset).";
  if (start <= windowStart) return undefined;
  return `This channel's log starts ${ago(now - start)}: nothing logged before then is here (a new deployment, or the store was reset without persistence).`;
}

export const unavailable = (what: string): Reply => {
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

export async function load(bot: Bot, ctx: Context): Promise<ShiftRecord[] | undefined> {
  try {
    return await bot.store.listRecords(ctx.channel, bot.clock());
  } catch (error) {
    bot.log("warn", "store.log-unavailable", { code: errorCode(error) });
    return undefined;
  }
}

export const TREND_SHORT =
  "Counts only the sodiums logged or written here: weigh fluids, urine output and symptoms.";
export const TREND_CAUTION =
  "The limits are guidance (European guideline, Spasovski 2014; US panel, Verbalis 2013): recheck against the lab's results, count any sodium not logged here, and weigh urine output, fluids given and symptoms.";

/** The tag named after a command word: "bed 12", "#4B", "bay 4B"; undefined when none was named. */
export function tagIn(text: string): { tag?: string; rest: string; problem?: string } {
  const m = /^\s*(?:(bed|bay|room|cubicle|cube)\s+([A-Za-z0-9-]{1,12})|#([A-Za-z0-9-]{1,12}))(?=\s|$)/i.exec(
    text,
  );
  if (!m) return { rest: text };
  const checked = checkTag(m[2] ?? m[3]!);
  if (!checked.ok) return { rest: text.slice(m[0].length), problem: checked.reason };
  return { tag: (m[1] ? `${m[1].toLowerCase()} ` : "") + checked.tag, rest: text.slice(m[0].length) };
}

/** How long a record lives: the longer of the shift summary and the sodium series. */
export function retentionMs(bot: Bot): number {
  return Math.max(bot.config.shiftMs, bot.config.seriesMs ?? DEFAULT_SERIES_MS);
}

/** Starts a new episode for a reused bed ("bed 12 new"), before anything else is logged for it. */
export async function startEpisode(ctx: Context, bot: Bot, tag: string): Promise<boolean> {
  try {
    await bot.store.addRecord(marker(ctx.channel, tag, bot.clock(), EPISODE_START), retentionMs(bot));
    return true;
  } catch (error) {
    bot.log("warn", "store.log-unavailable", { code: errorCode(error) });
    return false;
  }
}

/** Marks a case as high risk for the rest of its episode. */
export async function markHighRisk(ctx: Context, bot: Bot, tag: string): Promise<void> {
  try {
    await bot.store.addRecord(marker(ctx.channel, tag, bot.clock() - 1, HIGH_RISK), retentionMs(bot));
  } catch (error) {
    bot.log("warn", "store.log-unavailable", { code: errorCode(error) });
  }
}

const NEW_EPISODE = /(^|\s)new(\s+(episode|patient|admission))?(\s|$)/i;

/** After a calculation with a case tag, log it; a store failure is said, never fatal. */
export async function logCalculation(ctx: Context, reply: Reply, bot: Bot): Promise<void> {
  const reading = reply.data?.reading;
  const assessment = reply.data?.assessment;
  if (!reading?.tag) return;
  if (NEW_EPISODE.test(ctx.rest)) {
    const started = await startEpisode(ctx, bot, reading.tag);
    if (started && reading.values.length === 0) {
      // "bed 12 new" on its own: the answer is the new episode, not "no lab values".
      reply.kind = "settings";
      reply.headline = `${reading.tag}: a new episode starts now`;
      reply.problems = reply.problems.filter((p) => p.code !== "input.empty");
      reply.shareable = true;
    }
    reply.notes.push(
      started
        ? `A new episode for ${reading.tag}: earlier sodiums are no longer counted in its trend.`
        : "The shift log is unavailable just now: the new episode could not be started.",
    );
  }
  if (!assessment || Object.keys(assessment.inputs).length === 0) return;
  // A calculation sent with "new" belongs to the new episode: it is logged just after the marker.
  const at = bot.clock() + (NEW_EPISODE.test(ctx.rest) ? 1 : 0);
  try {
    await bot.store.addRecord(recordOf(ctx.channel, reading.tag, at, assessment), retentionMs(bot));
    reply.notes.push(`Logged for the handover under ${reading.tag}.`);
  } catch (error) {
    bot.log("warn", "store.log-unavailable", { code: errorCode(error) });
    reply.notes.push(
      "The shift log is unavailable just now: this calculation was not logged for the handover.",
    );
  }
}
