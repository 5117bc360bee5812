/**
 * The lexer: one line of a message into typed pieces — numbers (with a flag stuck to them, "124*"),
 * reference ranges ("135-145", "135 - 145"), units ("mg / dl"), flags, times, brackets, words —
 * in one linear pass. No regular expression here runs over more than one short piece.
 */
import type { Unit } from "../units.js";
import { FLAG_WORDS, FOREIGN_UNITS, INCOMPLETE_UNITS, UNIT_SPELLINGS } from "./vocabulary.js";

interface Place {
  start: number;
  end: number;
}

export type Lexeme = Place &
  (
    | { kind: "word"; text: string; lower: string }
    | {
        kind: "number";
        text: string;
        value: number;
        below: boolean;
        above: boolean;
        /** "1,200": twelve hundred, or one point two? */
        ambiguous: boolean;
        /** A flag stuck to the number: "124*", "131↓", "2.9L". */
        flag?: string;
      }
    | { kind: "range"; low?: number; high?: number }
    | { kind: "time"; text: string }
    /** `unit` is undefined for a unit we recognise but read no analyte in (µmol/L, kPa, %). */
    | { kind: "unit"; text: string; unit?: Unit }
    | { kind: "incomplete"; text: string }
    | { kind: "flag"; text: string }
    | { kind: "open" }
    | { kind: "close" }
    | { kind: "dash" }
    | { kind: "sep"; char: string }
    /** Part of an identifier: never read, never echoed. The text stays here only to order columns. */
    | { kind: "masked"; text: string }
  );

/** Pieces longer than this are never matched against patterns. */
export const MAX_PIECE = 256;

const UNIT_BY_SPELLING = new Map<string, Unit>(UNIT_SPELLINGS.map(([s, u]) => [s, u]));

/** The unit a spelling names (spaces ignored, any case), "foreign" for one of no analyte of ours. */
export function unitOf(text: string): Unit | "foreign" | undefined {
  const key = text.includes(" ") ? text.toLowerCase().replace(/\s+/g, "") : text.toLowerCase();
  return unitOfLower(key);
}

function unitOfLower(key: string): Unit | "foreign" | undefined {
  return UNIT_BY_SPELLING.get(key) ?? (FOREIGN_UNITS.has(key) ? "foreign" : undefined);
}

/** Whether a piece can be a number, a range or a time: it starts with a digit or a sign. */
function numeric(code: number): boolean {
  return (
    (code >= 48 && code <= 57) ||
    code === 60 ||
    code === 62 ||
    code === 43 ||
    code === 45 ||
    code === 46 ||
    code === 44 ||
    code === 0x2264 ||
    code === 0x2265
  );
}

const NUMBER =
  /^([<>≤≥]?)([-+]?)(\d{1,6}(?:[.,]\d{1,20})?|[.,]\d{1,20})(\*{1,3}|↑{1,2}|↓{1,2}|!{1,2}|hh|ll|h|l)?$/i;
const RANGE = /^([<>]?)(-?\d{1,6}(?:[.,]\d{1,6})?)-(-?\d{1,6}(?:[.,]\d{1,6})?)$/;
const TIME = /^([01]?\d|2[0-3])[:h]([0-5]\d)(?::[0-5]\d)?$/i;
const NUMBER_THEN_REST = /^([<>≤≥]?\d{1,6}(?:[.,]\d{1,20})?)([^\d.,].*)$/;

const toNumber = (s: string) => Number(s.includes(",") ? s.replace(",", ".") : s);

/** "128", "5.2": the usual value, read without the regular expression below. */
function plainNumber(text: string): boolean {
  if (text.length > 12) return false;
  let dot = -1;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 46 && dot < 0 && i > 0 && i < text.length - 1) dot = i;
    else if (c < 48 || c > 57) return false;
  }
  return dot < 0 ? text.length <= 6 : dot <= 6;
}

