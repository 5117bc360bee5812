/**
 * The shift log and the commands that use it: handover (this channel's shift summary by case tag),
 * trend (one case's sodium course, judged by the correction model in core/correction.ts — from
 * the log or from a series written in the message) and forget (one case, or the whole log).
 * A record holds only numbers, a checked case tag, a time and finding codes. Sodium series live
 * for SOLUTE_SERIES_HOURS (at least 48 h), so the 24 h and 48 h limits are judged on whole days;
 * the handover summarises the last SOLUTE_SHIFT_HOURS.
 */
import type { Assessment } from "../core/assess.js";
import { CAUTIONS, SHORT_CAUTIONS } from "../core/cautions.js";
import { type CorrectionTrend, correctionTrend, type SodiumPoint } from "../core/correction.js";
import { fmt, num, signed } from "../core/format.js";
import { checkTag } from "../core/reader/index.js";
import { clockAt, readSeries } from "../core/series.js";
import type { Context, Conversation } from "./conversation.js";
import { errorCode, log } from "./log.js";
import { emptyReply, type Reply } from "./reply.js";
import type { ResultKey, ShiftRecord } from "./store.js";

const HOUR = 3_600_000;
/** Flags of marker records: a new episode on a reused bed, and a case at high risk. */
export const EPISODE_START = "episode.start";
export const HIGH_RISK = "risk.high";
const DEFAULT_SERIES_MS = 48 * HOUR;

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
  if (open && t.roomLeft)
    return `${tag}: ${signed((t.direction === "lowering" ? -1 : 1) * open.change)} so far in hours ${num(open.fromHours)}–${num(open.toHours)}; ${fmt(t.roomLeft.mmol)} more allowed`;
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
    windows: t.windows.map(({ fromHours, toHours, change, limit, exceeded, open, start }) => ({
      fromHours,
      toHours,
      start,
      change,
      limit,
      exceeded,
      open,
    })),
    ...(t.roomLeft && { roomLeft: t.roomLeft }),
    ...(t.projected && { projected: t.projected }),
  };
}

/**
 * Says so when the log starts inside the window being judged: a new deployment, or a store that
 * lost its data (Redis restarted without persistence). Undefined when the whole window is there.
 */
