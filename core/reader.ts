/**
 * The reader: turns a message typed the way clinicians type ("Na 128 glu 540 mg/dL urea 14 mmol/L
 * osm 310") into the engine's typed inputs, or says clearly what it could not use. Pure and linear
 * in the length of the message. It never guesses a unit, never echoes an identifier, and reports
 * every word it did not use.
 */
import { ANALYTES, type Analyte, type AnalyteId, toCanonicalFactor, type UnitSystem } from "./analytes.js";
import { num } from "./format.js";
import { findIdentifiers, IDENTIFIER_LABELS, type IdentifierKind } from "./identifiers.js";
import { INPUT_KEYS, type InputKey, type LabInputs } from "./inputs.js";
import { MAX_TOKEN_LENGTH, type Token, tokenize } from "./tokens.js";
import type { Unit } from "./units.js";
import {
  ANALYTE_ALIASES,
  CLAIM_ALIASES,
  type ClaimKind,
  FILLER,
  INCOMPLETE_UNITS,
  MODIFIERS,
  TAG_WORDS,
  UNIT_SPELLINGS,
} from "./vocabulary.js";

export interface ReadOptions {
  /** The channel's declared unit system; resolves bare glucose, urea, alcohols and albumin. */
  unitSystem?: UnitSystem;
}

export type UnitSource = "written" | "convention" | "channel";

export interface ReadValue {
  /** The engine input it feeds (BUN feeds urea). */
  key: InputKey;
  analyte: AnalyteId;
  /** As written, in `unit`. */
  written: number;
  unit: Unit;
  unitSource: UnitSource;
  canonical: number;
  /** "<" when written as below a detection limit (counted as 0). */
  below?: true;
  /** Character offsets in the message. */
  start: number;
  end: number;
}

export interface Claim {
  kind: ClaimKind;
  value: number;
  start: number;
  end: number;
}

export interface Problem {
  code: string;
  message: string;
  /** Character offsets in the message, when the problem has a place. */
  at?: { start: number; end: number };
}

export interface Reading {
  inputs: LabInputs;
  values: ReadValue[];
  claims: Claim[];
  tag?: string;
  problems: Problem[];
  /** Notes on how something was read (assumptions the user should see). */
  notes: string[];
  /** How the message was read, e.g. "Na 128 mmol/L, glucose 540 mg/dL = 29.97 mmol/L". */
  echo: string;
  /** Kinds of identifier found; never their text. */
  identifiers: IdentifierKind[];
}

type Vocab = { kind: "analyte"; id: AnalyteId } | { kind: "claim"; id: ClaimKind };

const PHRASES = new Map<string, Vocab>();
let longestPhrase = 1;
for (const [id, aliases] of Object.entries(ANALYTE_ALIASES) as [AnalyteId, readonly string[]][]) {
  for (const alias of aliases) PHRASES.set(alias, { kind: "analyte", id });
}
for (const [id, aliases] of Object.entries(CLAIM_ALIASES) as [ClaimKind, readonly string[]][]) {
  for (const alias of aliases) PHRASES.set(alias, { kind: "claim", id });
}
for (const key of PHRASES.keys()) longestPhrase = Math.max(longestPhrase, key.split(" ").length);
/** First words of multi-word phrases, so most tokens are looked up once, not once per length. */
const PHRASE_STARTS = new Set(
  [...PHRASES.keys()].filter((k) => k.includes(" ")).map((k) => k.split(" ")[0]!),
);
const UNIT_BY_SPELLING = new Map<string, Unit>(UNIT_SPELLINGS.map(([spelling, unit]) => [spelling, unit]));

function isKnownWord(lower: string): boolean {
  return (
    PHRASES.has(lower) ||
    FILLER.has(lower) ||
    MODIFIERS.has(lower) ||
    TAG_WORDS.has(lower) ||
    unitOf(lower) !== undefined
  );
}

