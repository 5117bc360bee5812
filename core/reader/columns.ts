/**
 * Tables with more than one result column (two or more collection times). The latest column is
 * used only when the header makes the order certain: a date on every column (day-month and
 * month-day readings must agree on which is latest), or words like "current" and "previous".
 * Otherwise the reader asks. The header's text is read here only to order columns, never echoed.
 */
import type { Lexeme } from "./lexer.js";

/** Month names, each in full and in its usual short forms ("Dec", "Sept", "December"). */
const MONTHS: Record<string, number> = Object.fromEntries(
  [
    ["january", "jan"],
    ["february", "feb"],
    ["march", "mar"],
    ["april", "apr"],
    ["may"],
    ["june", "jun"],
    ["july", "jul"],
    ["august", "aug"],
    ["september", "sep", "sept"],
    ["october", "oct"],
    ["november", "nov"],
    ["december", "dec"],
  ].flatMap((names, i) => names.map((name) => [name, i + 1])),
);
const LATEST = new Set(["current", "latest", "now", "today", "new"]);
const EARLIER = new Set(["previous", "prior", "earlier", "yesterday", "old", "last"]);

interface Stamp {
  /** Minutes since an arbitrary epoch, under the day-month and month-day readings. */
  dm?: number;
  md?: number;
  rank?: number;
}

/** Minutes since an arbitrary epoch for a day (31 days to every month: only the order matters). */
const minutes = (y: number, m: number, d: number) =>
  m >= 1 && m <= 12 && d >= 1 && d <= 31 ? ((y * 12 + m) * 31 + d) * 1440 : undefined;

function parseTime(text: string): number | undefined {
  const m = /^(\d{1,2})[:h](\d{2})/i.exec(text);
  return m ? Number(m[1]) * 60 + Number(m[2]) : undefined;
}

/** A date piece: "2026-12-02", "02/12/2026", "02/12", "2-Dec-2026". */
function parseDate(
  text: string,
): { dm?: [number, number, number]; md?: [number, number, number] } | undefined {
  let m = /^(\d{4})-(\d{1,2})-(\d{1,2})/.exec(text);
  if (m) {
    const ymd: [number, number, number] = [Number(m[1]), Number(m[2]), Number(m[3])];
    return { dm: ymd, md: ymd };
  }
  m = /^(\d{1,2})[./-](\d{1,2})(?:[./-](\d{2,4}))?$/.exec(text);
  if (m) {
    const a = Number(m[1]);
    const b = Number(m[2]);
    const y = m[3] ? Number(m[3]) % 100 : 0;
    return { dm: [y, b, a], md: [y, a, b] };
  }
  // A lexeme holds no space, so "2 Dec 2026" never reaches here as one piece.
  m = /^(\d{1,2})-?([a-z]{3,9})(?:-?(\d{2,4}))?$/i.exec(text);
  if (m && MONTHS[m[2]!.toLowerCase()]) {
    const ymd: [number, number, number] = [
      m[3] ? Number(m[3]) % 100 : 0,
      MONTHS[m[2]!.toLowerCase()]!,
      Number(m[1]),
    ];
    return { dm: ymd, md: ymd };
  }
  return undefined;
}

/** The stamps of a header line, in column order. */
export function headerStamps(lexemes: readonly Lexeme[]): Stamp[] {
  const stamps: Stamp[] = [];
  let pendingTime: number | undefined;
  for (const l of lexemes) {
    const text = l.kind === "masked" || l.kind === "word" || l.kind === "time" ? l.text : "";
    const lower = text.toLowerCase();
    if (l.kind === "word" && LATEST.has(lower)) stamps.push({ rank: 1 });
    else if (l.kind === "word" && EARLIER.has(lower)) stamps.push({ rank: 0 });
    else if (l.kind === "time") {
      const t = parseTime(text);
      const last = stamps.at(-1);
      // A time after a date belongs to it; a time alone is a column with no date.
      if (last && last.dm !== undefined && pendingTime === undefined) {
        last.dm += t ?? 0;
        if (last.md !== undefined) last.md += t ?? 0;
        pendingTime = t;
      } else stamps.push({});
    } else if (text) {
      const date = parseDate(text);
      if (date) {
        const dm = date.dm && minutes(date.dm[0], date.dm[1], date.dm[2]);
        const md = date.md && minutes(date.md[0], date.md[1], date.md[2]);
        stamps.push({ dm, md });
        pendingTime = undefined;
      }
    }
  }
  return stamps;
}

/** Which column is the latest, when the stamps make it certain; undefined otherwise. */
export function latestColumn(stamps: readonly Stamp[], columns: number): number | undefined {
  if (stamps.length !== columns || columns < 2) return undefined;
  if (stamps.every((s) => s.rank !== undefined)) {
    const latest = stamps.map((s, i) => [s.rank!, i] as const).filter(([r]) => r === 1);
    return latest.length === 1 ? latest[0]![1] : undefined;
  }
  const pick = (key: "dm" | "md"): number | undefined => {
    if (!stamps.every((s) => s[key] !== undefined)) return undefined;
    const values = stamps.map((s) => s[key]!);
    const max = Math.max(...values);
    return values.filter((v) => v === max).length === 1 ? values.indexOf(max) : undefined;
  };
  const dm = pick("dm");
  const md = pick("md");
  if (dm !== undefined && md !== undefined) return dm === md ? dm : undefined;
  return dm ?? md;
}

const ROLE_WORDS: Record<string, "result" | "low" | "high"> = {
  result: "result",
  results: "result",
  value: "result",
  low: "low",
  lower: "low",
  min: "low",
  minimum: "low",
  high: "high",
  upper: "high",
  max: "high",
  maximum: "high",
};

/**
 * A header that names a result column and the two ends of the range ("Test Result Low High",
 * "Analyte Value Min Max"): the position of each among a row's three numbers. Undefined when the
 * header names anything else that could be a column of results (a date, a time, "previous").
 */
export function rangeColumns(
  lexemes: readonly Lexeme[],
): { result: number; low: number; high: number } | undefined {
  const order: ("result" | "low" | "high")[] = [];
  for (const l of lexemes) {
    if (l.kind === "time" || l.kind === "masked" || l.kind === "number") return undefined;
    if (l.kind !== "word" && l.kind !== "flag") continue;
    const role = ROLE_WORDS[l.text.toLowerCase()];
    if (role) order.push(role);
  }
  const result = order.indexOf("result");
  const low = order.indexOf("low");
  const high = order.indexOf("high");
  if (order.length !== 3 || result < 0 || low < 0 || high < 0) return undefined;
  return { result, low, high };
}