function numberLexeme(text: string, place: Place): Lexeme | undefined {
  if (plainNumber(text)) {
    const value = Number(text);
    return {
      kind: "number",
      text,
      value,
      below: false,
      above: false,
      ambiguous: false,
      start: place.start,
      end: place.end,
    };
  }
  const m = NUMBER.exec(text);
  if (!m) return undefined;
  const body = m[3]!;
  const value = (m[2] === "-" ? -1 : 1) * toNumber(body);
  return {
    kind: "number",
    text,
    value,
    below: m[1] === "<" || m[1] === "≤",
    above: m[1] === ">" || m[1] === "≥",
    ambiguous: /^\d{1,3},\d{3}$/.test(body),
    ...(m[4] && { flag: m[4].toUpperCase() }),
    start: place.start,
    end: place.end,
  };
}

/** Classifies one piece of text (no separators in it). `isName` says whether a word is a name. */
function classify(raw: string, place: Place, isName: (lower: string) => boolean, out: Lexeme[]): void {
  let text = raw;
  // A full stop after a value or word ("Na 128.", "ref.") is punctuation, not part of it.
  while (text.length > 1 && text.endsWith(".")) text = text.slice(0, -1);
  if (text.length === 0) return;
  if (text.length > MAX_PIECE) {
    out.push({ kind: "word", text: "", lower: "", start: place.start, end: place.end });
    return;
  }
  const lower = text.toLowerCase();
  if (text === "-" || text === "—") {
    out.push({ kind: "dash", start: place.start, end: place.end });
    return;
  }
  if (text === "/" || text === "+" || text === "&") {
    out.push({ kind: "sep", char: text, start: place.start, end: place.end });
    return;
  }
  if (numeric(text.charCodeAt(0))) {
    const number = numberLexeme(text, place);
    if (number) {
      out.push(number);
      return;
    }
    if (TIME.test(text)) {
      out.push({ kind: "time", text, start: place.start, end: place.end });
      return;
    }
    const range = RANGE.exec(text);
    if (range) {
      const low = toNumber(range[2]!);
      const high = toNumber(range[3]!);
      if (range[1] === "<") out.push({ kind: "range", high, start: place.start, end: place.end });
      else out.push({ kind: "range", low, high, start: place.start, end: place.end });
      return;
    }
  }
  const unit = unitOfLower(lower);
  if (unit) {
    out.push(
      unit === "foreign"
        ? { kind: "unit", text, start: place.start, end: place.end }
        : { kind: "unit", text, unit, start: place.start, end: place.end },
    );
    return;
  }
  if (INCOMPLETE_UNITS.has(lower)) {
    out.push({ kind: "incomplete", text, start: place.start, end: place.end });
    return;
  }
  if (FLAG_WORDS.has(lower) && (lower !== "a" || text === "A") && !isName(lower)) {
    out.push({ kind: "flag", text: text.toUpperCase(), start: place.start, end: place.end });
    return;
  }
  if (isName(lower)) {
    out.push({ kind: "word", text, lower, start: place.start, end: place.end });
    return;
  }
  // Glued: a name then a number ("Na128", "UNa71", "K3.9mmol/L").
  if (/\d/.test(text)) {
    for (let cut = Math.min(text.length - 1, 14); cut >= 1; cut--) {
      const head = lower.slice(0, cut);
      if (isName(head) && /^[<>≤≥]?\d/.test(text.slice(cut))) {
        out.push({
          kind: "word",
          text: text.slice(0, cut),
          lower: head,
          start: place.start,
          end: place.start + cut,
        });
        classify(text.slice(cut), { start: place.start + cut, end: place.end }, isName, out);
        return;
      }
    }
    // A number then a unit ("540mg/dL", "3.1mmol/L").
    const m = NUMBER_THEN_REST.exec(text);
    if (m && (unitOf(m[2]!) || INCOMPLETE_UNITS.has(m[2]!.toLowerCase()))) {
      const cut = m[1]!.length;
      classify(m[1]!, { start: place.start, end: place.start + cut }, isName, out);
      classify(m[2]!, { start: place.start + cut, end: place.end }, isName, out);
      return;
    }
  }
  // A slash-joined run: "Na133/K3.9/Cl101", "120/80".
  if (text.includes("/") && text.length > 1) {
    let at = place.start;
    const parts = text.split("/");
    parts.forEach((part, i) => {
      if (part) classify(part, { start: at, end: at + part.length }, isName, out);
      if (i < parts.length - 1)
        out.push({ kind: "sep", char: "/", start: at + part.length, end: at + part.length + 1 });
      at += part.length + 1;
    });
    return;
  }
  out.push({ kind: "word", text, lower, start: place.start, end: place.end });
}

