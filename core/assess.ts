/**
 * The engine's one entry point: typed inputs in, every result that can be computed out, with one
 * coherent reading of them as findings (codes, severities, texts) and the cautions that go with
 * them. Pure: no I/O. The readings themselves live beside it: tonicity.ts (tonicity and the class
 * of a hyponatraemia), crisis.ts (DKA, HHS, mixed), workup.ts (urine studies), and the osmolal and
 * anion gaps here.
 */
import { ANALYTES } from "./analytes.js";
import { CAUTIONS, type CautionId } from "./cautions.js";
import { readCrisis } from "./crisis.js";
import { type Finding, sortFindings } from "./findings.js";
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
import { GAP_LIMIT, type Range, readTonicity } from "./tonicity.js";
import type { Unit } from "./units.js";
import { readWorkup } from "./workup.js";

export type { Finding, Severity } from "./findings.js";
export { GAP_LIMIT, type Range, SODIUM_HIGH, SODIUM_LOW } from "./tonicity.js";

export interface AssessOptions {
  /** Reference range for measured osmolality, mOsm/kg. Lab-specific; 275–295 is the common teaching range. */
  osmolalityRange?: Range;
  /** Reference interval for the anion gap, mmol/L: analyser-specific (REFERENCES §2a). */
  anionGapRange?: Range;
  /** The glucose as written, so each glucose criterion is compared in its own unit. */
  glucoseWritten?: { value: number; unit: Unit };
  /** The channel's unit system: texts show its units first. */
  unitSystem?: "si" | "conventional";
}

export const DEFAULT_OSMOLALITY_RANGE: Range = { low: 275, high: 295 };
/**
 * About 3–11 mmol/L on modern ion-selective analysers, 8–16 on older methods (Kraut & Madias,
 * CJASN 2007, from memory [M]); the default is the modern one, set per lab.
 */
export const DEFAULT_ANION_GAP_RANGE: Range = { low: 3, high: 11 };
/** HHS glucose criterion, mg/dL (Umpierrez et al., Diabetes Care 2024). */
export const HHS_GLUCOSE_MG_DL = 600;

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
  /** Sorted: danger first. */
  findings: Finding[];
  cautions: string[];
  /** The same cautions by id (the general one last), so a renderer can choose and shorten them. */
  cautionIds: CautionId[];
}

const ALCOHOL_KEYS = ["methanol", "ethyleneGlycol", "isopropanol", "acetone", "propyleneGlycol"] as const;

export function assess(inputs: LabInputs, options: AssessOptions = {}): Assessment {
  const range = options.osmolalityRange ?? DEFAULT_OSMOLALITY_RANGE;
  const agRange = options.anionGapRange ?? DEFAULT_ANION_GAP_RANGE;
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
  const noEthanol =
    inputs.ethanol !== undefined ? calculatedOsmolality({ ...inputs, ethanol: undefined }) : calculated;
  if (gap && inputs.ethanol !== undefined) {
    push(osmolalGap(inputs, noEthanol, "osmolalGap.withoutEthanol"));
    push(osmolalGap(inputs, purssell, "osmolalGap.ethanol125"));
  }
  push(osmolalGap(inputs, dc, "osmolalGap.dorwartChalmers"));
  push(anionGap(inputs, true));
  const agCorrected = albuminCorrectedAnionGap(inputs);
  push(agCorrected);

  const si = options.unitSystem === "si";
  flagCritical(inputs, findings, cautions, si);
  const tonicity = readTonicity(inputs, gap?.value, range, si);
  findings.push(...tonicity.findings);
  if (tonicity.pseudo) cautions.add("pseudohyponatraemia");

  // Built in one shape, each field possibly undefined: a conditional spread is slow on the hot path.
  const crisis = readCrisis({
    inputs,
    glucoseWritten: options.glucoseWritten,
    effective: effective?.value,
    calculatedNoEthanol: noEthanol?.value,
    calculatedWithEthanol: inputs.ethanol !== undefined ? calculated?.value : undefined,
    gap: gap?.value,
  });
  findings.push(...crisis);
  const ketoacidosis = crisis.some(
    (f) => f.code === "dka.met" || f.code === "dka.undecided" || f.code === "dkaHhs.mixed",
  );

  let residual: number | undefined;
  if (gap)
    residual = readGap(inputs, gap, alternatives, findings, cautions, tonicity.pseudo, ketoacidosis, si);
  if (ag)
    readAnionGap(
      ag,
      agCorrected,
      agRange,
      residual,
      findings,
      cautions,
      tonicity.pseudo,
      ketoacidosis,
      inputs,
    );
  const hypotonic = tonicity.findings.some((f) => f.code === "hyponatraemia.hypotonic");
  findings.push(...readWorkup(inputs, hypotonic));

  if (katz && hillier && inputs.glucose !== undefined && glucoseMgPerDl(inputs.glucose) > 100) {
    cautions.add("glucoseCorrection");
  }
  if (inputs.ethanol !== undefined) cautions.add("ethanolFactor");

  const results: Assessment["results"] = {};
  if (calculated) results.calculatedOsmolality = calculated;
  if (effective) results.effectiveOsmolality = effective;
  if (gap) results.osmolalGap = gap;
  if (ag) results.anionGap = ag;
  if (katz && hillier) results.correctedSodium = { katz, hillier };
  const cautionIds: CautionId[] = [...cautions, "general"];
  return {
    inputs,
    results,
    alternatives,
    findings: sortFindings(findings),
    cautions: cautionIds.map((id) => CAUTIONS[id]),
    cautionIds,
  };
}

