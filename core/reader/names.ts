/**
 * The table of names: every alias of an analyte, a claimed result, a test we do not use, or a
 * specimen, and the longest-first phrase match over a line's words.
 */
import type { AnalyteId, Specimen } from "../analytes.js";
import type { Lexeme } from "./lexer.js";
import {
  ANALYTE_ALIASES,
  BLOOD_GAS_ALIASES,
  CLAIM_ALIASES,
  type ClaimKind,
  OTHER_TESTS,
  SPECIMEN_WORDS,
} from "./vocabulary.js";

export type NameEntry =
  | { kind: "analyte"; id: AnalyteId; specimen?: Specimen }
  | { kind: "claim"; id: ClaimKind }
  | { kind: "other"; name: string }
  | { kind: "specimen"; specimen: Specimen };

const PHRASES = new Map<string, NameEntry>();
const URINE_IDS = new Set<AnalyteId>(["urineOsmolality", "urineSodium", "urinePotassium"]);
for (const [id, aliases] of Object.entries(ANALYTE_ALIASES) as [AnalyteId, readonly string[]][]) {
  for (const alias of aliases)
    PHRASES.set(
      alias,
      URINE_IDS.has(id) ? { kind: "analyte", id, specimen: "urine" } : { kind: "analyte", id },
    );
}
for (const [id, aliases] of Object.entries(BLOOD_GAS_ALIASES) as [AnalyteId, readonly string[]][]) {
  for (const alias of aliases) PHRASES.set(alias, { kind: "analyte", id, specimen: "bloodGas" });
}
for (const [id, aliases] of Object.entries(CLAIM_ALIASES) as [ClaimKind, readonly string[]][]) {
  for (const alias of aliases) PHRASES.set(alias, { kind: "claim", id });
}
for (const [name, aliases] of Object.entries(OTHER_TESTS)) {
  for (const alias of aliases) if (!PHRASES.has(alias)) PHRASES.set(alias, { kind: "other", name });
}
for (const [specimen, words] of Object.entries(SPECIMEN_WORDS) as [Specimen, readonly string[]][]) {
  for (const word of words) if (!PHRASES.has(word)) PHRASES.set(word, { kind: "specimen", specimen });
}

let longest = 1;
for (const key of PHRASES.keys()) longest = Math.max(longest, key.split(" ").length);
const STARTS = new Set([...PHRASES.keys()].filter((k) => k.includes(" ")).map((k) => k.split(" ")[0]!));

/** Whether a single word is a name of anything in the table (the lexer asks, to split "Na128"). */
export function isName(lower: string): boolean {
  return PHRASES.has(lower);
}

/** Whether a word can start a name that a number may be glued to: an analyte, claim or test. */
export function isGlueHead(lower: string): boolean {
  const entry = PHRASES.get(lower);
  return entry !== undefined && entry.kind !== "specimen";
}

export function entryOf(lower: string): NameEntry | undefined {
  return PHRASES.get(lower);
}

export interface NameMatch {
  entry: NameEntry;
  /** Lexeme indexes, inclusive. */
  first: number;
  last: number;
}

/** Every name in a line's lexemes, longest phrase first; phrases run over adjacent words only. */
export function matchNames(lexemes: readonly Lexeme[]): NameMatch[] {
  const out: NameMatch[] = [];
  for (let i = 0; i < lexemes.length; i++) {
    const a = lexemes[i]!;
    if (a.kind !== "word") continue;
    let match: NameMatch | undefined;
    if (STARTS.has(a.lower)) {
      let phrase = a.lower;
      for (let n = 2; n <= longest && i + n - 1 < lexemes.length; n++) {
        const next = lexemes[i + n - 1]!;
        if (next.kind !== "word") break;
        phrase = `${phrase} ${next.lower}`;
        const entry = PHRASES.get(phrase);
        if (entry) match = { entry, first: i, last: i + n - 1 };
      }
    }
    if (!match) {
      const entry = PHRASES.get(a.lower);
      if (entry) match = { entry, first: i, last: i };
    }
    if (match) {
      out.push(match);
      i = match.last;
    }
  }
  return out;
}