const NUMBER = /^([<>≤≥]?[-−]?)(\d{1,6}(?:[.,]\d{1,20})?|[.,]\d{1,20})$/;
const NUMBER_THEN_REST = /^([<>≤≥]?\d{1,6}(?:[.,]\d{1,20})?)([^\d.,].*)$/;

function unitOf(text: string): Unit | undefined {
  return UNIT_BY_SPELLING.get(text.toLowerCase());
}

interface ParsedNumber {
  value: number;
  below: boolean;
  above: boolean;
  ambiguous: boolean;
}

function parseNumber(text: string): ParsedNumber | undefined {
  const m = NUMBER.exec(text);
  if (!m) return undefined;
  const sign = m[1]!.replace(/[-−]/, "");
  const negative = /[-−]/.test(m[1]!);
  let body = m[2]!;
  // "1,200" could be twelve hundred or one point two: ask.
  const ambiguous = /^\d{1,3},\d{3}$/.test(body);
  body = body.replace(",", ".");
  return {
    value: (negative ? -1 : 1) * Number(body),
    below: sign === "<" || sign === "≤",
    above: sign === ">" || sign === "≥",
    ambiguous,
  };
}

/** Splits a glued token into parts: "Na128" → Na, 128; "540mg/dL" → 540, mg/dL; "K3.1mmol/L" → K, 3.1, mmol/L. */
function splitGlued(token: Token): Token[] {
  const text = token.text;
  const low = text.toLowerCase();
  if (PHRASES.has(low) || unitOf(text) || NUMBER.test(text) || text.length > MAX_TOKEN_LENGTH) return [token];
  // name then number (only a token that has a digit can be glued)
  const firstDigit = low.search(/\d/);
  for (let cut = Math.min(low.length - 1, 12, firstDigit < 0 ? 0 : low.length); cut >= 1; cut--) {
    const head = low.slice(0, cut);
    const rest = text.slice(cut);
    if (PHRASES.has(head) && /^[<>≤≥]?\d/.test(rest)) {
      return [
        { text: text.slice(0, cut), start: token.start, end: token.start + cut },
        ...splitGlued({ text: rest, start: token.start + cut, end: token.end }),
      ];
    }
  }
  // number then unit
  const m = NUMBER_THEN_REST.exec(text);
  if (m && (unitOf(m[2]!) || INCOMPLETE_UNITS.has(m[2]!.toLowerCase()))) {
    const cut = m[1]!.length;
    return [
      { text: m[1]!, start: token.start, end: token.start + cut },
      { text: m[2]!, start: token.start + cut, end: token.end },
    ];
  }
  return [token];
}

const TAG_CODE = /^[A-Za-z0-9][A-Za-z0-9-]{0,9}$/;

/** A case tag must be a bed or bay code: letters and digits with at least one digit, no long digit run. */
export function checkTag(code: string): { ok: true; tag: string } | { ok: false; reason: string } {
  if (!TAG_CODE.test(code)) {
    return {
      ok: false,
      reason: "A case tag is a short bed or bay code of letters and digits, like bed 12, bay 4B or #ICU3.",
    };
  }
  if (!/\d/.test(code)) {
    return {
      ok: false,
      reason:
        "A case tag without a digit could be a name: use a bed or bay code with a number, like bed 12 or #4B.",
    };
  }
  if (/\d{5,}/.test(code)) {
    return {
      ok: false,
      reason:
        "A case tag with a long run of digits could be a record number: use a bed or bay code, like bed 12.",
    };
  }
  return { ok: true, tag: code.toUpperCase() };
}

const ordinal = (n: number) => `word ${n + 1}`;
/** True when the text has no character above U+007F (it then needs no Unicode folding). */
const isAscii = (text: string) => {
  for (let i = 0; i < text.length; i++) if (text.charCodeAt(i) > 0x7f) return false;
  return true;
};

