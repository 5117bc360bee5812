/**
 * Findings: every interpretation the engine makes, as a stable code, a severity and a text. The
 * codes are documented in the README and are what tests, the shift log and the renderers match.
 */
export type Severity = "danger" | "warning" | "info";

export interface Finding {
  code: string;
  severity: Severity;
  text: string;
  /** What a general code is about, e.g. "sodium.low" for critical.value. */
  subject?: string;
  /** A few words for a reply's first line, when the text's first clause would not do. */
  short?: string;
  /** One short line for the first view (why, and the next step), when the text is long. */
  brief?: string;
}

const ORDER: Record<Severity, number> = { danger: 0, warning: 1, info: 2 };

/** Danger first, then warnings, then information; stable within a severity. */
export function sortFindings(findings: readonly Finding[]): Finding[] {
  // Array.prototype.sort is stable (ES2019): findings of one severity keep their order.
  return findings.length < 2
    ? [...findings]
    : [...findings].sort((a, b) => ORDER[a.severity] - ORDER[b.severity]);
}

/** Pairs of codes that contradict each other: no reply may carry both. */
export const EXCLUSIVE: readonly (readonly [string, string])[] = [
  ["hyponatraemia.hypotonic", "hyponatraemia.isotonic"],
  ["hyponatraemia.hypotonic", "hyponatraemia.hypertonic"],
  ["hyponatraemia.isotonic", "hyponatraemia.hypertonic"],
  ["hyponatraemia.unclassified", "hyponatraemia.hypotonic"],
  ["hyponatraemia.unclassified", "hyponatraemia.isotonic"],
  ["hyponatraemia.unclassified", "hyponatraemia.hypertonic"],
  ["osmolality.ineffectiveExcess", "hyponatraemia.hypertonic"],
  ["pseudohyponatraemia.possible", "toxicAlcohol.possible"],
  ["pseudohyponatraemia.possible", "hyponatraemia.hypotonic"],
  ["gap.raised", "gap.normal"],
  ["gap.raised", "gap.negative"],
  ["gap.normal", "gap.negative"],
  ["anionGap.raised", "anionGap.normal"],
  ["tonicity.low", "tonicity.high"],
  ["tonicity.low", "tonicity.normal"],
  ["tonicity.high", "tonicity.normal"],
  ["hhs.met", "hhs.notMet"],
  ["dkaHhs.mixed", "hhs.notMet"],
  ["dka.met", "dka.notMet"],
  ["dka.met", "dka.undecided"],
  ["dka.notMet", "dka.undecided"],
  ["urine.dilute", "urine.lowSodium"],
  ["urine.dilute", "urine.highSodium"],
  ["urine.lowSodium", "urine.highSodium"],
  ["correction.tooFast", "correction.withinLimits"],
  ["correction.worsening", "correction.withinLimits"],
  ["correction.worsening", "correction.tooFast"],
];

/** The contradicting pairs present in a list of codes (empty when the reading is coherent). */
export function contradictions(codes: readonly string[]): [string, string][] {
  const set = new Set(codes);
  return EXCLUSIVE.filter(([a, b]) => set.has(a) && set.has(b)).map(([a, b]) => [a, b]);
}
