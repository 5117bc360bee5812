/**
 * The engine's one entry point: typed inputs in, every result that can be computed out, with the
 * interpretation, flags and cautions that go with them. Pure: no I/O.
 */
import { ANALYTES } from "./analytes.js";
import { CAUTIONS, type CautionId } from "./cautions.js";
import { fmt, num } from "./format.js";
import {
  albuminCorrectedAnionGap,
  anionGap,
  calculatedOsmolality,
  calculatedOsmolalityEthanolPurssell,
  correctedSodium,
  dorwartChalmers,
  effectiveOsmolality,
  glucoseMgPerDl,
  hooperOlderAdults,
  impliedConcentration,
  osmolalGap,
  withPotassium,
} from "./formulas.js";
import type { InputKey, LabInputs } from "./inputs.js";
import type { Result } from "./results.js";

export interface Range {
  low: number;
  high: number;
}

export interface AssessOptions {
  /** Reference range for osmolality, mOsm/kg. Lab-specific; 275–295 is the common teaching range. */
  osmolalityRange?: Range;
}

export const DEFAULT_OSMOLALITY_RANGE: Range = { low: 275, high: 295 };
/** Usual upper limit of a normal osmolal gap [common practice]. */
export const GAP_LIMIT = 10;
/** Hyponatraemia and hypernatraemia thresholds, mmol/L [common practice]. */
export const SODIUM_LOW = 135;
export const SODIUM_HIGH = 145;
/** HHS glucose criterion, mg/dL (Umpierrez et al., Diabetes Care 2024). */
export const HHS_GLUCOSE_MG_DL = 600;

export type FindingLevel = "info" | "warning" | "critical";

export interface Finding {
  code: string;
  level: FindingLevel;
  text: string;
}

export interface Assessment {
  inputs: LabInputs;
  results: {
    calculatedOsmolality?: Result;
    effectiveOsmolality?: Result;
    osmolalGap?: Result;
    anionGap?: Result;
    correctedSodium?: { katz: Result; hillier: Result };
  };
  /** Other formulas and variants, shown in the working. */
  alternatives: Result[];
  findings: Finding[];
  cautions: string[];
}

const ALCOHOL_KEYS = [
  "methanol",
  "ethyleneGlycol",
  "isopropanol",
  "acetone",
  "propyleneGlycol",
  "mannitol",
] as const;

export function assess(inputs: LabInputs, options: AssessOptions = {}): Assessment {
  const range = options.osmolalityRange ?? DEFAULT_OSMOLALITY_RANGE;
  const findings: Finding[] = [];
  const cautions = new Set<CautionId>();
  const alternatives: Result[] = [];
  const push = (r: Result | undefined) => r && alternatives.push(r);

  const calculated = calculatedOsmolality(inputs);
  const effective = effectiveOsmolality(inputs);
  const gap = osmolalGap(inputs, calculated);
  const ag = anionGap(inputs);
  const katz = correctedSodium(inputs, "katz");
  const hillier = correctedSodium(inputs, "hillier");

  // Alternatives, each named.
  const purssell = calculatedOsmolalityEthanolPurssell(inputs);
  push(purssell);
  const dc = dorwartChalmers(inputs);
  push(dc);
  push(withPotassium(inputs));
  push(hooperOlderAdults(inputs));
  if (gap && inputs.ethanol !== undefined) {
    const noEthanol = calculatedOsmolality({ ...inputs, ethanol: undefined });
    push(osmolalGap(inputs, noEthanol, "osmolalGap.withoutEthanol"));
    push(osmolalGap(inputs, purssell, "osmolalGap.ethanol125"));
  }
  push(osmolalGap(inputs, dc, "osmolalGap.dorwartChalmers"));
  push(anionGap(inputs, true));
  push(albuminCorrectedAnionGap(inputs));

  flagCritical(inputs, findings, cautions);
  if (effective) classifyTonicity(effective, range, findings);
  classifySodium(inputs, effective, range, findings, cautions);
  if (gap) readGap(inputs, gap, alternatives, findings, cautions);
  if (ag) readAnionGap(ag, gap, alternatives, findings);
  if (katz && hillier && inputs.glucose !== undefined && glucoseMgPerDl(inputs.glucose) > 100) {
    cautions.add("glucoseCorrection");
  }
  readHhs(inputs, effective, calculated, findings, cautions);
  if (inputs.ethanol !== undefined) cautions.add("ethanolFactor");

  const results: Assessment["results"] = {};
  if (calculated) results.calculatedOsmolality = calculated;
  if (effective) results.effectiveOsmolality = effective;
  if (gap) results.osmolalGap = gap;
  if (ag) results.anionGap = ag;
  if (katz && hillier) results.correctedSodium = { katz, hillier };
  const texts: string[] = [];
  for (const id of cautions) texts.push(CAUTIONS[id]);
  texts.push(CAUTIONS.general);
  return { inputs, results, alternatives, findings, cautions: texts };
}