export function readMessage(text: string, options: ReadOptions = {}): Reading {
  const problems: Problem[] = [];
  const notes: string[] = [];
  const values: ReadValue[] = [];
  const claims: Claim[] = [];
  let tag: string | undefined;

  // NFKC folds full-width digits and letters; plain ASCII needs no folding.
  const raw = tokenize(isAscii(text) ? text : text.normalize("NFKC"));
  // Identifiers are found on the tokens as written, and those tokens are never read or echoed.
  const hits = findIdentifiers(raw, isKnownWord);
  const masked = new Set<number>();
  for (const h of hits) for (let i = h.first; i <= h.last; i++) masked.add(i);
  const identifiers = [...new Set(hits.map((h) => h.kind))];
  if (identifiers.length > 0) {
    problems.push({
      code: "privacy.identifier",
      message: `This message seems to contain ${listOf(identifiers.map((k) => IDENTIFIER_LABELS[k]))}. Please delete it from the channel; Solute has not kept it. Tag cases by bed or bay instead (bed 12, #4B).`,
    });
  }

  // Glued tokens are split after masking; masked tokens stay whole and are skipped.
  const tokens: (Token & { masked: boolean; word: number })[] = [];
  for (let i = 0; i < raw.length; i++) {
    const t = raw[i]!;
    const isMasked = masked.has(i);
    for (const p of isMasked ? [t] : splitGlued(t))
      tokens.push({ text: p.text, start: p.start, end: p.end, masked: isMasked, word: i });
  }
  const lower = tokens.map((t) => t.text.toLowerCase());
  const unknownWords: number[] = [];

  let i = 0;
  while (i < tokens.length) {
    const token = tokens[i]!;
    if (token.masked) {
      i++;
      continue;
    }
    const low = lower[i]!;

    // Case tag: "#4B" or "bed 12".
    if (low.startsWith("#") || (TAG_WORDS.has(low) && i + 1 < tokens.length && !tokens[i + 1]!.masked)) {
      const code = low.startsWith("#") ? token.text.slice(1) : tokens[i + 1]!.text;
      const prefix = low.startsWith("#") ? "" : `${low} `;
      const last = low.startsWith("#") ? i : i + 1;
      const checked = checkTag(code);
      const at = { start: token.start, end: tokens[last]!.end };
      if (!checked.ok) problems.push({ code: "tag.refused", message: checked.reason, at });
      else if (tag !== undefined && tag !== prefix + checked.tag) {
        problems.push({
          code: "tag.multiple",
          message: "More than one case tag: one message, one case.",
          at,
        });
      } else tag = prefix + checked.tag;
      i = last + 1;
      continue;
    }

    // Longest phrase match (analyte or claimed result), after optional modifiers.
    let match: { vocab: Vocab; length: number } | undefined;
    if (PHRASE_STARTS.has(low)) {
      let phrase = low;
      const candidates: { vocab: Vocab; length: number }[] = [];
      for (let n = 2; n <= longestPhrase && i + n <= tokens.length && !tokens[i + n - 1]!.masked; n++) {
        phrase = `${phrase} ${lower[i + n - 1]}`;
        const vocab = PHRASES.get(phrase);
        if (vocab) candidates.push({ vocab, length: n });
      }
      match = candidates.at(-1);
    }
    if (!match) {
      const vocab = PHRASES.get(low);
      if (vocab) match = { vocab, length: 1 };
    }
    if (!match && MODIFIERS.has(low)) {
      i++;
      continue;
    }
    if (!match) {
      if (FILLER.has(low)) {
        i++;
        continue;
      }
      if (parseNumber(token.text)) {
        problems.push({
          code: "number.orphan",
          message: `A number with no name before it (${ordinal(token.word)}) was not used. Write the name first, like Na 128.`,
          at: { start: token.start, end: token.end },
        });
      } else if (unitOf(token.text)) {
        problems.push({
          code: "unit.orphan",
          message: `A unit with no value before it (${ordinal(token.word)}) was not used.`,
          at: { start: token.start, end: token.end },
        });
      } else {
        unknownWords.push(token.word);
      }
      i++;
      continue;
    }

    const nameEnd = i + match.length;
    // The name as written, for messages only (most messages have no problem to word).
    const nameStart = i;
    const label =
      match.length === 1
        ? token.text
        : tokens
            .slice(nameStart, nameEnd)
            .map((t) => t.text)
            .join(" ");
    // Optional unit before the number ("glucose mg/dL 540"), the number, optional unit after.
    let j = nameEnd;
    let unitBefore: Unit | undefined;
    if (j < tokens.length && !tokens[j]!.masked && unitOf(tokens[j]!.text))
      unitBefore = unitOf(tokens[j++]!.text);
    const numberToken = j < tokens.length && !tokens[j]!.masked ? tokens[j] : undefined;
    const parsed = numberToken ? parseNumber(numberToken.text) : undefined;
    if (!parsed) {
      // A bare name ("anion gap", "gap") that is not followed by a number: say so, once.
      problems.push({
        code: "value.missing",
        message: `${label} has no number after it, so it was not used.`,
        at: { start: token.start, end: tokens[nameEnd - 1]!.end },
      });
      i = nameEnd;
      continue;
    }
    j++;
    let unitAfter: Unit | undefined;
    let incomplete = false;
    if (j < tokens.length && !tokens[j]!.masked) {
      unitAfter = unitOf(tokens[j]!.text);
      if (unitAfter) j++;
      else if (INCOMPLETE_UNITS.has(lower[j]!)) {
        incomplete = true;
        j++;
      }
    }
    const end = tokens[j - 1]!.end;
    i = j;
    const place = { start: token.start, end };

    if (parsed.ambiguous) {
      problems.push({
        code: "value.ambiguousNumber",
        message: `${label} ${numberToken!.text}: is the comma a decimal point or a thousands separator? Write it without the comma (e.g. 1200 or 1.2).`,
        at: place,
      });
      continue;
    }

    if (match.vocab.kind === "claim") {
      if (parsed.below || parsed.above) {
        problems.push({
          code: "value.censored",
          message: `A claimed ${label} needs a plain number.`,
          at: place,
        });
      } else claims.push({ kind: match.vocab.id, value: parsed.value, start: place.start, end: place.end });
      continue;
    }

    const analyte = ANALYTES[match.vocab.id];
    if (incomplete) {
      problems.push({
        code: "unit.incomplete",
        message: `${label} ${numberToken!.text} ${tokens[j - 1]!.text}: per what volume? Write mg/dL, mg/L or g/L.`,
        at: place,
      });
      continue;
    }
    if (unitBefore && unitAfter && unitBefore !== unitAfter) {
      problems.push({
        code: "unit.conflict",
        message: `${label} has two different units; write one.`,
        at: place,
      });
      continue;
    }
    const written = unitAfter ?? unitBefore;
    const resolved = resolveUnit(analyte, written, options.unitSystem);
    if ("problem" in resolved) {
      problems.push({ ...resolved.problem(label, numberToken!.text), at: place });
      continue;
    }
    if (parsed.above) {
      problems.push({
        code: "value.censored",
        message: `${label} ${numberToken!.text} is above the measuring range: it cannot be calculated with. Ask the lab for the diluted value.`,
        at: place,
      });
      continue;
    }
    if (parsed.below && analyte.plausible.min > 0) {
      problems.push({
        code: "value.censored",
        message: `${label} ${numberToken!.text} is below the measuring range: it cannot be calculated with.`,
        at: place,
      });
      continue;
    }
    const factor = toCanonicalFactor(analyte, resolved.unit)!;
    const canonical = parsed.below ? 0 : parsed.value * factor;
    const key: InputKey = analyte.id === "bun" ? "urea" : (analyte.id as InputKey);

    // Typo guard, stated in the unit the user wrote.
    if (canonical < analyte.plausible.min || canonical > analyte.plausible.max) {
      const lo = num(analyte.plausible.min / factor, 1);
      const hi = num(analyte.plausible.max / factor, 1);
      let hint = " Check for a typo.";
      const other = otherUnitThatFits(analyte, parsed.value, resolved.unit);
      if (other && resolved.source !== "written") hint = ` If it is in ${other}, write the unit.`;
      problems.push({
        code: "value.implausible",
        message: `${analyte.name} ${num(parsed.value, 6)} ${resolved.unit} is outside ${lo}–${hi} ${resolved.unit}, so it was not used.${hint}`,
        at: place,
      });
      continue;
    }
    values.push({
      key,
      analyte: analyte.id,
      written: parsed.value,
      unit: resolved.unit,
      unitSource: resolved.source,
      canonical,
      ...(parsed.below && { below: true as const }),
      start: place.start,
      end: place.end,
    });
    if (parsed.below)
      notes.push(
        `${analyte.name} written as below ${numberToken!.text.slice(1)} ${resolved.unit}: counted as 0.`,
      );
    if (
      analyte.id === "urea" &&
      (resolved.unit === "mg/dL" || resolved.unit === "mg/L" || resolved.unit === "g/L")
    ) {
      notes.push(
        `urea ${num(parsed.value, 6)} ${resolved.unit} read as urea itself, not BUN (urea nitrogen). If you meant BUN, write BUN ${num(parsed.value, 6)}.`,
      );
    }
    if (resolved.unit === "mOsm/L")
      notes.push("Osmolality written per litre is read as mOsm/kg, as osmometers report it.");
  }

  if (unknownWords.length > 0) {
    const where = [...new Set(unknownWords)]
      .slice(0, 6)
      .map((w) => w + 1)
      .join(", ");
    problems.push({
      code: "word.unknown",
      message: `${unknownWords.length === 1 ? "One word was" : `${unknownWords.length} words were`} not understood and not used (word ${where}). Write values as name, number, unit — like Na 128, glucose 540 mg/dL.`,
    });
  }

  const merged = mergeDuplicates(values, problems);
  // Every value here has passed its typo guard above (the same bounds LabInputsSchema holds), so
  // the inputs are built directly; zod guards inputs from outside the reader (the stored log).
  const inputs: LabInputs = {};
  for (const v of merged) inputs[v.key] = v.canonical;

  return {
    inputs,
    problems: capped(problems),
    values: merged,
    claims,
    ...(tag !== undefined && { tag }),
    notes: notes.length === 0 ? notes : [...new Set(notes)].slice(0, MAX_PER_CODE * 2),
    echo: echoOf(merged),
    identifiers,
  };
}

