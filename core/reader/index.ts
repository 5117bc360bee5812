/**
 * The reader: turns what clinicians type or paste — "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310",
 * or a results viewer's panel with ranges, flags, units, specimens and several columns — into the
 * engine's typed inputs, or says clearly what it could not use. Pure and linear in the length of
 * the message. It never guesses a unit or a specimen, never takes a reference range or a flag for
 * a result, never echoes an identifier, and names problems by analyte or by line.
 *
 * Each line is read as cells: a name, then whatever follows it up to the next name — result,
 * flag, unit and reference range in any order. See DEVELOPERS.md for the layouts it reads.
 */
import {
  ANALYTES,
  type Analyte,
  type AnalyteId,
  isPlausible,
  type Specimen,
  toCanonicalFactor,
  type UnitSystem,
} from "../analytes.js";
import { num } from "../format.js";
import { findIdentifiers, IDENTIFIER_LABELS, type IdentifierKind } from "../identifiers.js";
import { INPUT_KEYS, type InputKey, type LabInputs } from "../inputs.js";
import { tokenize } from "../tokens.js";
import type { Unit } from "../units.js";
import { headerStamps, latestColumn, rangeColumns } from "./columns.js";
import { type Lexeme, lexLine } from "./lexer.js";
import { entryOf, isGlueHead, isName, matchNames, type NameEntry, type NameMatch } from "./names.js";
import { normalise } from "./normalise.js";
import {
  ANALYTE_ALIASES,
  CALCULATED_MARKERS,
  type ClaimKind,
  CORRECTED_MARKERS,
  DESCRIPTORS,
  FILLER,
  HEADER_WORDS,
  RANGE_INTRO,
  STANDARD_MARKERS,
  TAG_WORDS,
  URINE_COUNTERPART,
} from "./vocabulary.js";

export type { ClaimKind } from "./vocabulary.js";

export interface ReadOptions {
  /** The channel's declared unit system; resolves bare glucose, urea, alcohols and albumin. */
  unitSystem?: UnitSystem;
}

export type UnitSource = "written" | "convention" | "channel";

export interface LabRange {
  low?: number;
  high?: number;
}

export interface ReadValue {
  /** The engine input it feeds (BUN feeds urea; a urine sodium feeds urineSodium). */
  key: InputKey;
  analyte: AnalyteId;
  /** As written, in `unit`. */
  written: number;
  unit: Unit;
  unitSource: UnitSource;
  canonical: number;
  specimen: Specimen;
  /** The lab's flag beside the result (H, L, *, critical …), if any. */
  flag?: string;
  /** The reference range printed beside the result, in `unit`. Never used as a value. */
  labRange?: LabRange;
  /** "<" when written as below a detection limit (counted as 0). */
  below?: true;
  /** 1-based line of the message. */
  line: number;
  start: number;
  end: number;
}

export interface Claim {
  kind: ClaimKind;
  value: number;
  /** An anion gap that counts potassium ("Anion Gap K+"). */
  withPotassium?: boolean;
  line: number;
  start: number;
  end: number;
}

