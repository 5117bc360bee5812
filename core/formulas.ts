/**
 * The published formulas, one function each. Inputs are canonical (mmol/L, mOsm/kg, g/L); every
 * function returns a Result with its working, or undefined when an input it needs is missing.
 * Sources: see REFERENCES.md (shared) — named again in each Result's `source`.
 */
import { ANALYTES, fromCanonical } from "./analytes.js";
import { fmt, num } from "./format.js";
import type { LabInputs } from "./inputs.js";
import type { Result } from "./results.js";

const OSM = "mOsm/kg";

/** Glucose of 100 mg/dL, the baseline of the glucose corrections (= 5.55 mmol/L). */
export const GLUCOSE_BASELINE_MG_DL = 100;
/** Katz 1973: +1.6 mmol/L Na per 100 mg/dL glucose above 100. */
export const KATZ_FACTOR = 1.6;
/** Hillier et al. 1999: +2.4 mmol/L Na per 100 mg/dL glucose above 100. */
export const HILLIER_FACTOR = 2.4;
/** Purssell et al. 2001: ethanol counted as 1.25 × its molar concentration (mg/dL ÷ 3.7). */
export const ETHANOL_PURSSELL_FACTOR = 1.25;
/** Albumin correction of the anion gap: 2.5 per g/dL below 4.0 g/dL (Figge et al. 1998). */
export const ALBUMIN_AG_FACTOR = 2.5;
export const ALBUMIN_AG_REFERENCE_G_DL = 4.0;

function result(
  id: string,
  label: string,
  formula: string,
  parts: string,
  value: number,
  source: string,
  unit = OSM,
): Result {
  return { id, label, formula, value, unit, source, working: `${parts} = ${fmt(value)} ${unit}` };
}

const SMITHLINE = "Smithline & Gardner, JAMA 1976; SI form: Lynd et al., BMC Emerg Med 2008;8:5";

/** 2·Na + glucose + urea (+ ethanol, molar, when ethanol is given). */
export function calculatedOsmolality(i: LabInputs): Result | undefined {
  const { sodium: na, glucose: glu, urea, ethanol } = i;
  if (na === undefined || glu === undefined || urea === undefined) return undefined;
  if (ethanol === undefined) {
    return result(
      "calculatedOsmolality",
      "Calculated osmolality",
      "2·Na + glucose + urea",
      `2 × ${num(na)} + ${num(glu)} + ${num(urea)}`,
      2 * na + glu + urea,
      SMITHLINE,
    );
  }
  return result(
    "calculatedOsmolality",
    "Calculated osmolality",
    "2·Na + glucose + urea + ethanol",
    `2 × ${num(na)} + ${num(glu)} + ${num(urea)} + ${num(ethanol)}`,
    2 * na + glu + urea + ethanol,
    `${SMITHLINE}; ethanol counted molar (mg/dL ÷ 4.61)`,
  );
}

/** The same with ethanol counted as 1.25 × its molar concentration (mg/dL ÷ 3.7). */
export function calculatedOsmolalityEthanolPurssell(i: LabInputs): Result | undefined {
  const { sodium: na, glucose: glu, urea, ethanol } = i;
  if (na === undefined || glu === undefined || urea === undefined || ethanol === undefined) return undefined;
  return result(
    "calculatedOsmolality.ethanol125",
    "Calculated osmolality, ethanol × 1.25",
    "2·Na + glucose + urea + 1.25·ethanol",
    `2 × ${num(na)} + ${num(glu)} + ${num(urea)} + 1.25 × ${num(ethanol)}`,
    2 * na + glu + urea + ETHANOL_PURSSELL_FACTOR * ethanol,
    "Purssell et al., Ann Emerg Med 2001;38:653",
  );
}