function flagCritical(inputs: LabInputs, findings: Finding[], cautions: Set<CautionId>): void {
  for (const key of ["sodium", "potassium", "glucose"] as const satisfies InputKey[]) {
    const value = inputs[key];
    const critical = ANALYTES[key].critical;
    if (value === undefined || !critical) continue;
    const shown = key === "glucose" ? `${fmt(glucoseMgPerDl(value), 0)} mg/dL` : `${num(value)} mmol/L`;
    if (critical.low !== undefined && value < critical.low) {
      findings.push({
        code: `critical.${key}.low`,
        level: "critical",
        text: `Critical low ${ANALYTES[key].name}: ${shown}.`,
      });
      cautions.add("criticalValue");
    } else if (critical.high !== undefined && value > critical.high) {
      findings.push({
        code: `critical.${key}.high`,
        level: "critical",
        text: `Critical high ${ANALYTES[key].name}: ${shown}.`,
      });
      cautions.add("criticalValue");
    }
  }
}

function classifyTonicity(effective: Result, range: Range, findings: Finding[]): void {
  const v = effective.value;
  const where = `${range.low}–${range.high}`;
  if (v < range.low) {
    findings.push({
      code: "tonicity.low",
      level: "warning",
      text: `Effective osmolality ${fmt(v)} is below ${where}: hypotonic.`,
    });
  } else if (v > range.high) {
    findings.push({
      code: "tonicity.high",
      level: "warning",
      text: `Effective osmolality ${fmt(v)} is above ${where}: hypertonic.`,
    });
  } else {
    findings.push({
      code: "tonicity.normal",
      level: "info",
      text: `Effective osmolality ${fmt(v)} is within ${where}.`,
    });
  }
}

