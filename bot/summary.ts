/**
 * The first view of a reply, for a phone: line 1 says what matters most, danger first; line 2
 * the key numbers; then at most three short lines — why, and the next step; then at most two
 * cautions chosen by the findings and the general one, each in one line. Everything else (every
 * finding, the numbers with their formulas, the working, each caution with its source) is one tap
 * away and in the JSON.
 */
import type { Assessment } from "../core/assess.js";
import { CAUTION_PRIORITY, type CautionId, SHORT_CAUTIONS } from "../core/cautions.js";
import type { Finding } from "../core/findings.js";
import { fmt } from "../core/format.js";

export const MAX_WHY = 3;
export const MAX_CAUTIONS = 2;
const WHY_CHARS = 130;

const SHORT: Record<string, (f: Finding) => string> = {
  "hyponatraemia.hypotonic": (f) =>
    f.text.startsWith("Hypotonic in effect") ? "hypotonic in effect" : "hypotonic hyponatraemia",
  "hyponatraemia.isotonic": () => "isotonic hyponatraemia",
  "hyponatraemia.hypertonic": () => "translocational hyponatraemia",
  "hyponatraemia.unclassified": () => "hyponatraemia, not yet classed",
  "pseudohyponatraemia.possible": () => "likely pseudohyponatraemia",
  hypernatraemia: () => "hypernatraemia",
  "tonicity.low": () => "hypotonic",
  "tonicity.normal": () => "tonicity normal",
  "tonicity.high": () => "hypertonic",
  "dka.met": (f) =>
    `DKA criteria met${/\((mild|moderate|severe)/.exec(f.text) ? ` (${/\((mild|moderate|severe)/.exec(f.text)![1]})` : ""}`,
  "dka.undecided": () => "acidosis with high glucose: ketones needed",
  "dka.notMet": () => "DKA criteria not met",
  "hhs.met": () => "HHS criteria met",
  "hhs.notMet": () => "HHS criteria not met",
  "dkaHhs.mixed": () => "mixed DKA and HHS",
  "gap.raised": () => "osmolal gap raised",
  "gap.normal": () => "osmolal gap normal",
  "gap.negative": () => "osmolal gap below −10: recheck the inputs",
  "anionGap.raised": () => "anion gap raised",
  "correction.tooFast": () => "too fast",
  "correction.worsening": () => "worsening",
};

/** A few words for a finding, for the verdict line. */
export function shortOf(f: Finding): string {
  if (f.short) return f.short;
  const known = SHORT[f.code];
  if (known) return known(f);
  const clause = f.text.split(/: |\. /)[0]!;
  return clause.charAt(0).toLowerCase() + clause.slice(1);
}

const capitalise = (t: string) => {
  const c = t.charCodeAt(0);
  return c >= 97 && c <= 122 ? t.charAt(0).toUpperCase() + t.slice(1) : t;
};

/** The main finding when there is no danger, in this order of weight. */
const MAIN_ORDER = [
  "pseudohyponatraemia.possible",
  "hyponatraemia.hypotonic",
  "hyponatraemia.hypertonic",
  "hyponatraemia.isotonic",
  "dka.undecided",
  "correction.windowOpen",
  "hyponatraemia.unclassified",
  "hypernatraemia",
  "tonicity.low",
  "tonicity.high",
  "anionGap.raised",
  "tonicity.normal",
];

/** The findings the verdict says: every danger (up to three), else the main one and the gap's state. */
export function verdictFindings(findings: readonly Finding[]): Finding[] {
  const dangers = findings.filter((f) => f.severity === "danger");
  if (dangers.length > 0) return dangers.slice(0, 3);
  const main =
    MAIN_ORDER.map((code) => findings.find((f) => f.code === code)).find(Boolean) ??
    findings.find((f) => f.severity === "warning" && !f.code.startsWith("gap.")) ??
    findings.find((f) => !f.code.startsWith("gap."));
  const gap = findings.find(
    (f) => f.code === "gap.raised" || f.code === "gap.normal" || f.code === "gap.negative",
  );
  return [main, gap].filter((f): f is Finding => f !== undefined);
}

/** Line 1: what matters most, danger first. */
export function verdictOf(
  findings: readonly Finding[],
  used = verdictFindings(findings),
): string | undefined {
  if (used.length === 0) return undefined;
  const dangers = findings.filter((f) => f.severity === "danger").length;
  const more = dangers > 3 ? `, and ${dangers - 3} more` : "";
  return capitalise(`${used.map(shortOf).join("; ")}${more}`);
}

/** Line 2: the computed numbers, compact; formula names only where two methods disagree enough. */
export function keyNumbersOf(a: Assessment): string | undefined {
  const r = a.results;
  const parts: string[] = [];
  if (r.calculatedOsmolality) parts.push(`calculated ${fmt(r.calculatedOsmolality.value)}`);
  if (r.effectiveOsmolality) parts.push(`effective ${fmt(r.effectiveOsmolality.value)}`);
  if (r.osmolalGap) parts.push(`gap ${fmt(r.osmolalGap.value).replace("-", "−")}`);
  const osm = parts.length > 0 ? `${parts.join(" · ")} mOsm/kg` : "";
  const more: string[] = [];
  // The corrected sodium only where glucose moves it by a whole mmol/L or more.
  if (
    r.correctedSodium &&
    a.inputs.sodium !== undefined &&
    r.correctedSodium.hillier.value - a.inputs.sodium >= 1
  ) {
    const k = fmt(r.correctedSodium.katz.value);
    const h = fmt(r.correctedSodium.hillier.value);
    more.push(k === h ? `corrected Na ${k}` : `corrected Na ${k}–${h}`);
  }
  const ag = a.alternatives.find((x) => x.id === "anionGap.albuminCorrected") ?? r.anionGap;
  if (ag)
    more.push(
      `${ag.id === "anionGap.albuminCorrected" ? "albumin-corrected anion gap" : "anion gap"} ${fmt(ag.value)}`,
    );
  const line = [osm, ...more].filter(Boolean).join(" · ");
  return line || undefined;
}

/** Findings whose every point the verdict already makes: not repeated below it. */
const SAID_BY_VERDICT = new Set(["critical.value", "tonicity.normal", "hypernatraemia"]);
/** Said by the key numbers and the verdict: never a why line of its own. */
const NEVER_WHY = new Set(["gap.normal", "gap.raised"]);

/** The first sentence of a text, and a "Next:" sentence after it when both fit. */
function brief(text: string): string {
  const sentences = text.split(/(?<=\.)\s+(?=[A-Z])/);
  let out = sentences[0]!;
  const next = sentences.find((s) => /^(Next|Recheck|Send|Stop|Slow)\b/.test(s));
  if (next && next !== out && out.length + next.length + 1 <= WHY_CHARS) out = `${out} ${next}`;
  return out.length <= WHY_CHARS ? out : `${out.slice(0, WHY_CHARS - 1)}…`;
}

/** Up to three lines: why, and the next step — what the verdict line has not said already. */
export function whyOf(findings: readonly Finding[], said = verdictFindings(findings)): string[] {
  const used = new Set(said);
  const worth = findings.filter(
    (f) =>
      !(used.has(f) && SAID_BY_VERDICT.has(f.code)) &&
      !NEVER_WHY.has(f.code) &&
      (f.severity !== "info" ||
        f.code === "hyponatraemia.nextStep" ||
        f.code.startsWith("urine.") ||
        f.code === "correction.windowOpen"),
  );
  return worth.slice(0, MAX_WHY).map((f) => f.brief ?? brief(f.text));
}

/** At most two cautions that fit the findings, then the general one, each in one line. */
export function visibleCautionsOf(ids: readonly CautionId[]): string[] {
  const chosen = CAUTION_PRIORITY.filter((id) => ids.includes(id)).slice(0, MAX_CAUTIONS);
  return [...chosen.map((id) => SHORT_CAUTIONS[id]), SHORT_CAUTIONS.general];
}
