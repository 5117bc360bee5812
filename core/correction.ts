/**
 * The sodium correction model that trend, plan and handover all use (REFERENCES §5). Pure and
 * clock-free: callers pass hours from the start of the episode.
 *
 * - An episode is one case's series of sodiums from its first value (hour 0).
 * - Windows count from hour 0: 0–24, 24–48, …; each is judged on the highest value reached in it
 *   (when raising) or the lowest (when lowering), against the sodium at its start — measured
 *   there, or interpolated between the values either side [D].
 * - Raising a low sodium: ≤ 10 mmol/L in the first 24 h, ≤ 8 in each 24 h after, so ≤ 18 over
 *   48 h (Spasovski et al., Eur J Endocrinol 2014 [C]); 8 in any 24 h (16 over 48 h) at high risk
 *   of osmotic demyelination (Verbalis et al. 2013, from memory [M]).
 * - Lowering a high sodium: about 10 mmol/L in 24 h in chronic hypernatraemia (REFERENCES §5,
 *   from memory and common practice [M/P]).
 * - A sodium moving away from normal — falling in hyponatraemia, rising in hypernatraemia — is
 *   worsening: neither within limits nor too fast.
 * - With high glucose, the measured sodium rises as glucose falls: the glucose-corrected sodium
 *   (Katz; Hillier beside it) is then the measure judged.
 */

import type { Finding } from "./findings.js";
import { fmt, num, signed } from "./format.js";

export const WINDOW_HOURS = 24;
/** Raising: Spasovski 2014 [C]. */
export const RAISE_FIRST_DAY = 10;
export const RAISE_EACH_DAY_AFTER = 8;
export const RAISE_TWO_DAYS = 18;
/** Raising at high risk: Verbalis 2013 [M]. */
export const RAISE_HIGH_RISK = 8;
export const RAISE_HIGH_RISK_TWO_DAYS = 16;
/** Lowering a chronic hypernatraemia: about 10 mmol/L in 24 h [M/P]. */
export const LOWER_PER_DAY = 10;
/** Sodium below or above which a correction is being made, mmol/L [common practice]. */
export const SODIUM_LOW = 135;
export const SODIUM_HIGH = 145;
/** Glucose from which the corrected sodium is the measure judged: 11.1 mmol/L (200 mg/dL) [P]. */
export const GLUCOSE_CORRECTS = 11.1;
/** Katz's and Hillier's factors per mmol/L of glucose above 5.55 (REFERENCES §4 [D]). */
const KATZ_PER_MMOL = 0.288;
const HILLIER_PER_MMOL = 0.432;
const GLUCOSE_BASELINE = 5.55;
/** A change smaller than this is lab noise, not a direction [common practice]. */
const NOISE = 1;

export interface SodiumPoint {
  /** Hours from the episode's first sodium. */
  hours: number;
  sodium: number;
  /** mmol/L, when it was measured with the sodium. */
  glucose?: number;
}

export interface CorrectionWindow {
  fromHours: number;
  toHours: number;
  /** The measure at the window's start, and the largest change from it within the window. */
  start: number;
  change: number;
  limit: number;
  exceeded: boolean;
  /** The window has not ended at the last value (or at now). */
  open: boolean;
  /** The change was reached at the window's end, read off the line between the values either side. */
  estimated?: true;
}

export interface CorrectionTrend {
  direction: "raising" | "lowering" | "none";
  /** What the limits are judged on. */
  measure: "sodium" | "correctedSodium";
  baseline: number;
  points: (SodiumPoint & { corrected?: { katz: number; hillier: number }; effective?: number })[];
  windows: CorrectionWindow[];
  /** In the open window: how much more the limit allows, and until which hour. */
  roomLeft?: { mmol: number; untilHours: number };
  /** A rate from the open window's start, projected to its end: a projection, not a change. */
  projected?: { perHour: number; atWindowEnd: number };
  highRisk: boolean;
  /** Hours from the first value to now (the last value, unless the caller said when now is). */
  nowHours: number;
  findings: Finding[];
}

export interface TrendOptions {
  highRisk?: boolean;
  /** Hours from the first sodium to now; windows end there at the latest. Defaults to the last point. */
  nowHours?: number;
  /** Formats an hour of the episode as a clock time ("08:00") when the caller knows the clock. */
  clock?: (hours: number) => string;
}

const katz = (p: SodiumPoint) => p.sodium + KATZ_PER_MMOL * Math.max(0, (p.glucose ?? 0) - GLUCOSE_BASELINE);
const hillier = (p: SodiumPoint) =>
  p.sodium + HILLIER_PER_MMOL * Math.max(0, (p.glucose ?? 0) - GLUCOSE_BASELINE);