function flagCritical(inputs: LabInputs, findings: Finding[], cautions: Set<CautionId>, si: boolean): void {
  for (const key of ["sodium", "potassium", "glucose"] as const satisfies InputKey[]) {
    const value = inputs[key];
    const critical = ANALYTES[key].critical;
    if (value === undefined || !critical) continue;
    const low = critical.low !== undefined && value < critical.low;
    const high = critical.high !== undefined && value > critical.high;
    if (!low && !high) continue;
    const shown =
      key !== "glucose"
        ? `${num(value)} mmol/L`
        : si
          ? `${num(value, 1)} mmol/L (${fmt(glucoseMgPerDl(value), 0)} mg/dL)`
          : `${fmt(glucoseMgPerDl(value), 0)} mg/dL (${num(value, 1)} mmol/L)`;
    findings.push({
      code: "critical.value",
      severity: "danger",
      subject: `${key}.${low ? "low" : "high"}`,
      text: `Critical ${low ? "low" : "high"} ${ANALYTES[key].name}: ${shown}.`,
      short: `critical ${low ? "low" : "high"} ${ANALYTES[key].name} ${shown.split(" (")[0]}`,
    });
    cautions.add("criticalValue");
  }
}

/** Reads the osmolal gap; returns the gap left after measured alcohols (the residual). */
function readGap(
  inputs: LabInputs,
  gap: Result,
  alternatives: Result[],
  findings: Finding[],
  cautions: Set<CautionId>,
  pseudo: boolean,
  ketoacidosis: boolean,
  si: boolean,
): number {
  cautions.add("gapFormulaDependent");
  const g = gap.value;
  const afterEthanol = inputs.ethanol !== undefined ? " after ethanol" : "";
  if (g < -GAP_LIMIT) {
    findings.push({
      code: "gap.negative",
      severity: "warning",
      text: `Osmolal gap ${fmt(g)} is well below zero: measured lower than calculated usually means a unit, entry or sample error — recheck the inputs.`,
      brief: `Osmolal gap ${fmt(g)}: measured below calculated — usually a unit, entry or sample error.`,
    });
  } else if (g < GAP_LIMIT) {
    findings.push({
      code: "gap.normal",
      severity: "info",
      text: `Osmolal gap${afterEthanol} ${fmt(g)} is within the usual < ${GAP_LIMIT}.`,
    });
    cautions.add("gapNormalDoesNotExclude");
  } else {
    findings.push({
      code: "gap.raised",
      severity: "warning",
      text: `Osmolal gap${afterEthanol} ${fmt(g)} is raised: ${GAP_LIMIT} or more (the usual limit; Hoffman 1993 found −2 ± 6; Krasowski 2012 used > 14).`,
      brief: `Osmolal gap${afterEthanol} ${fmt(g)} is raised (usual limit: below ${GAP_LIMIT}).`,
    });
  }

  if (inputs.ethanol !== undefined) {
    const without = alternatives.find((r) => r.id === "osmolalGap.withoutEthanol");
    const by125 = alternatives.find((r) => r.id === "osmolalGap.ethanol125");
    if (without && without.value >= GAP_LIMIT && g < GAP_LIMIT) {
      findings.push({
        code: "gap.explainedByEthanol",
        severity: "info",
        text: `Ethanol explains the gap: ${fmt(without.value)} before it, ${fmt(g)} after.`,
      });
    }
    if (by125 && g >= GAP_LIMIT !== by125.value >= GAP_LIMIT) {
      findings.push({
        code: "gap.dependsOnEthanolFactor",
        severity: "warning",
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
  if (inputs.mannitol !== undefined && inputs.mannitol > 0) {
    known += inputs.mannitol;
    named.push(`mannitol ${num(inputs.mannitol)} mmol/L`);
  }
  let residual = g;
  if (named.length > 0) {
    residual = g - known;
    findings.push({
      code: "gap.measuredAlcohols",
      severity: "info",
      text: `Measured ${named.join(", ")} account for about ${fmt(known)} of the gap; ${fmt(residual)} is left unexplained.`,
    });
  }
  if (residual >= GAP_LIMIT && !pseudo) {
    cautions.add("gapTimeCourse");
    cautions.add("osmometerMethod");
    cautions.add("gapOtherCauses");
    const implied = (["methanol", "ethyleneGlycol", "isopropanol", "propyleneGlycol"] as const).map(
      (alcohol) => impliedConcentration(residual, alcohol),
    );
    alternatives.push(...implied);
    // In SI units one mmol/L of any alcohol is about one mOsm/kg: the residual gap itself.
    const list = si
      ? `about ${fmt(residual, 0)} mmol/L of methanol, ethylene glycol, isopropanol or propylene glycol (${implied
          .map((r) => `${r.label.split(" ")[0]} ${fmt(r.value, 0)}`)
          .join(", ")}`
      : implied.map((r) => `${r.label.split(" if ")[0]} about ${fmt(r.value, 0)}`).join(", ");
    findings.push({
      code: "toxicAlcohol.possible",
      severity: ketoacidosis ? "warning" : "danger",
      text: ketoacidosis
        ? `A toxic alcohol stays in the differential: an unexplained osmolal gap of ${fmt(residual)}, though ketoacidosis raises the gap too. If one alcohol alone made it: ${list} mg/dL${si ? ")" : ""}.`
        : `Toxic alcohol possible: unexplained osmolal gap of ${fmt(residual)}. If one alcohol alone made it: ${list} mg/dL${si ? ")" : ""}. Next: methanol and ethylene glycol levels if available, a blood gas and lactate, and a call to your poisons service.`,
      brief: ketoacidosis
        ? `Unexplained osmolal gap ${fmt(residual)} beside ketoacidosis: a toxic alcohol stays in the differential.`
        : `Unexplained gap ${fmt(residual)}. Next: methanol, ethylene glycol, blood gas, lactate; call your poisons service.`,
      short: ketoacidosis
        ? `toxic alcohol in the differential (gap ${fmt(residual)})`
        : `toxic alcohol possible (unexplained gap ${fmt(residual)})`,
    });
  }
  return residual;
}

function readAnionGap(
  ag: Result,
  corrected: Result | undefined,
  range: Range,
  residual: number | undefined,
  findings: Finding[],
  cautions: Set<CautionId>,
  pseudo: boolean,
  ketoacidosis: boolean,
  inputs: LabInputs,
): void {
  cautions.add("anionGapRange");
  const v = corrected?.value ?? ag.value;
  const label = corrected ? "Albumin-corrected anion gap" : "Anion gap";
  const raised = v > range.high;
  findings.push(
    raised
      ? {
          code: "anionGap.raised",
          severity: "warning",
          text: `${label} ${fmt(v)} mmol/L is raised (above ${range.high}, the range set for this lab).`,
          brief: `${label} ${fmt(v)} is raised (lab range up to ${range.high}).`,
        }
      : {
          code: "anionGap.normal",
          severity: "info",
          text: `${label} ${fmt(v)} mmol/L is not raised (range set for this lab: ${range.low}–${range.high}).`,
        },
  );
  if (residual === undefined || pseudo) return;
  const osmRaised = residual >= GAP_LIMIT;
  const lactic = inputs.lactate !== undefined && inputs.lactate >= 4;
  if (osmRaised && !raised) {
    findings.push({
      code: "pattern.earlyAlcohol",
      severity: "warning",
      text: "High osmolal gap with an anion gap that is not raised fits an early toxic alcohol ingestion, before it is metabolised (Kraut & Kurtz 2008).",
      brief: "Anion gap not raised: fits an early ingestion, before the alcohol is metabolised.",
    });
  } else if (osmRaised && raised) {
    findings.push({
      code: "pattern.bothRaised",
      severity: "warning",
      text: ketoacidosis
        ? "Both gaps raised: ketoacidosis explains part of both; a toxic alcohol being metabolised remains possible (Kraut & Kurtz 2008)."
        : "Both gaps raised: a toxic alcohol being metabolised, or ketoacidosis, lactic acidosis or renal failure (Kraut & Kurtz 2008).",
      brief: ketoacidosis
        ? "Both gaps raised: ketoacidosis explains part; an alcohol being metabolised remains possible."
        : "Both gaps raised: an alcohol being metabolised — or ketoacidosis, lactic acidosis, renal failure.",
    });
  } else if (!osmRaised && raised && !ketoacidosis) {
    findings.push({
      code: "pattern.lateAlcohol",
      severity: "info",
      text: `Raised anion gap with a normal osmolal gap: ${lactic ? "lactic acidosis" : "ketoacidosis, lactic acidosis or renal failure"} first; a late toxic alcohol presentation is still possible once it is metabolised (Kraut & Kurtz 2008).`,
      brief: `Normal osmolal gap: ${lactic ? "lactic acidosis" : "ketoacidosis, lactic acidosis or renal failure"} first; a late toxic alcohol stays possible.`,
    });
  }
}