/** Hyponatraemia classed by measured osmolality (or by effective osmolality when none was measured). */
function classifySodium(
  inputs: LabInputs,
  effective: Result | undefined,
  range: Range,
  findings: Finding[],
  cautions: Set<CautionId>,
): void {
  const na = inputs.sodium;
  if (na === undefined) return;
  if (na > SODIUM_HIGH) {
    findings.push({
      code: "sodium.high",
      level: "warning",
      text: `Hypernatraemia (Na ${num(na)} > ${SODIUM_HIGH}): always hypertonic.`,
    });
    return;
  }
  if (na >= SODIUM_LOW) return;
  const measured = inputs.measuredOsmolality;
  if (measured === undefined) {
    const by = effective ? ` Effective osmolality is ${fmt(effective.value)}.` : "";
    findings.push({
      code: "sodium.low.unclassified",
      level: "warning",
      text: `Hyponatraemia (Na ${num(na)}). No measured osmolality given, so it is not classed as hypotonic, isotonic or hypertonic.${by}`,
    });
    return;
  }
  if (measured < range.low) {
    findings.push({
      code: "sodium.low.hypotonic",
      level: "warning",
      text: `Hypotonic hyponatraemia: Na ${num(na)} with measured osmolality ${num(measured)} < ${range.low}.`,
    });
  } else if (measured <= range.high) {
    findings.push({
      code: "sodium.low.isotonic",
      level: "warning",
      text: `Hyponatraemia with normal measured osmolality (${num(measured)}): consider pseudohyponatraemia (lipids, proteins) — recheck the sodium on a blood-gas analyser.`,
    });
    cautions.add("pseudohyponatraemia");
  } else if (effective && effective.value < range.low) {
    findings.push({
      code: "sodium.low.ineffectiveOsmoles",
      level: "warning",
      text: `Measured osmolality ${num(measured)} is high but effective osmolality ${fmt(effective.value)} is low: the excess is urea or alcohol, which cross cell membranes — the cells still see a hypotonic plasma.`,
    });
  } else {
    findings.push({
      code: "sodium.low.hypertonic",
      level: "warning",
      text: `Hypertonic (translocational) hyponatraemia: measured osmolality ${num(measured)} > ${range.high}; glucose, mannitol or another effective solute draws water out of cells.`,
    });
  }
}

function readGap(
  inputs: LabInputs,
  gap: Result,
  alternatives: Result[],
  findings: Finding[],
  cautions: Set<CautionId>,
): void {
  cautions.add("gapNormalDoesNotExclude");
  cautions.add("gapTimeCourse");
  cautions.add("gapFormulaDependent");
  cautions.add("osmometerMethod");
  const g = gap.value;
  const afterEthanol = inputs.ethanol !== undefined ? " after ethanol" : "";
  if (g < -GAP_LIMIT) {
    findings.push({
      code: "gap.negative",
      level: "warning",
      text: `Osmolal gap ${fmt(g)} is well below zero: measured lower than calculated usually means a unit, entry or sample error — recheck the inputs.`,
    });
  } else if (g < GAP_LIMIT) {
    findings.push({
      code: "gap.normal",
      level: "info",
      text: `Osmolal gap${afterEthanol} ${fmt(g)} is within the usual < ${GAP_LIMIT}.`,
    });
  } else {
    findings.push({
      code: "gap.raised",
      level: "warning",
      text: `Osmolal gap${afterEthanol} ${fmt(g)} is raised: ${GAP_LIMIT} or more (the usual limit; Hoffman 1993 found −2 ± 6; Krasowski 2012 used > 14).`,
    });
    cautions.add("gapOtherCauses");
  }

  if (inputs.ethanol !== undefined) {
    const without = alternatives.find((r) => r.id === "osmolalGap.withoutEthanol");
    const by125 = alternatives.find((r) => r.id === "osmolalGap.ethanol125");
    if (without && without.value >= GAP_LIMIT && g < GAP_LIMIT) {
      findings.push({
        code: "gap.explainedByEthanol",
        level: "info",
        text: `Ethanol explains the gap: ${fmt(without.value)} before it, ${fmt(g)} after.`,
      });
    }
    if (by125 && g >= GAP_LIMIT !== by125.value >= GAP_LIMIT) {
      findings.push({
        code: "gap.dependsOnEthanolFactor",
        level: "warning",
        text: `Whether the gap is raised depends on the ethanol factor: ${fmt(g)} with mg/dL ÷ 4.61, ${fmt(by125.value)} with ÷ 3.7.`,
      });
    }
  }

  // Alcohols measured directly account for part of the gap (about 1 mOsm/kg per mmol/L).
  let known = 0;
  const named: string[] = [];
  for (const key of ALCOHOL_KEYS) {
    const v = inputs[key];
    if (v !== undefined && v > 0) {
      known += v;
      named.push(`${ANALYTES[key].name} ${num(v)} mmol/L`);
    }
  }
  let residual = g;
  if (named.length > 0) {
    residual = g - known;
    findings.push({
      code: "gap.measuredAlcohols",
      level: "info",
      text: `Measured ${named.join(", ")} account for about ${fmt(known)} of the gap; ${fmt(residual)} is left unexplained.`,
    });
  }
  if (residual >= GAP_LIMIT) {
    const implied = (["methanol", "ethyleneGlycol", "isopropanol", "propyleneGlycol"] as const).map(
      (alcohol) => impliedConcentration(residual, alcohol),
    );
    alternatives.push(...implied);
    const list = implied.map((r) => `${r.label.split(" if ")[0]} about ${fmt(r.value, 0)}`).join(", ");
    findings.push({
      code: "gap.impliedConcentrations",
      level: "info",
      text: `If one alcohol alone made the residual gap of ${fmt(residual)}: ${list} mg/dL.`,
    });
  }
}

