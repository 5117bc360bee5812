/**
 * A sodium series written in one message, for trend: "Na 118 at 22:00, 121 at 04:00, 126 at
 * 09:30", "Na 118 (0 h) 121 (6 h)", or pasted rows with a time each ("22:10 Na 127 glucose 45").
 * Clock times that go backwards roll over midnight in the order written; a time without minutes
 * or am/pm ("at 9"), two values at one time, or clock times mixed with hours are asked about.
 * Each point's values are read by the ordinary reader, so units are never guessed here either.
 */
import type { UnitSystem } from "./analytes.js";
import type { SodiumPoint } from "./correction.js";
import { type Problem, readMessage } from "./reader/index.js";

export interface SeriesReading {
  points: SodiumPoint[];
  /** Minutes after midnight of the first point, when clock times were written. */
  firstClock?: number;
  problems: Problem[];
  /** Whether the message wrote any time at all (else it is not a series). */
  timed: boolean;
}

const CLOCK = /(?:^|[\s(@,])(?:at\s+)?([01]?\d|2[0-3])[:.h]([0-5]\d)\s*(am|pm)?(?=$|[\s),;])/i;
const CLOCK_12 = /(?:^|[\s(@,])(?:at\s+)?(1[0-2]|0?[1-9])\s*(am|pm)(?=$|[\s),;])/i;
const HOURS = /(?:^|[\s(,+])\+?(\d{1,3}(?:[.,]\d{1,2})?)\s*(?:h|hr|hrs|hours?)(?=$|[\s),;])/i;
const BARE_AT = /\bat\s+(\d{1,2})(?=$|[\s),;])/i;
const NAME = /\b(na\+?|sodium|glu\w*|bg|bsl|cbg)\b/i;

const ANY_TIME = new RegExp(`${CLOCK.source}|${CLOCK_12.source}|${HOURS.source}`, "gi");

/**
 * One segment per point: per line, or on one line at commas and semicolons (not decimal commas);
 * a piece with several times splits after each ("Na 118 (0 h) 121 (6 h)"), or before each when it
 * starts with a time ("22:10 Na 127 04:30 Na 131").
 */
function segments(text: string): string[] {
  const lines = text
    .split(/\n/)
    .map((l) => l.trim())
    .filter(Boolean);
  const pieces =
    lines.length > 1
      ? lines
      : (lines[0] ?? "")
          .split(/;|,(?!\d)/)
          .map((s) => s.trim())
          .filter(Boolean);
  const out: string[] = [];
  for (const piece of pieces) {
    const padded = ` ${piece} `;
    const marks = [...padded.matchAll(ANY_TIME)];
    if (marks.length <= 1) {
      out.push(piece);
      continue;
    }
    const timeFirst = marks[0]!.index! <= 1;
    let from = 0;
    for (const m of marks) {
      const cut = timeFirst ? m.index! : m.index! + m[0].length;
      if (timeFirst && cut === 0) continue;
      out.push(padded.slice(from, cut).trim());
      from = cut;
    }
    out.push(padded.slice(from).trim());
  }
  return out.filter(Boolean);
}