type Resolved =
  | { unit: Unit; source: UnitSource }
  | { problem: (label: string, value: string) => Omit<Problem, "at"> };

function resolveUnit(analyte: Analyte, written: Unit | undefined, system: UnitSystem | undefined): Resolved {
  if (written) {
    if (toCanonicalFactor(analyte, written) === undefined) {
      return {
        problem: (label, value) => ({
          code: "unit.notForAnalyte",
          message: `${label} ${value} ${written}: ${analyte.name} is not given in ${written}. Use ${analyte.units.join(" or ")}.`,
        }),
      };
    }
    return { unit: written, source: "written" };
  }
  if (analyte.conventionalDefault) return { unit: analyte.conventionalDefault, source: "convention" };
  const bySystem = system ? analyte.systemUnits?.[system] : undefined;
  if (bySystem) return { unit: bySystem, source: "channel" };
  const choices =
    analyte.id === "urea"
      ? "mmol/L, or mg/dL — and if mg/dL, urea or BUN (urea nitrogen)"
      : analyte.systemUnits
        ? Object.values(analyte.systemUnits).join(" or ")
        : analyte.units.join(" or ");
  return {
    problem: (label, value) => ({
      code: "unit.ambiguous",
      message: `${label} ${value} has no unit, and it could be ${choices}.${fitsOnly(analyte, value)} Write the unit (e.g. ${label} ${value} ${analyte.systemUnits?.si ?? analyte.units[0]}) or set the channel's units.`,
    }),
  };
}