export interface Problem {
  code: string;
  message: string;
  /** 1-based line of the message, when the problem has one. */
  line?: number;
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
  /** Tests recognised in the message that Solute does not compute with (display names). */
  notUsed: string[];
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

/** Words the privacy guard must not take for a name: everything the reader knows. */
function isKnownWord(lower: string): boolean {
  return (
    isName(lower) ||
    FILLER.has(lower) ||
    HEADER_WORDS.has(lower) ||
    DESCRIPTORS.has(lower) ||
    TAG_WORDS.has(lower) ||
    RANGE_INTRO.has(lower)
  );
}

/** One name and what follows it on its line. */
interface Cell {
  entry: NameEntry;
  line: number;
  start: number;
  end: number;
  /** Each specimen named for it, once (an array: a cell names at most three). */
  specimens: Specimen[];
  /** Earlier on the same line, an analyte was qualified as urine by its own word. */
  afterInlineUrine: boolean;
  /** No specimen of its own, after a urine section that ended (see readMessage). */
  afterUrineSection: boolean;
  results: (Lexeme & { kind: "number" })[];
  /** The unit written right after each result, if any (index-aligned with `results`). */
  unitAfter: (Unit | "foreign" | undefined)[];
  units: (Unit | "foreign")[];
  ranges: LabRange[];
  flags: string[];
  incomplete: boolean;
  calculated: boolean;
  corrected: boolean;
  standard: boolean;
  withPotassium: boolean;
  unknownWords: number;
  /** The result used, once columns are decided: "none" when the name has none; unset when not used. */
  chosen?: (Lexeme & { kind: "number" }) | "none";
}

const NO_INDEXES: ReadonlySet<number> = new Set();
const NO_MASK = new Uint8Array(0);
const NO_LABELS: never[] = [];
const NO_SPECIMENS: ReadonlyMap<number, never> = new Map<number, never>();

const NAME_OF: Record<AnalyteId, string> = Object.fromEntries(
  Object.values(ANALYTES).map((a) => [a.id, a.name]),
) as Record<AnalyteId, string>;

export function readMessage(text: string, options: ReadOptions = {}): Reading {
  const norm = normalise(text);
  const problems: Problem[] = [];
  const notes: string[] = [];
  const claims: Claim[] = [];
  const notUsed = new Set<string>();
  let tag: string | undefined;

  // Identifiers are found on the message as written; their characters are never read or echoed.
  const idTokens = tokenize(norm);
  const hits = findIdentifiers(idTokens, isKnownWord);
  // Stryker disable next-line all: a fast path for the common case; both branches give the same result
  const maskedChars = hits.length === 0 ? NO_MASK : new Uint8Array(norm.length);
  for (const h of hits) {
    // The whole run of characters without a space around an identifier is masked: nothing is
    // read out of "k1.{a@a.aa".
    let from = idTokens[h.first]!.start;
    let to = idTokens[h.last]!.end;
    while (from > 0 && !/\s/.test(norm[from - 1]!)) from--;
    while (to < norm.length && !/\s/.test(norm[to]!)) to++;
    maskedChars.fill(1, from, to);
  }
  const masked =
    // Stryker disable next-line all: a fast path for the common case; both branches give the same result
    hits.length === 0
      ? () => false
      : (start: number, end: number) => {
          for (let i = start; i < end; i++) if (maskedChars[i]) return true;
          return false;
        };
  // Stryker disable next-line all: a fast path for the common case; both branches give the same result
  const identifiers = hits.length === 0 ? [] : [...new Set(hits.map((h) => h.kind))];
  if (identifiers.length > 0) {
    problems.push({
      code: "privacy.identifier",
      message: `This message seems to contain ${listOf(identifiers.map((k) => IDENTIFIER_LABELS[k]))}. Please delete it from the channel; Solute has not kept it. Tag cases by bed or bay instead (bed 12, #4B).`,
    });
  }

  const cells: Cell[] = [];
  const unclearLines: number[] = [];
  const partlyUnclear: number[] = [];
  const orphanLines: number[] = [];
  /** Where words not understood sit, for a one-line message: "after sodium 120". */
  const unclearNear: string[] = [];
  const headers: { line: number; lexemes: Lexeme[] }[] = [];
  const numberedHeaders: number[] = [];
  const blankLines: number[] = [];
  let section: Specimen | undefined;
  /** Values read in the current section. */
  let sectionValues = 0;
  /**
   * A urine section that ended at a blank line or a heading of no specimen after its values: what
   * follows without a specimen of its own could be urine or blood, and is asked about.
   */
  let afterUrine = false;
  const openSection = (s: Specimen | undefined) => {
    section = s;
    sectionValues = 0;
    afterUrine = false;
  };
  const endSection = () => {
    if (section === "urine" && sectionValues > 0) {
      afterUrine = true;
      section = undefined;
    }
  };
  let lineCount = 0;

  let base = 0;
  for (const lineText of norm.split("\n")) {
    const lineNo = ++lineCount;
    const lexemes = lexLine(lineText, base, masked, isGlueHead);
    base += lineText.length + 1;
    if (lexemes.length === 0) {
      blankLines.push(lineNo);
      endSection();
      continue;
    }

    // Case tags: "bed 12", "bay 4B", "#ICU3".
    for (let i = 0; i < lexemes.length; i++) {
      const l = lexemes[i]!;
      const next = lexemes[i + 1];
      let code: string | undefined;
      let span = 1;
      if (l.kind === "word" && l.text.startsWith("#") && l.text.length > 1) code = l.text.slice(1);
      else if (
        l.kind === "word" &&
        TAG_WORDS.has(l.lower) &&
        next &&
        (next.kind === "word" || next.kind === "number")
      ) {
        code = next.text;
        span = 2;
      }
      if (code === undefined) continue;
      const checked = checkTag(code);
      const prefix = span === 2 ? `${(l as { lower: string }).lower} ` : "";
      if (!checked.ok) problems.push({ code: "tag.refused", message: checked.reason, line: lineNo });
      else if (tag !== undefined && tag !== prefix + checked.tag)
        problems.push({
          code: "tag.multiple",
          message: "More than one case tag: one message, one case.",
          line: lineNo,
        });
      else tag = prefix + checked.tag;
      for (let k = 0; k < span; k++) lexemes[i + k] = { kind: "sep", char: " ", start: l.start, end: l.end };
      i += span - 1;
    }

    const matches = mergeBracketedAlias(lexemes, mergeAnionGapPotassium(lexemes, matchNames(lexemes)));
    type SpecimenMatch = NameMatch & { entry: { kind: "specimen"; specimen: Specimen } };
    const anchors: NameMatch[] = [];
    const specimenMatches: SpecimenMatch[] = [];
    for (const m of matches) {
      if (m.entry.kind === "specimen") specimenMatches.push(m as SpecimenMatch);
      else anchors.push(m);
    }
    // Lexeme indexes inside a specimen word, and each specimen match by the index after it.
    // Stryker disable next-line all: a fast path for the common case; both branches give the same result
    const inSpecimen = specimenMatches.length === 0 ? NO_INDEXES : new Set<number>();
    // Stryker disable next-line all: a fast path for the common case; both branches give the same result
    const specimenBefore = specimenMatches.length === 0 ? NO_SPECIMENS : new Map<number, SpecimenMatch>();
    for (const m of specimenMatches) {
      for (let i = m.first; i <= m.last; i++) (inSpecimen as Set<number>).add(i);
      (specimenBefore as Map<number, SpecimenMatch>).set(m.last + 1, m);
    }

    if (anchors.length === 0) {
      const specimens = new Set(specimenMatches.map((m) => m.entry.specimen));
      let meaningful = 0;
      let onlyHeader = true;
      let hasNumber = false;
      let unknownWords = 0;
      for (let i = 0; i < lexemes.length; i++) {
        const l = lexemes[i]!;
        if (l.kind === "sep" || l.kind === "dash") continue;
        meaningful++;
        if (l.kind === "number" || l.kind === "range") hasNumber = true;
        const header =
          l.kind === "time" ||
          l.kind === "masked" ||
          l.kind === "unit" ||
          l.kind === "flag" ||
          l.kind === "open" ||
          l.kind === "close" ||
          inSpecimen.has(i) ||
          (l.kind === "word" &&
            (HEADER_WORDS.has(l.lower) || FILLER.has(l.lower) || DESCRIPTORS.has(l.lower))) ||
          // "1." numbering a section
          (l.kind === "number" && meaningful === 1 && Number.isInteger(l.value) && l.value < 100);
        if (!header) onlyHeader = false;
        if (l.kind === "word" && !header && !isKnownWord(l.lower)) unknownWords++;
      }
      // A number with no words beside it is not a list number.
      if (hasNumber && !lexemes.some((l) => l.kind === "word")) onlyHeader = false;
      // A heading that starts with a specimen ("Urine studies:", "URINE – spot") opens that
      // section even when other words on it are not understood (those are still reported).
      const headed = !hasNumber && specimenMatches[0]?.first === firstWord(lexemes) && specimens.size === 1;
      if (headed && !onlyHeader) openSection([...specimens][0]!);
      if (onlyHeader) {
        if (specimens.size === 1) openSection([...specimens][0]!);
        else if (specimens.size > 1) openSection(undefined);
        else endSection();
        headers.push({ line: lineNo, lexemes });
        if (hasNumber) numberedHeaders.push(lineNo);
      } else {
        if (hasNumber) orphanLines.push(lineNo);
        if (unknownWords > 0 || !hasNumber) unclearLines.push(lineNo);
      }
      continue;
    }

    // Labels: a specimen word and a colon ("Urine: Na 40 K 35", "Na 140 Urine: K 30") cover the
    // rest of the line, up to the next label. Later in a line, a label is one only when a name
    // follows it: in "Sodium, urine: 40" the word qualifies the sodium.
    const firstMeaningful = firstWord(lexemes);
    // Stryker disable next-line all: a fast path for the common case; both branches give the same result
    const labels: SpecimenMatch[] = specimenMatches.length === 0 ? NO_LABELS : [];
    for (const m of specimenMatches) {
      const after = lexemes[m.last + 1];
      if (after?.kind !== "sep" || after.char !== ":") continue;
      let j = m.last + 2;
      while (lexemes[j]?.kind === "sep") j++;
      if (m.first === firstMeaningful || anchors.some((a) => a.first === j)) labels.push(m);
    }

    // Words before the first name: a list number, a label, a time — or something not understood.
    let unknownBefore = 0;
    for (let i = 0; i < anchors[0]!.first; i++) {
      const l = lexemes[i]!;
      if (inSpecimen.has(i)) continue;
      if (l.kind === "number" && !(i === firstMeaningful && Number.isInteger(l.value) && l.value < 100))
        orphanLines.push(lineNo);
      if (l.kind === "word" && !isKnownWord(l.lower)) unknownBefore++;
    }
    let unknown = unknownBefore;
    const lineStart = cells.length;

    let inlineUrine = false;
    for (let k = 0; k < anchors.length; k++) {
      const anchor = anchors[k]!;
      const next = anchors[k + 1];
      const label = labels.findLast((m) => m.last < anchor.first);
      const lineSpecimen = label?.entry.specimen;
      // Specimen words directly before a name belong to it ("spot urine Na", "U Na"); a cell ends
      // where the next name, its specimen words or a label begin.
      const prefix = specimenBefore.get(anchor.first);
      const nextPrefix = next ? specimenBefore.get(next.first) : undefined;
      let end = next
        ? nextPrefix && !labels.includes(nextPrefix)
          ? nextPrefix.first
          : next.first
        : lexemes.length;
      const nextLabel = labels.find((m) => m.first > anchor.last && m.first < end);
      if (nextLabel) end = nextLabel.first;
      const cell = readCell(anchor, lexemes, anchor.last + 1, end, lineNo);
      if (prefix && !labels.includes(prefix)) addSpecimen(cell, prefix.entry.specimen);
      if (anchor.entry.kind === "analyte" && anchor.entry.specimen) addSpecimen(cell, anchor.entry.specimen);
      if (lineSpecimen && cell.specimens.length === 0) addSpecimen(cell, lineSpecimen);
      if (cell.specimens.length === 0 && section) addSpecimen(cell, section);
      cell.afterInlineUrine = inlineUrine && !lineSpecimen;
      if (section) sectionValues++;
      cell.afterUrineSection = afterUrine && cell.specimens.length === 0;
      if (cell.specimens.includes("urine") && lineSpecimen !== "urine" && section !== "urine")
        inlineUrine = true;
      cell.start = lexemes[anchor.first]!.start;
      cell.end = lexemes[end - 1]?.end ?? cell.start;
      unknown += cell.unknownWords;
      cells.push(cell);
    }
    if (unknown > 0) partlyUnclear.push(lineNo);
    if (unknownBefore > 0) unclearNear.push("before the first value");
    for (let c = lineStart; c < cells.length && unclearNear.length < 4; c++)
      if (cells[c]!.unknownWords > 0) unclearNear.push(`after ${near(cells[c]!)}`);
  }

  // Rows with more than one result: a table of several collection times.
  chooseColumns(cells, headers, blankLines, problems, notes);

  const values: ReadValue[] = [];
  for (const cell of cells) {
    const result = cell.chosen;
    if (result === undefined) continue;
    const entry = cell.entry;
    if (entry.kind === "other") {
      notUsed.add(entry.name);
      continue;
    }
    if (entry.kind === "claim" || (entry.kind === "analyte" && (cell.calculated || cell.corrected))) {
      const kind: ClaimKind =
        entry.kind === "claim" ? entry.id : cell.corrected ? "correctedSodium" : "calculatedOsmolality";
      if (result === "none") {
        problems.push({
          code: "value.missing",
          message: `The ${CLAIM_NAMES[kind]} has no number after it.`,
          line: cell.line,
        });
      } else if (result.below || result.above) {
        problems.push({
          code: "value.censored",
          message: `A claimed ${CLAIM_NAMES[kind]} needs a plain number.`,
          line: cell.line,
        });
      } else {
        claims.push({
          kind,
          value: result.value,
          ...(cell.withPotassium && { withPotassium: true }),
          line: cell.line,
          start: cell.start,
          end: cell.end,
        });
      }
      continue;
    }
    const value = readValue(cell, result, options.unitSystem, problems, notes, notUsed);
    if (value) values.push(value);
  }

  // A message of nothing but numbered headings ("2 T") read nothing: say so, never stay silent.
  if (cells.length === 0 && orphanLines.length === 0) orphanLines.push(...numberedHeaders);
  if (orphanLines.length > 0) {
    problems.push({
      code: "number.orphan",
      message:
        lineCount === 1
          ? "A number with no name before it was not used. Write the name first, like Na 128."
          : `${onLines(orphanLines)} a number with no name before it, so it was not used. Write the name first, like Na 128.`,
    });
  }
  const unclear =
    // Stryker disable next-line all: a fast path for the common case; both branches give the same result
    unclearLines.length + partlyUnclear.length === 0
      ? unclearLines
      : [...new Set([...unclearLines, ...partlyUnclear])].sort((a, b) => a - b);
  if (unclear.length > 0) {
    problems.push({
      code: "word.unknown",
      message:
        lineCount === 1
          ? `Some words${unclearNear.length > 0 ? ` ${listOf([...new Set(unclearNear)])}` : ""} were not understood and not used. Write values as name, number, unit — like Na 128, glucose 540 mg/dL.`
          : `${linesWord(unclear)} ${unclear.length === 1 ? "was" : "were"} not understood (in part or whole) and not used. Write values as name, number, unit — like Na 128, glucose 540 mg/dL.`,
    });
  }

  const merged = mergeDuplicates(values, problems);
  // Every value here has passed its typo guard (the same bounds LabInputsSchema holds), so the
  // inputs are built directly; zod guards inputs from outside the reader (the stored log).
  const inputs: LabInputs = {};
  for (const v of merged) inputs[v.key] = v.canonical;
  if (notUsed.size > 0) notes.push(`Not used in these calculations: ${listOf([...notUsed])}.`);

  const reading: Reading = {
    inputs,
    problems: capped(problems),
    values: merged,
    claims,
    notes: notes.length === 0 ? notes : [...new Set(notes)].slice(0, MAX_PER_CODE * 3),
    echo: echoOf(merged),
    identifiers,
    notUsed: notUsed.size === 0 ? [] : [...notUsed],
  };
  if (tag !== undefined) reading.tag = tag;
  return reading;
}

const lexemeLower = (l: Lexeme | undefined) => (l?.kind === "word" ? l.lower : undefined);

/** The index of a line's first piece that is not a separator or a dash. */
function firstWord(lexemes: readonly Lexeme[]): number {
  return lexemes.findIndex((l) => l.kind !== "sep" && l.kind !== "dash");
}

const CLAIM_NAMES: Record<ClaimKind, string> = {
  calculatedOsmolality: "calculated osmolality",
  effectiveOsmolality: "effective osmolality",
  osmolalGap: "osmolal gap",
  correctedSodium: "corrected sodium",
  anionGap: "anion gap",
};

/**
 * "Ketones (BHB) 4.1", "Sodium (Na) 128": a name and its own alias in brackets are one name; after
 * another analyte's name, "(BG)" says blood gas ("Na+ (BG) 131"), not a blood glucose.
 */
function mergeBracketedAlias(lexemes: readonly Lexeme[], matches: NameMatch[]): NameMatch[] {
  if (matches.length < 2) return matches;
  const out: NameMatch[] = [];
  for (let i = 0; i < matches.length; i++) {
    const m = matches[i]!;
    const next = matches[i + 1];
    const bracketed =
      next !== undefined &&
      m.entry.kind === "analyte" &&
      next.entry.kind === "analyte" &&
      next.first === m.last + 2 &&
      next.first === next.last &&
      lexemes[m.last + 1]?.kind === "open" &&
      lexemes[next.last + 1]?.kind === "close";
    if (bracketed && next.entry.kind === "analyte" && m.entry.kind === "analyte") {
      const gas =
        next.entry.id === "glucose" && m.entry.id !== "glucose" && lexemeLower(lexemes[next.first]) === "bg";
      if (next.entry.id === m.entry.id || gas) {
        out.push({ ...m, last: next.last + 1, ...(gas && { entry: { ...m.entry, specimen: "bloodGas" } }) });
        i++;
        continue;
      }
    }
    out.push(m);
  }
  return out;
}

/** "Anion Gap K+", "AG (K+)", "AnGap,K+": the K belongs to the gap's name, not a potassium. */
function mergeAnionGapPotassium(lexemes: readonly Lexeme[], matches: NameMatch[]): NameMatch[] {
  if (!matches.some((m) => m.entry.kind === "claim" && m.entry.id === "anionGap")) return matches;
  const out: NameMatch[] = [];
  for (let i = 0; i < matches.length; i++) {
    const m = matches[i]!;
    const next = matches[i + 1];
    if (
      m.entry.kind === "claim" &&
      m.entry.id === "anionGap" &&
      next?.entry.kind === "analyte" &&
      next.entry.id === "potassium" &&
      lexemes
        .slice(m.last + 1, next.first)
        .every(
          (l) =>
            l.kind === "open" ||
            l.kind === "sep" ||
            l.kind === "dash" ||
            (l.kind === "word" && /^(incl\.?|including|with|w)$/.test(l.lower)),
        )
    ) {
      // The closing bracket after "(K+" is left in the cell; it closes an empty group.
      out.push({ ...m, last: next.last, entry: { kind: "claim", id: "anionGap" }, withK: true } as NameMatch);
      i++;
      continue;
    }
    out.push(m);
  }
  return out;
}

function addSpecimen(cell: Cell, specimen: Specimen): void {
  if (!cell.specimens.includes(specimen)) cell.specimens.push(specimen);
}

/**
 * Reads the lexemes after a name (`lexemes[from]` up to `lexemes[to]`, not included): results,
 * units, ranges, flags, specimen and other qualifiers.
 */
function readCell(anchor: NameMatch, lexemes: Lexeme[], from: number, to: number, line: number): Cell {
  const cell: Cell = {
    entry: anchor.entry,
    line,
    start: 0,
    end: 0,
    specimens: [],
    afterInlineUrine: false,
    afterUrineSection: false,
    results: [],
    unitAfter: [],
    units: [],
    ranges: [],
    flags: [],
    incomplete: false,
    calculated: false,
    corrected: false,
    standard: false,
    withPotassium: (anchor as { withK?: boolean }).withK === true,
    unknownWords: 0,
  };
  const isOsm = anchor.entry.kind === "analyte" && anchor.entry.id === "measuredOsmolality";
  const isSodium = anchor.entry.kind === "analyte" && anchor.entry.id === "sodium";
  const isBicarb = anchor.entry.kind === "analyte" && anchor.entry.id === "bicarbonate";
  const isAnionGap = anchor.entry.kind === "claim" && anchor.entry.id === "anionGap";

  const word = (l: Lexeme & { kind: "word" }) => {
    const entry = entryOf(l.lower);
    // Inside a row, a one-letter specimen ("(P)", "(B)" on analyser printouts) says plasma or
    // blood, not which sample: only a specimen word names one there ("Sodium, urine") — and "U",
    // which never means blood ("Na (U) 71").
    if (entry?.kind === "specimen" && (l.lower.length > 1 || entry.specimen === "urine"))
      addSpecimen(cell, entry.specimen);
    else if (entry?.kind === "specimen") {
      // read past
    } else if (isOsm && CALCULATED_MARKERS.has(l.lower)) cell.calculated = true;
    else if (isSodium && CORRECTED_MARKERS.has(l.lower)) cell.corrected = true;
    else if (isBicarb && STANDARD_MARKERS.has(l.lower)) cell.standard = true;
    else if (isAnionGap && /^(k|k\+|incl|including)$/.test(l.lower)) cell.withPotassium = true;
    else if (
      DESCRIPTORS.has(l.lower) ||
      FILLER.has(l.lower) ||
      HEADER_WORDS.has(l.lower) ||
      RANGE_INTRO.has(l.lower) ||
      l.lower === "spot" ||
      l.lower === "to"
    ) {
      // read past
    } else cell.unknownWords++;
  };

  let rangeIntro = false;
  for (let i = from; i < to; i++) {
    const l = lexemes[i]!;
    if (l.kind === "open") {
      // A bracket group: a range, a unit, a flag, a qualifier — or an extra result.
      let depth = 1;
      let j = i + 1;
      while (j < to && depth > 0) {
        if (lexemes[j]!.kind === "open") depth++;
        if (lexemes[j]!.kind === "close") depth--;
        if (depth > 0) j++;
      }
      const group = lexemes.slice(i + 1, j);
      readGroup(group, cell, word);
      i = j;
      continue;
    }
    switch (l.kind) {
      case "number":
        if (rangeIntro && (l.below || l.above)) {
          cell.ranges.push(l.below ? { high: l.value } : { low: l.value });
          rangeIntro = false;
        } else {
          cell.results.push(l);
          cell.unitAfter.push(undefined);
          if (l.flag) cell.flags.push(l.flag);
        }
        break;
      case "range":
        cell.ranges.push({
          ...(l.low !== undefined && { low: l.low }),
          ...(l.high !== undefined && { high: l.high }),
        });
        rangeIntro = false;
        break;
      case "unit":
        cell.units.push(l.unit ?? "foreign");
        if (cell.results.length > 0 && cell.unitAfter.at(-1) === undefined && cell.ranges.length === 0)
          cell.unitAfter[cell.unitAfter.length - 1] = l.unit ?? "foreign";
        break;
      case "incomplete":
        if (cell.results.length > 0) cell.incomplete = true;
        break;
      case "flag":
        cell.flags.push(l.text);
        break;
      case "word":
        if (RANGE_INTRO.has(l.lower)) rangeIntro = true;
        word(l);
        break;
      default:
        break;
    }
  }
  return cell;
}

function readGroup(group: Lexeme[], cell: Cell, word: (l: Lexeme & { kind: "word" }) => void): void {
  const ranges = group.filter((l): l is Lexeme & { kind: "range" } => l.kind === "range");
  for (const r of ranges)
    cell.ranges.push({
      ...(r.low !== undefined && { low: r.low }),
      ...(r.high !== undefined && { high: r.high }),
    });
  // "(<5)" or "(> 60)" is a range; a plain number in brackets is another result ("128 (131)"),
  // or the same result in another unit ("9.4 mmol/L (169 mg/dL)").
  let lastResult = false;
  for (const l of group) {
    if (l.kind === "word") word(l);
    else if (l.kind === "flag") cell.flags.push(l.text);
    else if (l.kind === "unit") {
      cell.units.push(l.unit ?? "foreign");
      if (lastResult && ranges.length === 0) cell.unitAfter[cell.unitAfter.length - 1] = l.unit ?? "foreign";
    } else if (l.kind === "number") {
      lastResult = false;
      if (l.below) cell.ranges.push({ high: l.value });
      else if (l.above) cell.ranges.push({ low: l.value });
      else {
        cell.results.push(l);
        cell.unitAfter.push(undefined);
        lastResult = true;
      }
    }
  }
}

/**
 * Decides which result of each cell is used: the only one; in a table of several columns, the
 * latest when the header makes it certain; otherwise none (and the reader asks). Returns the
 * result for each cell, or "none" when a name has no result at all.
 */
function chooseColumns(
  cells: Cell[],
  headers: { line: number; lexemes: Lexeme[] }[],
  blankLines: number[],
  problems: Problem[],
  notes: string[],
): void {
  const chosen = { set: (c: Cell, r: (Lexeme & { kind: "number" }) | "none") => (c.chosen = r) };
  // Stryker disable next-line all: a fast path for the common case; both branches give the same result
  let anyMulti = false;
  // Stryker disable next-line all: a fast path for the common case; both branches give the same result
  for (const c of cells) if (c.results.length > 1) anyMulti = true;
  let multi = anyMulti ? cells.filter((c) => c.entry.kind !== "other" && plainResults(c).length > 1) : [];
  // "Test Result Low High": the second and third numbers of each row are its reference range.
  const rangeHeader = multi.length > 0 ? headers.filter((h) => h.line < multi[0]!.line).at(-1) : undefined;
  const roles = rangeHeader ? rangeColumns(rangeHeader.lexemes) : undefined;
  if (
    roles &&
    multi.every((c) => {
      const r = plainResults(c);
      return r.length === 3 && r[roles.low]!.value <= r[roles.high]!.value;
    })
  ) {
    for (const c of multi) {
      const r = plainResults(c);
      c.ranges.unshift({ low: r[roles.low]!.value, high: r[roles.high]!.value });
      c.unitAfter = [c.unitAfter[roles.result]];
      c.results = [r[roles.result]!];
    }
    notes.push("The low and high columns were read as each row's reference range.");
    multi = [];
  }
  if (multi.length === 0) {
    for (const c of cells) {
      const [only] = plainResults(c);
      c.chosen = only ?? "none";
      if (!only && c.entry.kind !== "other") noResult(c, problems);
    }
    return;
  }
  const firstLine = Math.min(...multi.map((c) => c.line));
  const lastLine = Math.max(...multi.map((c) => c.line));
  const header = headers.filter((h) => h.line < firstLine).at(-1);
  const counts = new Set(multi.map((c) => plainResults(c).length));
  const columns = counts.size === 1 ? [...counts][0]! : 0;
  const latest = header && columns ? latestColumn(headerStamps(header.lexemes), columns) : undefined;
  // The table runs from its header (or first multi-result row) to the next blank line.
  const tableStart = header?.line ?? firstLine;
  const tableEnd = Math.min(...blankLines.filter((b) => b > lastLine), Number.POSITIVE_INFINITY);
  const inTable = (c: Cell) =>
    c.line > tableStart - (header ? 0 : 1) && c.line < tableEnd && c.entry.kind !== "other";

  const names = (list: Cell[]) => listOf([...new Set(list.map(cellName))]);
  if (latest === undefined) {
    const example = multi[0]!;
    problems.push({
      code: "columns.ambiguous",
      message: `${capitalise(names(multi))} ${multi.length === 1 ? "has" : "have"} more than one result (${cellName(example)} ${plainResults(
        example,
      )
        .map((r) => num(r.value, 6))
        .join(
          " and ",
        )}), so ${multi.length === 1 ? "it was" : "they were"} not used: which is the current one? Send one result per name, or paste the header with the collection dates.`,
    });
  } else {
    notes.push(
      `Rows with ${columns} results: the ${ordinalColumn(latest, columns)} column was used, the latest by the dates in the header.`,
    );
  }
  const short: Cell[] = [];
  for (const c of cells) {
    const results = plainResults(c);
    if (c.entry.kind === "other") chosen.set(c, results[0] ?? "none");
    else if (results.length > 1) {
      if (latest !== undefined && results.length === columns) chosen.set(c, results[latest]!);
    } else if (results.length === 1 && inTable(c)) short.push(c);
    else if (results.length === 1) chosen.set(c, results[0]!);
    else {
      chosen.set(c, "none");
      noResult(c, problems);
    }
  }
  if (short.length > 0) {
    problems.push({
      code: "columns.short",
      message: `${capitalise(names(short))} ${short.length === 1 ? "has" : "have"} one result where other rows have ${columns || "several"}, so it is not clear which time ${short.length === 1 ? "it is" : "they are"} from: not used.`,
    });
  }
}

/** Results that are neither a range nor a flag; a dual-unit pair ("9.4 mmol/L (169 mg/dL)") counts once. */
function plainResults(cell: Cell): (Lexeme & { kind: "number" })[] {
  const r = cell.results;
  if (r.length === 2 && cell.entry.kind === "analyte") {
    const [a, b] = cell.unitAfter;
    const analyte = ANALYTES[cell.entry.id];
    if (a && b && a !== "foreign" && b !== "foreign" && a !== b) {
      const fa = toCanonicalFactor(analyte, a);
      const fb = toCanonicalFactor(analyte, b);
      if (fa && fb && Math.abs(r[0]!.value * fa - r[1]!.value * fb) <= 0.02 * Math.abs(r[0]!.value * fa)) {
        cell.units = [a];
        return [r[0]!];
      }
    }
  }
  return r;
}

function noResult(cell: Cell, problems: Problem[]): void {
  if (cell.entry.kind === "claim") return; // worded where claims are read
  problems.push({
    code: cell.ranges.length > 0 ? "value.onlyRange" : "value.missing",
    message:
      cell.ranges.length > 0
        ? `${capitalise(cellName(cell))}: only a reference range was found, no result, so it was not used.`
        : `${capitalise(cellName(cell))} has no number after it, so it was not used.`,
    line: cell.line,
  });
}

/** A cell as a place in a message: "sodium 120". */
function near(cell: Cell): string {
  const first = cell.results[0];
  return first ? `${cellName(cell)} ${num(first.value, 6)}` : cellName(cell);
}

function cellName(cell: Cell): string {
  const e = cell.entry;
  if (e.kind === "analyte") {
    const urine = cell.specimens.includes("urine") && URINE_COUNTERPART[e.id];
    return NAME_OF[urine || e.id];
  }
  if (e.kind === "claim") return CLAIM_NAMES[e.id];
  if (e.kind === "other") return e.name;
  return "a specimen";
}

/** One cell's single result, as a value — or a problem that says why it was not used. */
function readValue(
  cell: Cell,
  result: (Lexeme & { kind: "number" }) | "none",
  system: UnitSystem | undefined,
  problems: Problem[],
  notes: string[],
  notUsed: Set<string>,
): ReadValue | undefined {
  if (result === "none" || cell.entry.kind !== "analyte") return undefined;
  const line = cell.line;
  const baseId = cell.entry.id;
  if (baseId === "bicarbonate" && cell.standard) {
    notUsed.add("standard bicarbonate");
    return undefined;
  }
  // Specimen: named by the alias, a word before or after the name, the line's label or the section.
  // Stryker disable next-line all: a fast path for the common case; both branches give the same result
  const specimens = cell.specimens;
  if (specimens.length > 1) {
    problems.push({
      code: "specimen.conflict",
      message: `${capitalise(NAME_OF[baseId])} ${num(result.value, 6)} is labelled with two specimens (${specimens.map(specimenName).join(" and ")}): not used. Say which.`,
      line,
    });
    return undefined;
  }
  let specimen: Specimen = specimens[0] ?? "serum";
  const urineId = URINE_COUNTERPART[baseId];
  if (cell.afterUrineSection) {
    problems.push({
      code: "specimen.unclear",
      message: `${capitalise(NAME_OF[baseId])} ${num(result.value, 6)} comes after the urine results, past a blank line or a heading: is it urine or blood? Start each part with "Urine:" or "Serum:". Not used.`,
      line,
    });
    return undefined;
  }
  if (specimens.length === 0 && cell.afterInlineUrine && urineId) {
    problems.push({
      code: "specimen.unclear",
      message: `${capitalise(NAME_OF[baseId])} ${num(result.value, 6)} follows a urine value on the same line: is it urine or blood? Write "urine" before each urine value (urine K 35), or put the urine results on their own line after "Urine:". Not used.`,
      line,
    });
    return undefined;
  }
  let id: AnalyteId = baseId;
  const isUrineId = baseId === "urineSodium" || baseId === "urinePotassium" || baseId === "urineOsmolality";
  if (specimen === "urine" && !isUrineId) {
    if (!urineId) {
      notUsed.add(`urine ${NAME_OF[baseId]}`);
      return undefined;
    }
    id = urineId;
  } else if (isUrineId && specimen !== "urine") {
    if (specimens.length > 0) {
      problems.push({
        code: "specimen.conflict",
        message: `${capitalise(NAME_OF[baseId])} ${num(result.value, 6)} is also labelled ${specimenName(specimen)}: not used. Say which.`,
        line,
      });
      return undefined;
    }
    specimen = "urine";
  }
  const analyte = ANALYTES[id];
  const name = analyte.name;
  const shown = num(result.value, 6);

  if (result.ambiguous) {
    problems.push({
      code: "value.ambiguousNumber",
      message: `${capitalise(name)} ${result.text}: is the comma a decimal point or a thousands separator? Write it without the comma (e.g. 1200 or 1.2).`,
      line,
    });
    return undefined;
  }
  if (cell.incomplete) {
    problems.push({
      code: "unit.incomplete",
      message: `${capitalise(name)} ${shown}: per what volume? Write mg/dL, mg/L or g/L.`,
      line,
    });
    return undefined;
  }
  const written = cell.units.length <= 1 ? cell.units : [...new Set(cell.units)];
  if (written.length > 1) {
    problems.push({
      code: "unit.conflict",
      message: `${capitalise(name)} ${shown} has two different units: write one.`,
      line,
    });
    return undefined;
  }
  if (written[0] === "foreign") {
    problems.push({
      code: "unit.notForAnalyte",
      message: `${capitalise(name)} ${shown}: that unit is not one ${name} is read in. Use ${analyte.units.join(" or ")}.`,
      line,
    });
    return undefined;
  }
  const resolved = resolveUnit(analyte, written[0] as Unit | undefined, system);
  if ("problem" in resolved) {
    problems.push({ ...resolved.problem(shown), line });
    return undefined;
  }
  if (result.above) {
    problems.push({
      code: "value.censored",
      message: `${capitalise(name)} ${result.text} is above the measuring range: it cannot be calculated with. Ask the lab for the diluted value.`,
      line,
    });
    return undefined;
  }
  if (result.below && analyte.plausible.min > 0) {
    problems.push({
      code: "value.censored",
      message: `${capitalise(name)} ${result.text} is below the measuring range: it cannot be calculated with.`,
      line,
    });
    return undefined;
  }
  const factor = toCanonicalFactor(analyte, resolved.unit)!;
  const canonical = result.below ? 0 : result.value * factor;
  const key: InputKey = analyte.id === "bun" ? "urea" : (analyte.id as InputKey);

  // Typo guard, stated in the unit the user wrote.
  if (!isPlausible(analyte, canonical)) {
    const lo = num(analyte.plausible.min / factor, 1);
    const hi = num(analyte.plausible.max / factor, 1);
    let hint = " Check for a typo.";
    const other = otherUnitThatFits(analyte, result.value, resolved.unit);
    if (other && resolved.source === "channel") {
      // The channel's unit made it implausible, another unit would not: a question, never a guess.
      problems.push({
        code: "unit.ambiguous",
        message: `${capitalise(name)} ${shown} has no unit: in ${resolved.unit} (this channel's units) it is not plausible, in ${other} it would be. Write the unit: ${ANALYTE_ALIASES[analyte.id][0]} ${shown} ${other} or ${shown} ${resolved.unit}.`,
        line,
      });
      return undefined;
    }
    if (other && resolved.source !== "written") hint = ` If it is in ${other}, write the unit.`;
    problems.push({
      code: "value.implausible",
      message: `${capitalise(name)} ${shown} ${unitText(resolved.unit)}is outside ${lo}–${hi}${resolved.unit === "pH" ? "" : ` ${resolved.unit}`}, so it was not used.${hint}`,
      line,
    });
    return undefined;
  }
  const range = cell.ranges[0];
  if (result.below)
    notes.push(
      `${capitalise(name)} written as below ${result.text.slice(1)} ${unitText(resolved.unit)}counted as 0.`,
    );
  if (
    analyte.id === "urea" &&
    (resolved.unit === "mg/dL" || resolved.unit === "mg/L" || resolved.unit === "g/L")
  ) {
    notes.push(
      `urea ${shown} ${resolved.unit} read as urea itself, not BUN (urea nitrogen). If you meant BUN, write BUN ${shown}.`,
    );
  }
  if (resolved.unit === "mOsm/L")
    notes.push("Osmolality written per litre is read as mOsm/kg, as osmometers report it.");
  // Assembled by assignment: conditional spreads are slow on this path (see docs/benchmarks.md).
  const value: ReadValue = {
    key,
    analyte: analyte.id,
    written: result.value,
    unit: resolved.unit,
    unitSource: resolved.source,
    canonical,
    specimen,
    line,
    start: cell.start,
    end: cell.end,
  };
  if (cell.flags.length > 0) value.flag = cell.flags[0]!;
  if (range) value.labRange = range;
  if (result.below) value.below = true;
  return value;
}

const unitText = (unit: Unit) => (unit === "pH" ? "" : `${unit} `);

function specimenName(s: Specimen): string {
  return s === "bloodGas" ? "blood gas" : s === "urine" ? "urine" : "serum/plasma";
}

type Resolved = { unit: Unit; source: UnitSource } | { problem: (value: string) => Omit<Problem, "line"> };

function resolveUnit(analyte: Analyte, written: Unit | undefined, system: UnitSystem | undefined): Resolved {
  const name = analyte.name;
  if (written) {
    if (toCanonicalFactor(analyte, written) === undefined) {
      return {
        problem: (value) => ({
          code: "unit.notForAnalyte",
          message: `${capitalise(name)} ${value} ${written}: ${name} is not given in ${written}. Use ${analyte.units.join(" or ")}.`,
        }),
      };
    }
    return { unit: written, source: "written" };
  }
  if (analyte.conventionalDefault) return { unit: analyte.conventionalDefault, source: "convention" };
  const bySystem = system ? analyte.systemUnits?.[system] : undefined;
  if (bySystem) return { unit: bySystem, source: "channel" };
  return {
    problem: (value) => ({
      code: "unit.ambiguous",
      message: `${capitalise(name)} ${value}: no unit — ${unitAdvice(analyte, value)}`,
    }),
  };
}

/** What to write: only units that would make the value plausible, never an implausible one. */
function unitAdvice(analyte: Analyte, text: string): string {
  const value = Number(text);
  const usual = analyte.units.filter((u) => u === "mmol/L" || u === "mg/dL" || u === "g/L" || u === "g/dL");
  const fits = usual.filter((u) => {
    const c = value * toCanonicalFactor(analyte, u)!;
    return isPlausible(analyte, c);
  });
  if (fits.length === 0) return "no unit makes it plausible: check for a typo.";
  const only = fits.length === 1 && usual.length > 1 ? " (the only plausible one)" : "";
  if (analyte.id === "urea")
    return `write mmol/L, or mg/dL with urea or BUN named (BUN is urea nitrogen)${fits.includes("mmol/L") ? "" : "; only mg/dL is plausible"}, or set the channel's units.`;
  return `write ${fits.join(" or ")}${only}, or set the channel's units.`;
}

const MAX_PER_CODE = 3;

/** At most a few problems of each kind, then one line that counts the rest. */
function capped(problems: Problem[]): Problem[] {
  if (problems.length <= MAX_PER_CODE) return problems;
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

/** First letter up, for a Latin letter only ("β-hydroxybutyrate" stays as it is), never in "pH". */
function capitalise(text: string): string {
  return /^[a-z]/.test(text) && !text.startsWith("pH") ? text.charAt(0).toUpperCase() + text.slice(1) : text;
}

function linesWord(lines: number[]): string {
  if (lines.length === 1) return `Line ${lines[0]}`;
  const shown = lines.slice(0, 8).map(String);
  const list =
    lines.length > shown.length
      ? `${shown.join(", ")} and ${lines.length - shown.length} more`
      : listOf(shown);
  return `${lines.length} lines (${list})`;
}

function onLines(lines: number[]): string {
  const unique = [...new Set(lines)];
  return `${linesWord(unique)} ${unique.length === 1 ? "has" : "have"}`;
}

function ordinalColumn(index: number, of: number): string {
  if (index === of - 1) return "last";
  if (index === 0) return "first";
  return `${["first", "second", "third", "fourth", "fifth"][index] ?? `number ${index + 1}`}`;
}

function otherUnitThatFits(analyte: Analyte, value: number, used: Unit): Unit | undefined {
  for (const unit of analyte.units) {
    if (unit === used) continue;
    const c = value * toCanonicalFactor(analyte, unit)!;
    if (isPlausible(analyte, c)) return unit;
  }
  return undefined;
}

/**
 * Same analyte twice: equal values are kept once; different values are a problem and neither is
 * used. A blood-gas value beside a lab one is named by specimen.
 */
function mergeDuplicates(values: ReadValue[], problems: Problem[]): ReadValue[] {
  // Stryker disable next-line all: a fast path for the common case; both branches give the same result
  if (!hasRepeatedKey(values)) return values.length < 2 ? values : values.slice().sort(byKeyOrder);
  const byKey = new Map<InputKey, ReadValue[]>();
  for (const v of values) {
    const list = byKey.get(v.key);
    if (list) list.push(v);
    else byKey.set(v.key, [v]);
  }
  const kept: ReadValue[] = [];
  for (const [key, list] of byKey) {
    const first = list.find((v) => v.specimen === "serum") ?? list[0]!;
    // The same number in the same unit, or the same value in two units (within the rounding of a
    // conversion, 1 %). Two different numbers in one unit are two results, however close.
    const agree = list.every((v) =>
      v.unit === first.unit
        ? v.written === first.written
        : Math.abs(v.canonical - first.canonical) <= 0.01 * Math.max(1, Math.abs(first.canonical)),
    );
    if (agree) {
      kept.push(first);
      continue;
    }
    const specimens = new Set(list.map((v) => v.specimen));
    const name =
      key === "urea" && list.some((v) => v.analyte === "bun") ? "urea and BUN" : ANALYTES[key].name;
    const shown = list.map((v) =>
      `${v.specimen === "bloodGas" ? "blood gas " : specimens.size > 1 ? "lab " : ""}${num(v.written, 6)} ${unitText(v.unit)}`.trim(),
    );
    let extra = "";
    if (key === "sodium" && specimens.has("bloodGas") && specimens.has("serum")) {
      const lab = Math.min(...list.filter((v) => v.specimen === "serum").map((v) => v.canonical));
      const gas = Math.max(...list.filter((v) => v.specimen === "bloodGas").map((v) => v.canonical));
      if (gas - lab >= 4)
        extra =
          " A lab (indirect ISE) sodium well below the blood-gas (direct ISE) one can be pseudohyponatraemia from very high lipids or protein.";
    }
    problems.push({
      code: specimens.size > 1 ? "value.specimenConflict" : "value.conflict",
      message: `${capitalise(name)} given more than once with different values (${shown.join(", ")}): none of them was used. Send the one to calculate with.${extra}`,
    });
  }
  return kept.length < 2 ? kept : kept.sort(byKeyOrder);
}

/** Whether two values share an input (a message holds a handful, so pairs are cheaper than a map). */
function hasRepeatedKey(values: readonly ReadValue[]): boolean {
  for (let i = 1; i < values.length; i++)
    for (let j = 0; j < i; j++) if (values[i]!.key === values[j]!.key) return true;
  return false;
}

const KEY_ORDER = new Map<InputKey, number>(INPUT_KEYS.map((k, i) => [k, i]));
const byKeyOrder = (a: ReadValue, b: ReadValue) => KEY_ORDER.get(a.key)! - KEY_ORDER.get(b.key)!;

function echoOf(values: ReadValue[]): string {
  // Joined with +=: the result stays a rope until a view prints it (the first view does not).
  let echo = "";
  for (let i = 0; i < values.length; i++)
    echo += i === 0 ? echoOfValue(values[i]!) : `, ${echoOfValue(values[i]!)}`;
  return echo;
}

function echoOfValue(v: ReadValue): string {
  const analyte = ANALYTES[v.analyte];
  if (v.unit === "pH") return `pH ${num(v.written, 6)}`;
  const shown = `${analyte.label} ${v.below ? "<" : ""}${num(v.written, 6)} ${v.unit}`;
  const converted =
    v.unit !== analyte.canonicalUnit || v.analyte === "bun"
      ? ` = ${num(v.canonical)} ${analyte.canonicalUnit}${v.analyte === "bun" ? " urea" : ""}`
      : "";
  const specimen = v.specimen === "bloodGas" ? " (blood gas)" : "";
  const range =
    v.key === "measuredOsmolality" && v.labRange?.low !== undefined && v.labRange.high !== undefined
      ? ` (lab range ${num(v.labRange.low)}–${num(v.labRange.high)})`
      : "";
  const source = v.unitSource === "channel" ? " (unit from the channel's setting)" : "";
  return shown + converted + specimen + range + source;
}

/** Writes typed inputs back as a message the reader reads to the same inputs (full precision). */
export function renderInputs(inputs: LabInputs): string {
  return INPUT_KEYS.filter((k) => inputs[k] !== undefined)
    .map((k) => {
      const unit = ANALYTES[k].canonicalUnit;
      const name = k.startsWith("urine")
        ? `urine ${ANALYTE_ALIASES[URINE_BASE[k]!][0]}`
        : ANALYTE_ALIASES[k][0];
      return `${name} ${plain(inputs[k]!)}${unit === "pH" ? "" : ` ${unit}`}`;
    })
    .join(" ");
}

const URINE_BASE: Partial<Record<InputKey, AnalyteId>> = {
  urineSodium: "sodium",
  urinePotassium: "potassium",
  urineOsmolality: "measuredOsmolality",
};

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