/** Dorwart–Chalmers: 1.86·Na + glucose + urea + 9 (+ ethanol, molar, when given). */
export function dorwartChalmers(i: LabInputs): Result | undefined {
  const { sodium: na, glucose: glu, urea, ethanol = 0 } = i;
  if (na === undefined || glu === undefined || urea === undefined) return undefined;
  const withEthanol = i.ethanol !== undefined;
  return result(
    "calculatedOsmolality.dorwartChalmers",
    "Calculated osmolality (Dorwart–Chalmers)",
    withEthanol
      ? "Dorwart–Chalmers: 1.86·Na + glucose + urea + 9 + ethanol"
      : "Dorwart–Chalmers: 1.86·Na + glucose + urea + 9",
    `1.86 × ${num(na)} + ${num(glu)} + ${num(urea)} + 9${withEthanol ? ` + ${num(ethanol)}` : ""}`,
    1.86 * na + glu + urea + 9 + ethanol,
    "Dorwart & Chalmers, Clin Chem 1975;21:190",
  );
}

/** 2·(Na + K) + glucose + urea (+ ethanol, molar, when given). */
export function withPotassium(i: LabInputs): Result | undefined {
  const { sodium: na, potassium: k, glucose: glu, urea, ethanol = 0 } = i;
  if (na === undefined || k === undefined || glu === undefined || urea === undefined) return undefined;
  const withEthanol = i.ethanol !== undefined;
  return result(
    "calculatedOsmolality.potassium",
    "Calculated osmolality with potassium",
    withEthanol ? "2·(Na + K) + glucose + urea + ethanol" : "2·(Na + K) + glucose + urea",
    `2 × (${num(na)} + ${num(k)}) + ${num(glu)} + ${num(urea)}${withEthanol ? ` + ${num(ethanol)}` : ""}`,
    2 * (na + k) + glu + urea + ethanol,
    "common practice (UK)",
  );
}

/** Hooper et al. 2015, a screening equation for water-loss dehydration in older adults. */
export function hooperOlderAdults(i: LabInputs): Result | undefined {
  const { sodium: na, potassium: k, glucose: glu, urea } = i;
  if (na === undefined || k === undefined || glu === undefined || urea === undefined) return undefined;
  return result(
    "calculatedOsmolality.olderAdults",
    "Calculated osmolality, older-adult screening equation",
    "1.86·(Na + K) + 1.15·glucose + urea + 14",
    `1.86 × (${num(na)} + ${num(k)}) + 1.15 × ${num(glu)} + ${num(urea)} + 14`,
    1.86 * (na + k) + 1.15 * glu + urea + 14,
    "Hooper et al., BMJ Open 2015;5:e008846",
  );
}

/**
 * Effective osmolality (tonicity): 2·Na + glucose, + mannitol when it was measured (an effective
 * osmole, like glucose). Urea and ethanol cross cell membranes and are left out.
 */
export function effectiveOsmolality(i: LabInputs): Result | undefined {
  const { sodium: na, glucose: glu, mannitol } = i;
  if (na === undefined || glu === undefined) return undefined;
  if (mannitol !== undefined && mannitol > 0) {
    return result(
      "effectiveOsmolality",
      "Effective osmolality (tonicity)",
      "2·Na + glucose + mannitol",
      `2 × ${num(na)} + ${num(glu)} + ${num(mannitol)}`,
      2 * na + glu + mannitol,
      "ADA consensus (Kitabchi 2009; Umpierrez 2024); mannitol is an effective osmole",
    );
  }
  return result(
    "effectiveOsmolality",
    "Effective osmolality (tonicity)",
    "2·Na + glucose",
    `2 × ${num(na)} + ${num(glu)}`,
    2 * na + glu,
    "ADA consensus (Kitabchi 2009; Umpierrez 2024)",
  );
}

/** Osmolal gap = measured − calculated, against a given calculated result. */
export function osmolalGap(
  i: LabInputs,
  calculated: Result | undefined,
  id = "osmolalGap",
): Result | undefined {
  const measured = i.measuredOsmolality;
  if (measured === undefined || calculated === undefined) return undefined;
  return result(
    id,
    id === "osmolalGap" ? "Osmolal gap" : `Osmolal gap (${calculated.formula})`,
    `measured − (${calculated.formula})`,
    `${num(measured)} − ${num(calculated.value)}`,
    measured - calculated.value,
    "definition; usual limit < 10 is common practice",
  );
}