/** The value of a series at an hour: measured there, or interpolated between its neighbours. */
function valueAt(series: { hours: number; v: number }[], hours: number): number {
  let before = series[0]!;
  for (const p of series) {
    if (p.hours === hours) return p.v;
    if (p.hours < hours) before = p;
    else {
      const span = p.hours - before.hours;
      return span === 0 ? p.v : before.v + ((p.v - before.v) * (hours - before.hours)) / span;
    }
  }
  return before.v;
}

export function correctionTrend(
  input: readonly SodiumPoint[],
  options: TrendOptions = {},
): CorrectionTrend | undefined {
  const points = [...input].sort((a, b) => a.hours - b.hours);
  if (points.length < 2) return undefined;
  const withGlucose = points.some((p) => p.glucose !== undefined && p.glucose >= GLUCOSE_CORRECTS);
  const measure: CorrectionTrend["measure"] = withGlucose ? "correctedSodium" : "sodium";
  const shown = points.map((p) => ({
    ...p,
    ...(p.glucose !== undefined && {
      corrected: { katz: katz(p), hillier: hillier(p) },
      effective: 2 * p.sodium + p.glucose,
    }),
  }));
  const series = points.map((p) => ({ hours: p.hours, v: withGlucose ? katz(p) : p.sodium }));
  const baseline = series[0]!.v;
  const direction: CorrectionTrend["direction"] =
    points[0]!.sodium < SODIUM_LOW ? "raising" : points[0]!.sodium > SODIUM_HIGH ? "lowering" : "none";
  const highRisk = options.highRisk === true || points[0]!.sodium <= 105;
  const last = series.at(-1)!;
  const nowHours = Math.max(options.nowHours ?? last.hours, last.hours);
  const at = (h: number) => (options.clock ? options.clock(h) : `hour ${num(h, 1)}`);
  const what = withGlucose ? "glucose-corrected sodium (Katz)" : "sodium";
  const findings: Finding[] = [];
  const trend: CorrectionTrend = {
    direction,
    measure,
    baseline,
    points: shown,
    windows: [],
    highRisk,
    nowHours,
    findings,
  };

  const worsened =
    direction === "raising"
      ? last.v < baseline - NOISE
      : direction === "lowering"
        ? last.v > baseline + NOISE
        : false;
  if (direction === "none") {
    const leaves = points.at(-1)!.sodium < SODIUM_LOW || points.at(-1)!.sodium > SODIUM_HIGH;
    if (leaves)
      findings.push({
        code: "correction.worsening",
        severity: "danger",
        text: `The ${what} moved from ${fmt(baseline)} to ${fmt(last.v)} over ${num(last.hours, 1)} h: it has left the normal range.`,
      });
    return trend;
  }
  if (worsened) {
    findings.push({
      code: "correction.worsening",
      severity: "danger",
      text:
        direction === "raising"
          ? `Worsening: the ${what} has fallen from ${fmt(baseline)} to ${fmt(last.v)} (${signed(last.v - baseline)} over ${num(last.hours, 1)} h) in a hyponatraemia.`
          : `Worsening: the ${what} has risen from ${fmt(baseline)} to ${fmt(last.v)} (${signed(last.v - baseline)} over ${num(last.hours, 1)} h) in a hypernatraemia.`,
    });
    return trend;
  }

  // Windows from hour 0 to now.
  const sign = direction === "raising" ? 1 : -1;
  const windowCount = Math.max(1, Math.ceil((nowHours === 0 ? 1 : nowHours) / WINDOW_HOURS));
  for (let w = 0; w < windowCount; w++) {
    const from = w * WINDOW_HOURS;
    const to = from + WINDOW_HOURS;
    const start = w === 0 ? baseline : valueAt(series, from);
    const inside = series.filter((p) => p.hours > from && p.hours <= to).map((p) => p.v);
    // A window that ended between two values is judged at its end too, by the same straight line
    // that gives the next window its start: 120 at hour 0 and 131 at hour 30 is +8.8 by hour 24.
    // Without this, a rise measured only either side of hour 24 would count in no window at all.
    const atEnd = last.hours > to ? valueAt(series, to) : undefined;
    const values = atEnd === undefined ? inside : [...inside, atEnd];
    const extreme = values.length === 0 ? start : sign > 0 ? Math.max(...values) : Math.min(...values);
    const change = Math.max(0, sign * (extreme - start));
    const estimated = atEnd !== undefined && extreme === atEnd && !inside.includes(atEnd);
    const limit =
      direction === "lowering"
        ? LOWER_PER_DAY
        : highRisk
          ? RAISE_HIGH_RISK
          : w === 0
            ? RAISE_FIRST_DAY
            : RAISE_EACH_DAY_AFTER;
    trend.windows.push({
      fromHours: from,
      toHours: to,
      start,
      change,
      limit,
      exceeded: change > limit,
      open: nowHours < to,
      ...(estimated && { estimated: true as const }),
    });
  }
  // Over 48 h from the start (raising only): ≤ 18, or 16 at high risk.
  const twoDays = series.filter((p) => p.hours <= 2 * WINDOW_HOURS);
  const twoDayRise = Math.max(...twoDays.map((p) => p.v)) - baseline;
  const twoDayLimit = highRisk ? RAISE_HIGH_RISK_TWO_DAYS : RAISE_TWO_DAYS;
  const twoDayExceeded = direction === "raising" && nowHours > WINDOW_HOURS && twoDayRise > twoDayLimit;

  const verb = direction === "raising" ? "rise" : "fall";
  const riskText = highRisk && direction === "raising" ? " at high risk" : "";
  const exceeded = trend.windows.filter((w) => w.exceeded);
  const why = withGlucose
    ? ` Judged on the glucose-corrected sodium, because the measured sodium rises as glucose falls (Hillier's correction: ${fmt(hillier(points[0]!))} → ${fmt(hillier(points.at(-1)!))}).`
    : "";
  if (exceeded.length > 0 || twoDayExceeded) {
    const w = exceeded[0];
    const where = w
      ? `${signed(sign * w.change)} mmol/L in hours ${num(w.fromHours)}–${num(Math.min(w.toHours, nowHours), 1)}${w.fromHours === 0 ? "" : ` (from ${fmt(w.start)} at hour ${num(w.fromHours)})`}${w.estimated ? ` (at hour ${num(w.toHours)}, on the line between the values either side of it)` : ""}, above the limit of ${w.limit}${riskText}`
      : `${signed(twoDayRise)} mmol/L over 48 h, above ${twoDayLimit}${riskText}`;
    findings.push({
      code: "correction.tooFast",
      severity: "danger",
      text:
        direction === "raising"
          ? `Too fast: the ${what} rose ${where} (European guideline, Spasovski 2014). Stop active correction and discuss re-lowering with a senior or nephrology, per local protocol.${why}`
          : `Too fast: the ${what} fell ${where} (chronic hypernatraemia, about 10 mmol/L in 24 h). Slow the free water and discuss with a senior, per local protocol.`,
    });
    return trend;
  }
  const open = trend.windows.find((w) => w.open);
  const current = trend.windows.at(-1)!;
  const within = findings.length;
  findings.push({
    code: "correction.withinLimits",
    severity: "info",
    text: `Within the correction limits so far: ${trend.windows
      .map(
        (w) =>
          `${signed(sign * w.change)} in hours ${num(w.fromHours)}–${num(Math.min(w.toHours, nowHours), 1)} (limit ${w.limit})`,
      )
      .join("; ")}.${why}`,
  });
  if (open) {
    const room = Math.max(0, current.limit - current.change);
    trend.roomLeft = { mmol: room, untilHours: open.toHours };
    const elapsed = nowHours - open.fromHours;
    const sinceStart = sign * (last.v - open.start);
    let projection = "";
    if (elapsed >= 1 && sinceStart > 0) {
      const perHour = sinceStart / (last.hours - open.fromHours || elapsed);
      const atEnd = perHour * WINDOW_HOURS;
      trend.projected = { perHour: sign * perHour, atWindowEnd: sign * atEnd };
      if (atEnd > open.limit)
        projection = ` At this rate (${signed(sign * perHour, 2)} per hour, a projection) the ${verb} would reach ${fmt(atEnd)} by the end of the window: above the limit.`;
    }
    // A projection above the limit is a warning, and it comes before "within the limits so far".
    findings.splice(projection ? within : findings.length, 0, {
      code: "correction.windowOpen",
      severity: projection ? "warning" : "info",
      text: `${signed(sign * current.change)} so far in hours ${num(open.fromHours)}–${num(open.toHours)}; ${fmt(room)} more allowed until ${at(open.toHours)}.${projection}`,
    });
  }
  return trend;
}

/** The planned change for the current window: what is allowed, and whether a planned change fits. */
export function planFits(
  trend: CorrectionTrend | undefined,
  planned: number,
  highRisk: boolean,
  startSodium: number,
) {
  const direction =
    trend?.direction ??
    (startSodium < SODIUM_LOW ? "raising" : startSodium > SODIUM_HIGH ? "lowering" : "none");
  const open = trend?.windows.find((w) => w.open) ?? trend?.windows.at(-1);
  const sign = direction === "lowering" ? -1 : 1;
  const already = open ? open.change : 0;
  const limit = open
    ? open.limit
    : direction === "lowering"
      ? LOWER_PER_DAY
      : highRisk
        ? RAISE_HIGH_RISK
        : RAISE_FIRST_DAY;
  const total = already + sign * planned;
  return { direction, already, limit, total, fits: total <= limit, room: Math.max(0, limit - already) };
}