async function logGap(bot: Conversation, ctx: Context, windowStart: number): Promise<string | undefined> {
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

const TREND_SHORT =
  "Counts only the sodiums logged or written here: weigh fluids, urine output and symptoms.";
const TREND_CAUTION =
  "The limits are guidance (European guideline, Spasovski 2014; US panel, Verbalis 2013): recheck against the lab's results, count any sodium not logged here, and weigh urine output, fluids given and symptoms.";

export async function handover(ctx: Context, bot: Conversation): Promise<Reply> {
  // "handover bed 12": that case only, with the chart of its sodium course.
  const { tag: only, problem } = tagIn(ctx.rest);
  if (problem) {
    const reply = emptyReply("handover", "Which case?");
    reply.problems.push({ code: "tag.refused", message: problem });
    return reply;
  }
  const records = await load(bot, ctx);
  if (!records) return unavailable("handover");
  const now = bot.clock();
  const shiftFrom = now - bot.config.shiftMs;
  const tags = [...new Set(records.filter((r) => r.at >= shiftFrom).map((r) => r.tag))]
    .filter((t) => only === undefined || t === only)
    .sort((a, b) => a.localeCompare(b, "en", { numeric: true }));
  const hours = Math.round(bot.config.shiftMs / HOUR);
  if (tags.length === 0 && only !== undefined) {
    const reply = emptyReply("handover", `Handover: nothing logged for ${only} in the last ${hours} h`);
    reply.shareable = true;
    return reply;
  }
  const calculations = records.filter((r) => r.at >= shiftFrom && Object.keys(r.inputs).length > 0).length;
  if (tags.length === 0) {
    const reply = emptyReply("handover", `Handover: nothing logged in this channel in the last ${hours} h`);
    reply.notes.push(
      "Calculations are logged when the message carries a bed or bay tag, like: bed 12 Na 121 glu 6.2 mmol/L urea 3.1 mmol/L osm 254.",
    );
    reply.shareable = true;
    return reply;
  }
  const reply = emptyReply(
    "handover",
    `Handover: ${tags.length} case${tags.length === 1 ? "" : "s"}, ${calculations} calculation${calculations === 1 ? "" : "s"} in the last ${hours} h`,
  );
  const dangers: string[] = [];
  for (const tag of tags) {
    const episode = episodeOf(records, tag);
    const list = episode.records.filter((r) => Object.keys(r.inputs).length > 0);
    const last = list.at(-1);
    if (!last) continue;
    const parts: string[] = [];
    const i = last.inputs;
    const r = last.results;
    if (i.sodium !== undefined) parts.push(`Na ${num(i.sodium)}`);
    if (r.calculatedOsmolality !== undefined) parts.push(`calculated osm ${fmt(r.calculatedOsmolality)}`);
    if (r.effectiveOsmolality !== undefined) parts.push(`effective ${fmt(r.effectiveOsmolality)}`);
    if (r.osmolalGap !== undefined) parts.push(`gap ${fmt(r.osmolalGap)}`);
    if (r.correctedSodiumKatz !== undefined)
      parts.push(
        `corrected Na ${fmt(r.correctedSodiumKatz)} (Katz), ${fmt(r.correctedSodiumHillier ?? r.correctedSodiumKatz)} (Hillier)`,
      );
    const began = episode.startedAt !== undefined ? `, episode began ${ago(now - episode.startedAt)}` : "";
    reply.facts.push({
      label: `${tag} (${list.length}, latest ${ago(now - last.at)}${began})`,
      value: parts.join(" · ") || "no results",
    });
    const flags = [...new Set(list.flatMap((x) => x.flags))].map((f) => HANDOVER_FLAGS[f]).filter(Boolean);
    if (flags.length > 0) reply.interpretation.push(`${tag}: ${flags.join("; ")}.`);
    const trend = episodeTrend(episode, now);
    if (trend && only !== undefined) reply.charts = [{ tag, trend }];
    if (trend) {
      const series = trend.points.map((p) => num(p.sodium)).join(" → ");
      const verdict = trend.findings[0];
      reply.interpretation.push(`${tag}: Na ${series}. ${verdict ? verdict.text : ""}`.trim());
      if (verdict && verdict.severity === "danger")
        dangers.push(
          `${tag}: ${verdict.code === "correction.tooFast" ? "correction too fast" : "sodium worsening"}`,
        );
    }
  }
  if (dangers.length > 0) reply.headline = `Handover — ${dangers.join("; ")}. ${reply.headline}`;
  const gone = await logGap(bot, ctx, shiftFrom);
  if (gone) reply.problems.push({ code: "store.logReset", message: gone });
  reply.notes.push(
    "forget bed 12 clears one case; forget clears this channel's log. Records clear themselves.",
  );
  reply.cautions = [TREND_CAUTION, CAUTIONS.general];
  reply.shareable = true;
  return reply;
}

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

const RISK_WORDS =
  /\bhigh[-\s]?risk\b|\balcohol(?:\s*use)?\b|\bmalnutrition\b|\bmalnourished\b|\bliver disease\b|\bcirrhosis\b|\bhypokal(?:a)?emia\b/i;

export async function trend(ctx: Context, bot: Conversation): Promise<Reply> {
  const { tag, rest, problem } = tagIn(ctx.rest);
  const highRisk = RISK_WORDS.test(rest);
  const series = readSeries(rest, ctx.unitSystem ? { unitSystem: ctx.unitSystem } : {});
  let t: CorrectionTrend | undefined;
  let source: string;
  let shownName: string | undefined;
  let logNote: string | undefined;
  if (series.timed || series.problems.length > 0) {
    // A series written in the message: answered exactly as a logged one.
    if (series.points.length < 2) {
      const reply = emptyReply("trend", "Trend: the series could not be read");
      reply.problems.push(...series.problems.map(({ code, message }) => ({ code, message })));
      if (series.problems.length === 0)
        reply.problems.push({
          code: "trend.tooFew",
          message:
            "Give at least two sodiums, each with its time, like: trend Na 118 at 22:00, 121 at 04:00.",
        });
      return reply;
    }
    const firstClock = series.firstClock;
    t = correctionTrend(series.points, {
      highRisk,
      ...(firstClock !== undefined && { clock: (h: number) => clockAt(firstClock, h) }),
    });
    source = "as written in the message";
  } else {
    let name = tag;
    let refused = problem;
    const word = rest.trim();
    if (!name && word && !/\s/.test(word)) {
      const checked = checkTag(word.replace(/^#/, ""));
      if (checked.ok) name = checked.tag;
      else refused = checked.reason;
    }
    if (!name) {
      const reply = emptyReply("trend", "Which case? Name its tag, or write the series");
      reply.problems.push({
        code: "trend.noTag",
        message: `Write the tag, like trend bed 12 — or the series itself: trend Na 118 at 22:00, 121 at 04:00, 126 at 09:30.${refused ? ` ${refused}` : ""}`,
      });
      return reply;
    }
    const records = await load(bot, ctx);
    if (!records) return unavailable("trend");
    const episode = episodeOf(records, name);
    t = episodeTrend(episode, bot.clock(), highRisk);
    const gone = t ? await logGap(bot, ctx, bot.clock() - bot.config.shiftMs) : undefined;
    if (gone) logNote = gone;
    source =
      episode.startedAt !== undefined
        ? `logged for ${name}, episode began ${ago(bot.clock() - episode.startedAt)}`
        : `logged for ${name}`;
    if (!t) {
      const reply = emptyReply("trend", `Trend for ${name}: fewer than two sodiums logged in this episode`);
      reply.notes.push(
        `Log sodiums with the tag, like: ${name} Na 121 — or write the series: trend Na 118 at 22:00, 121 at 04:00.`,
      );
      return reply;
    }
    shownName = name;
  }
  const name = tag ?? shownName ?? "this series";
  const reply = emptyReply("trend", trendHeadline(name, t!));
  for (const p of t!.points) {
    const corrected = p.corrected
      ? ` · corrected ${fmt(p.corrected.katz)} (Katz), ${fmt(p.corrected.hillier)} (Hillier)`
      : "";
    reply.facts.push({ label: `hour ${num(p.hours, 1)}`, value: `Na ${num(p.sodium)} mmol/L${corrected}` });
  }
  reply.interpretation.push(...t!.findings.map((f) => f.text));
  if (t!.highRisk && t!.direction === "raising")
    reply.notes.push("High risk of osmotic demyelination: the 8 mmol/L limit applies in every 24 h.");
  reply.notes.push(`Series ${source}; windows count from the first sodium (hour 0).`);
  if (logNote) reply.problems.push({ code: "store.logReset", message: logNote });
  reply.cautions = [TREND_CAUTION, CAUTIONS.general];
  reply.visibleCautions = [TREND_SHORT, SHORT_CAUTIONS.general];
  reply.why = t!.findings.slice(0, 3).map((f) =>
    f.text
      .split(/(?<=\.)\s+(?=[A-Z])/)
      .slice(0, 2)
      .join(" "),
  );
  reply.shareable = true;
  reply.data = { trend: t! };
  reply.charts = [{ tag: name, trend: t! }];
  return reply;
}

export async function forget(ctx: Context, bot: Conversation): Promise<Reply> {
  const { tag, problem } = tagIn(ctx.rest);
  if (problem) {
    const reply = emptyReply("forget", "Which case?");
    reply.problems.push({ code: "tag.refused", message: problem });
    return reply;
  }
  try {
    if (tag) {
      const n = await bot.store.forgetTag(ctx.channel, tag);
      const reply = emptyReply(
        "forget",
        `${tag} cleared: ${n} record${n === 1 ? "" : "s"} removed; the rest of the log is kept.`,
      );
      reply.shareable = true;
      return reply;
    }
    // The whole log goes only when confirmed: "forget all", or the button's confirm dialog.
    if (!/^\s*(all|everything|confirm|yes)\b/i.test(ctx.rest)) {
      const records = await bot.store.listRecords(ctx.channel, bot.clock());
      const cases = new Set(records.map((r) => r.tag)).size;
      const reply = emptyReply(
        "forget",
        `Clear this channel's whole shift log? ${records.length} record${records.length === 1 ? "" : "s"} of ${cases} case${cases === 1 ? "" : "s"}.`,
      );
      reply.why = [
        "Type forget all to clear it (the channel is told, without naming you), or forget bed 12 to remove one case.",
      ];
      reply.confirm = true;
      return reply;
    }
    const n = await bot.store.forget(ctx.channel);
    const reply = emptyReply(
      "forget",
      `This channel's shift log was cleared: ${n} record${n === 1 ? "" : "s"} removed.`,
    );
    reply.shareable = true;
    reply.announce = true;
    return reply;
  } catch (error) {
    log("warn", "store.forget-failed", { code: errorCode(error) });
    return unavailable("log clearing");
  }
}

/** How long a record lives: the longer of the shift summary and the sodium series. */
export function retentionMs(bot: Conversation): number {
  return Math.max(bot.config.shiftMs, bot.config.seriesMs ?? DEFAULT_SERIES_MS);
}

/** Starts a new episode for a reused bed ("bed 12 new"), before anything else is logged for it. */
export async function startEpisode(ctx: Context, bot: Conversation, tag: string): Promise<boolean> {
  try {
    await bot.store.addRecord(marker(ctx.channel, tag, bot.clock(), EPISODE_START), retentionMs(bot));
    return true;
  } catch (error) {
    log("warn", "store.log-unavailable", { code: errorCode(error) });
    return false;
  }
}

/** Marks a case as high risk for the rest of its episode. */
export async function markHighRisk(ctx: Context, bot: Conversation, tag: string): Promise<void> {
  try {
    await bot.store.addRecord(marker(ctx.channel, tag, bot.clock() - 1, HIGH_RISK), retentionMs(bot));
  } catch (error) {
    log("warn", "store.log-unavailable", { code: errorCode(error) });
  }
}

const NEW_EPISODE = /(^|\s)new(\s+(episode|patient|admission))?(\s|$)/i;

/** After a calculation with a case tag, log it; a store failure is said, never fatal. */
export async function logCalculation(ctx: Context, reply: Reply, bot: Conversation): Promise<void> {
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