/** The concentration a residual gap would imply if one alcohol alone caused it: mg/dL ≈ gap × MW / 10. */
export function impliedConcentration(
  gap: number,
  alcohol: "methanol" | "ethyleneGlycol" | "isopropanol" | "propyleneGlycol",
): Result {
  const analyte = ANALYTES[alcohol];
  const mgPerDl = fromCanonical(analyte, gap, "mg/dL");
  return {
    id: `impliedConcentration.${alcohol}`,
    label: `${analyte.name} if it alone made the gap`,
    formula: "gap × molar mass ÷ 10",
    value: mgPerDl,
    unit: "mg/dL",
    working: `${num(gap)} × ${num(analyte.molarMass!)} ÷ 10 = ${fmt(mgPerDl)} mg/dL`,
    source: "single ideal solute, molar mass from IUPAC atomic weights",
  };
}

/** Anion gap: Na − (Cl + HCO3); with K when `withK`. */
export function anionGap(i: LabInputs, withK = false): Result | undefined {
  const { sodium: na, chloride: cl, bicarbonate: hco3, potassium: k } = i;
  if (na === undefined || cl === undefined || hco3 === undefined) return undefined;
  if (withK) {
    if (k === undefined) return undefined;
    return result(
      "anionGap.potassium",
      "Anion gap with potassium",
      "Na + K − (Cl + HCO3)",
      `${num(na)} + ${num(k)} − (${num(cl)} + ${num(hco3)})`,
      na + k - (cl + hco3),
      "common practice",
      "mmol/L",
    );
  }
  return result(
    "anionGap",
    "Anion gap",
    "Na − (Cl + HCO3)",
    `${num(na)} − (${num(cl)} + ${num(hco3)})`,
    na - (cl + hco3),
    "common practice",
    "mmol/L",
  );
}

/** Albumin-corrected anion gap: AG + 2.5 × (4.0 − albumin g/dL). */
export function albuminCorrectedAnionGap(i: LabInputs): Result | undefined {
  const ag = anionGap(i);
  if (ag === undefined || i.albumin === undefined) return undefined;
  const albGdl = fromCanonical(ANALYTES.albumin, i.albumin, "g/dL");
  return result(
    "anionGap.albuminCorrected",
    "Anion gap corrected for albumin",
    "AG + 2.5 × (4.0 − albumin g/dL)",
    `${num(ag.value)} + 2.5 × (4.0 − ${num(albGdl)})`,
    ag.value + ALBUMIN_AG_FACTOR * (ALBUMIN_AG_REFERENCE_G_DL - albGdl),
    "Figge et al., Crit Care Med 1998;26:1807",
    "mmol/L",
  );
}

/** Glucose in mg/dL from canonical mmol/L. */
export function glucoseMgPerDl(glucoseMmol: number): number {
  return fromCanonical(ANALYTES.glucose, glucoseMmol, "mg/dL");
}

/** Glucose-corrected sodium: Na + factor × (glucose mg/dL − 100) / 100; no correction at or below 100. */
export function correctedSodium(i: LabInputs, method: "katz" | "hillier"): Result | undefined {
  const { sodium: na, glucose: glu } = i;
  if (na === undefined || glu === undefined) return undefined;
  const m = CORRECTION_METHODS[method];
  const mg = glucoseMgPerDl(glu);
  const excess = Math.max(0, mg - GLUCOSE_BASELINE_MG_DL);
  return result(
    m.id,
    m.label,
    m.formula,
    `${num(na)} + ${m.factor} × (${num(mg, 1)} − 100) ÷ 100${mg <= GLUCOSE_BASELINE_MG_DL ? " (glucose ≤ 100: no correction)" : ""}`,
    na + (m.factor * excess) / 100,
    m.source,
    "mmol/L",
  );
}

/** The two published factors, with their texts built once. */
const CORRECTION_METHODS = {
  katz: correctionMethod("katz", "Katz", KATZ_FACTOR, "Katz, NEJM 1973;289:843"),
  hillier: correctionMethod("hillier", "Hillier", HILLIER_FACTOR, "Hillier et al., Am J Med 1999;106:399"),
};

function correctionMethod(method: string, name: string, factor: number, source: string) {
  return {
    id: `correctedSodium.${method}`,
    label: `Sodium corrected for glucose (${name})`,
    formula: `${name}: Na + ${factor} × (glucose mg/dL − 100) ÷ 100`,
    factor,
    source,
  };
}