/** " Only mg/dL is plausible for 540." — a hint, never a decision. */
function fitsOnly(analyte: Analyte, text: string): string {
  const parsed = parseNumber(text);
  if (!parsed) return "";
  const fits = analyte.units.filter((u) => {
    const c = parsed.value * toCanonicalFactor(analyte, u)!;
    return c >= analyte.plausible.min && c <= analyte.plausible.max;
  });
  if (fits.length === 0) return " No unit makes it plausible: check for a typo.";
  return fits.length === 1 ? ` Only ${fits[0]} would be plausible.` : "";
}

const MAX_PER_CODE = 3;

/** At most a few problems of each kind, then one line that counts the rest. */
function capped(problems: Problem[]): Problem[] {
  const seen = new Map<string, number>();
  const out: Problem[] = [];
  for (const p of problems) {
    const n = (seen.get(p.code) ?? 0) + 1;
    seen.set(p.code, n);
    if (n <= MAX_PER_CODE) out.push(p);
  }
  for (const [code, n] of seen) {
    if (n > MAX_PER_CODE) out.push({ code, message: `…and ${n - MAX_PER_CODE} more like this.` });
  }
  return out;
}

function listOf(items: string[]): string {
  return items.length <= 1 ? (items[0] ?? "") : `${items.slice(0, -1).join(", ")} and ${items.at(-1)}`;
}