function readAnionGap(
  ag: Result,
  gap: Result | undefined,
  alternatives: Result[],
  findings: Finding[],
): void {
  const corrected = alternatives.find((r) => r.id === "anionGap.albuminCorrected");
  const v = corrected?.value ?? ag.value;
  const label = corrected ? "Albumin-corrected anion gap" : "Anion gap";
  findings.push({
    code: "anionGap.value",
    level: "info",
    text: `${label} ${fmt(v)} mmol/L. Ranges depend on the analyser: about 3–11 on modern ion-selective methods, 8–16 on older ones — use your lab's range.`,
  });
  if (!gap) return;
  const osmRaised = gap.value >= GAP_LIMIT;
  const agRaised = v > 11;
  if (osmRaised && !agRaised) {
    findings.push({
      code: "pattern.earlyAlcohol",
      level: "warning",
      text: "High osmolal gap with an anion gap that is not raised fits an early toxic alcohol ingestion, before it is metabolised (Kraut & Kurtz 2008).",
    });
  } else if (osmRaised && agRaised) {
    findings.push({
      code: "pattern.bothRaised",
      level: "warning",
      text: "Both gaps raised: toxic alcohol being metabolised, or ketoacidosis, lactic acidosis or renal failure (Kraut & Kurtz 2008).",
    });
  } else if (!osmRaised && agRaised) {
    findings.push({
      code: "pattern.lateAlcohol",
      level: "info",
      text: "Raised anion gap with a normal osmolal gap: a late toxic alcohol presentation is still possible once it is metabolised (Kraut & Kurtz 2008).",
    });
  }
}

function readHhs(
  inputs: LabInputs,
  effective: Result | undefined,
  calculated: Result | undefined,
  findings: Finding[],
  cautions: Set<CautionId>,
): void {
  if (inputs.glucose === undefined || !effective) return;
  const mg = glucoseMgPerDl(inputs.glucose);
  if (mg < HHS_GLUCOSE_MG_DL) return;
  cautions.add("hhsKetones");
  const total = inputs.measuredOsmolality ?? calculated?.value;
  const totalName = inputs.measuredOsmolality !== undefined ? "measured" : "calculated";
  const met2024 = effective.value > 300 || (total !== undefined && total > 320);
  const met2009 = effective.value > 320;
  const metJbds = calculated !== undefined && calculated.value >= 320;
  const totalText = total !== undefined ? `, ${totalName} osmolality ${fmt(total)}` : "";
  findings.push({
    code: met2024 ? "hhs.osmolalityMet" : "hhs.osmolalityNotMet",
    level: met2024 ? "warning" : "info",
    text:
      `Glucose ${fmt(mg, 0)} mg/dL (≥ 600). 2024 consensus (effective > 300 or total > 320): ${met2024 ? "met" : "not met"} — effective ${fmt(effective.value)}${totalText}. ` +
      `ADA 2009 (effective > 320): ${met2009 ? "met" : "not met"}.` +
      (calculated ? ` UK JBDS 2023 (2·Na + glucose + urea ≥ 320): ${metJbds ? "met" : "not met"}.` : ""),
  });
}