const isDigit = (c: string | undefined) => c !== undefined && c >= "0" && c <= "9";
const isLetter = (c: string | undefined) => c !== undefined && /\p{L}/u.test(c);

/**
 * Lexes one line. `base` is the line's offset in the message; `masked(start, end)` says whether a
 * span is part of an identifier.
 */
export function lexLine(
  line: string,
  base: number,
  masked: (start: number, end: number) => boolean,
  isName: (lower: string) => boolean,
): Lexeme[] {
  const out: Lexeme[] = [];
  let start = -1;
  const flush = (end: number) => {
    if (start < 0) return;
    const piece = line.slice(start, end);
    const place = { start: base + start, end: base + end };
    if (masked(place.start, place.end))
      out.push({ kind: "masked", text: piece, start: place.start, end: place.end });
    else classify(piece, place, isName, out);
    start = -1;
  };
  for (let i = 0; i <= line.length; i++) {
    const c = line[i];
    if (c === undefined) {
      flush(i);
      break;
    }
    let kind: "space" | "open" | "close" | "sep" | "char" = "char";
    if (c === " " || c === "\t" || c === "\r" || c === "\f" || c === "\v") kind = "space";
    else if (c === "(" || c === "[" || c === "{") kind = "open";
    else if (c === ")" || c === "]" || c === "}") kind = "close";
    else if (c === ";" || c === "=" || c === "|" || c === '"') kind = "sep";
    else if ((c === ":" || c === ",") && !(isDigit(line[i - 1]) && isDigit(line[i + 1]) && start >= 0)) {
      // "https://…" stays one piece.
      kind = c === ":" && start >= 0 && line[i + 1] === "/" && line[i + 2] === "/" ? "char" : "sep";
    } else if (c === "'" && !(isLetter(line[i - 1]) && isLetter(line[i + 1]))) kind = "sep";
    if (kind === "char") {
      if (start < 0) start = i;
      continue;
    }
    flush(i);
    const place = { start: base + i, end: base + i + 1 };
    if (kind === "open") out.push({ kind: "open", start: place.start, end: place.end });
    else if (kind === "close") out.push({ kind: "close", start: place.start, end: place.end });
    else if (kind === "sep") out.push({ kind: "sep", char: c, start: place.start, end: place.end });
  }
  return joinRanges(out);
}

const COMPARATORS: Record<string, "below" | "above"> = {
  "<": "below",
  "≤": "below",
  ">": "above",
  "≥": "above",
};

/**
 * Joins pieces written apart: "135 - 145" (number, dash, number) is one range, and so is "135 to
 * 145" inside brackets; "< 10" and "≥ 60" are one censored number, never a plain 10 or 60.
 */
function joinRanges(lexemes: Lexeme[]): Lexeme[] {
  const out: Lexeme[] = [];
  let depth = 0;
  for (let i = 0; i < lexemes.length; i++) {
    let a = lexemes[i]!;
    const after = lexemes[i + 1];
    if (
      a.kind === "word" &&
      COMPARATORS[a.text] &&
      after?.kind === "number" &&
      !after.below &&
      !after.above
    ) {
      const side = COMPARATORS[a.text];
      a = {
        ...after,
        text: `${a.text}${after.text}`,
        below: side === "below",
        above: side === "above",
        start: a.start,
      };
      i++;
    }
    if (a.kind === "open") depth++;
    if (a.kind === "close") depth = Math.max(0, depth - 1);
    const b = lexemes[i + 1];
    const c = lexemes[i + 2];
    const joiner = b && (b.kind === "dash" || (depth > 0 && b.kind === "word" && b.lower === "to"));
    if (
      a.kind === "number" &&
      !a.flag &&
      !a.below &&
      !a.above &&
      joiner &&
      c?.kind === "number" &&
      !c.below &&
      !c.above &&
      c.value >= a.value
    ) {
      out.push({ kind: "range", low: a.value, high: c.value, start: a.start, end: c.end });
      i += 2;
      // A flag stuck to the range's end ("3.5-5.1 L") stays a flag.
      if (c.flag) out.push({ kind: "flag", text: c.flag, start: c.end, end: c.end });
      continue;
    }
    out.push(a);
  }
  return out;
}