function otherUnitThatFits(analyte: Analyte, value: number, used: Unit): Unit | undefined {
  for (const unit of analyte.units) {
    if (unit === used) continue;
    const c = value * toCanonicalFactor(analyte, unit)!;
    if (c >= analyte.plausible.min && c <= analyte.plausible.max) return unit;
  }
  return undefined;
}

/** Same analyte twice: equal values are kept once; different values are a problem and neither is used. */
function mergeDuplicates(values: ReadValue[], problems: Problem[]): ReadValue[] {
  const byKey = new Map<InputKey, ReadValue[]>();
  for (const v of values) {
    const list = byKey.get(v.key);
    if (list) list.push(v);
    else byKey.set(v.key, [v]);
  }
  const kept: ReadValue[] = [];
  for (const [key, list] of byKey) {
    const first = list[0]!;
    const agree = list.every(
      (v) => Math.abs(v.canonical - first.canonical) <= 0.01 * Math.max(1, Math.abs(first.canonical)),
    );
    if (agree) kept.push(first);
    else {
      const name =
        key === "urea" && list.some((v) => v.analyte === "bun") ? "urea and BUN" : ANALYTES[key].name;
      problems.push({
        code: "value.conflict",
        message: `${name} given more than once with different values (${list.map((v) => `${num(v.written, 6)} ${v.unit}`).join(", ")}): none of them was used. Send one value.`,
      });
    }
  }
  return kept.sort((a, b) => INPUT_KEYS.indexOf(a.key) - INPUT_KEYS.indexOf(b.key));
}

function echoOf(values: ReadValue[]): string {
  if (values.length === 0) return "";
  return values
    .map((v) => {
      const analyte = ANALYTES[v.analyte];
      const shown = `${analyte.label} ${v.below ? "<" : ""}${num(v.written, 6)} ${v.unit}`;
      const converted =
        v.unit !== analyte.canonicalUnit || v.analyte === "bun"
          ? ` = ${num(v.canonical)} ${analyte.canonicalUnit}${v.analyte === "bun" ? " urea" : ""}`
          : "";
      const source = v.unitSource === "channel" ? " (unit from the channel's setting)" : "";
      return shown + converted + source;
    })
    .join(", ");
}

/** Writes typed inputs back as a message the reader reads to the same inputs (full precision). */
export function renderInputs(inputs: LabInputs): string {
  return INPUT_KEYS.filter((k) => inputs[k] !== undefined)
    .map((k) => `${ANALYTE_ALIASES[k][0]} ${plain(inputs[k]!)} ${ANALYTES[k].canonicalUnit}`)
    .join(" ");
}

/** A number in plain decimal notation that reads back to the same double. */
function plain(value: number): string {
  const text = String(value);
  if (!text.includes("e")) return text;
  for (let digits = 1; digits <= 20; digits++) {
    const fixed = value.toFixed(digits);
    if (Number(fixed) === value) return fixed;
  }
  return value.toFixed(20);
}