export function readSeries(text: string, options: { unitSystem?: UnitSystem } = {}): SeriesReading {
  const problems: Problem[] = [];
  const raw: { sodium: number; glucose?: number; clock?: number; hours?: number }[] = [];
  let timed = false;
  let sawClock = false;
  let sawHours = false;
  for (const segment of segments(text)) {
    let rest = ` ${segment} `;
    let clock: number | undefined;
    let hours: number | undefined;
    const c = CLOCK.exec(rest);
    const c12 = c ? null : CLOCK_12.exec(rest);
    const h = c || c12 ? null : HOURS.exec(rest);
    if (c) {
      let hh = Number(c[1]);
      if (c[3]?.toLowerCase() === "pm" && hh < 12) hh += 12;
      if (c[3]?.toLowerCase() === "am" && hh === 12) hh = 0;
      clock = hh * 60 + Number(c[2]);
      rest = rest.replace(c[0], " ");
    } else if (c12) {
      let hh = Number(c12[1]) % 12;
      if (c12[2]!.toLowerCase() === "pm") hh += 12;
      clock = hh * 60;
      rest = rest.replace(c12[0], " ");
    } else if (h) {
      hours = Number(h[1]!.replace(",", "."));
      rest = rest.replace(h[0], " ");
    } else if (BARE_AT.test(rest)) {
      problems.push({
        code: "series.timeAmbiguous",
        message: `"at ${BARE_AT.exec(rest)![1]}" could be morning or evening: write the time as 09:00 or 21:00.`,
      });
      continue;
    }
    if (clock !== undefined) sawClock = true;
    if (hours !== undefined) sawHours = true;
    if (clock !== undefined || hours !== undefined) timed = true;
    // "121 at 04:00" after "Na 118 at 22:00": a lone number is the next sodium.
    if (!NAME.test(rest) && /\d/.test(rest)) rest = `Na ${rest}`;
    const reading = readMessage(
      rest.replace(/\bat\b/gi, " "),
      options.unitSystem ? { unitSystem: options.unitSystem } : {},
    );
    problems.push(
      ...reading.problems.filter((p) => p.code !== "privacy.identifier" && p.code !== "word.unknown"),
    );
    const sodium = reading.inputs.sodium;
    if (sodium === undefined) continue;
    raw.push({
      sodium,
      ...(reading.inputs.glucose !== undefined && { glucose: reading.inputs.glucose }),
      ...(clock !== undefined && { clock }),
      ...(hours !== undefined && { hours }),
    });
  }
  if (problems.some((p) => p.code === "series.timeAmbiguous")) return { points: [], problems, timed: true };
  if (!timed) return { points: [], problems, timed };
  if (sawClock && sawHours) {
    problems.push({
      code: "series.mixedTimes",
      message:
        "Write every time the same way: clock times (22:00) or hours from the first value (6 h), not both.",
    });
    return { points: [], problems, timed };
  }
  const untimed = raw.filter((p) => p.clock === undefined && p.hours === undefined);
  if (untimed.length > 0) {
    problems.push({
      code: "series.timeMissing",
      message: `${untimed.length === 1 ? "One sodium has" : `${untimed.length} sodiums have`} no time (Na ${untimed.map((p) => p.sodium).join(", ")}): give each value its time.`,
    });
    return { points: [], problems, timed };
  }
  const points: SodiumPoint[] = [];
  if (sawClock) {
    let day = 0;
    let previous = -1;
    for (const p of raw) {
      if (p.clock! === previous) {
        problems.push({
          code: "series.sameTime",
          message: "Two values have the same time: which one is it?",
        });
        return { points: [], problems, timed };
      }
      // Written in order: a time earlier than the one before it is the next day.
      if (p.clock! < previous) day++;
      previous = p.clock!;
      const minutes = day * 1440 + p.clock!;
      points.push({
        hours: (minutes - raw[0]!.clock!) / 60,
        sodium: p.sodium,
        ...(p.glucose !== undefined && { glucose: p.glucose }),
      });
    }
    return { points, firstClock: raw[0]!.clock!, problems, timed };
  }
  const first = raw[0]!.hours!;
  for (let k = 0; k < raw.length; k++) {
    const p = raw[k]!;
    if (k > 0 && p.hours! <= raw[k - 1]!.hours!) {
      problems.push({
        code: "series.hoursOrder",
        message: "The hours go backwards or repeat: write them in order, from the first value.",
      });
      return { points: [], problems, timed };
    }
    points.push({
      hours: p.hours! - first,
      sodium: p.sodium,
      ...(p.glucose !== undefined && { glucose: p.glucose }),
    });
  }
  return { points, problems, timed };
}

/** "08:00" for an hour of a series whose first value was at `firstClock` minutes after midnight. */
export function clockAt(firstClock: number, hours: number): string {
  const minutes = Math.round(firstClock + hours * 60) % 1440;
  return `${String(Math.floor(minutes / 60)).padStart(2, "0")}:${String(minutes % 60).padStart(2, "0")}`;
}
