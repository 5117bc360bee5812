/**
 * Hyperglycaemic crises by the 2024 international consensus (Umpierrez et al., Diabetes Care
 * 2024;47:1257; REFERENCES §6b): diabetic ketoacidosis, the hyperosmolar hyperglycaemic state and
 * the mixed state, with the older ADA 2009 and UK JBDS osmolality criteria beside them. Each
 * criterion is compared in the unit the glucose was written in; a criterion whose inputs are
 * missing is named, never assumed.
 */

import type { Finding } from "./findings.js";
import { fmt, num } from "./format.js";
import type { LabInputs } from "./inputs.js";
import { GAP_LIMIT } from "./tonicity.js";
import type { Unit } from "./units.js";

/** Glucose criteria, each in its own unit: comparing 600 mg/dL in mmol/L (33.30) would drop SI 33.3. */
export const DKA_GLUCOSE = { "mmol/L": 11.1, "mg/dL": 200 } as const;
export const HHS_GLUCOSE = { "mmol/L": 33.3, "mg/dL": 600 } as const;
/** UK JBDS: glucose ≥ 30 mmol/L (REFERENCES §6b, glucose threshold from memory [M]). */
export const JBDS_GLUCOSE_MMOL = 30;
/** β-hydroxybutyrate ≥ 3.0 mmol/L for DKA; HHS needs less than that (2024 consensus). */
export const KETONES = 3.0;
/** DKA: pH < 7.3 and/or bicarbonate < 18 mmol/L. HHS: pH ≥ 7.3 and bicarbonate ≥ 15 (2024 consensus). */
export const DKA_PH = 7.3;
export const DKA_BICARBONATE = 18;
export const HHS_PH = 7.3;
export const HHS_BICARBONATE = 15;
/** HHS: effective osmolality > 300 or total > 320 mOsm/kg (2024); ADA 2009: effective > 320; JBDS: ≥ 320. */
export const HHS_EFFECTIVE = 300;
export const HHS_TOTAL = 320;
export const ADA2009_EFFECTIVE = 320;
export const JBDS_OSMOLALITY = 320;

export interface CrisisInputs {
  inputs: LabInputs;
  /** The glucose as written, to compare each criterion in its own unit. */
  glucoseWritten?: { value: number; unit: Unit };
  /** 2·Na + glucose (+ mannitol). */
  effective?: number;
  /** 2·Na + glucose + urea (no ethanol: JBDS's formula). */
  calculatedNoEthanol?: number;
  /** 2·Na + glucose + urea + ethanol, when ethanol was given. */
  calculatedWithEthanol?: number;
  /** Osmolal gap after ethanol. */
  gap?: number;
}

function glucoseAtLeast(c: CrisisInputs, threshold: { "mmol/L": number; "mg/dL": number }): boolean {
  const glu = c.inputs.glucose!;
  const w = c.glucoseWritten;
  if (w && w.unit === "mg/dL") return w.value >= threshold["mg/dL"];
  if (w && w.unit === "mmol/L") return w.value >= threshold["mmol/L"];
  // From canonical mmol/L (a written g/L or mg/L, or no written value): either threshold counts.
  return glu >= threshold["mmol/L"] - 1e-9 || glu * 18.0156 >= threshold["mg/dL"] - 1e-9;
}

/** DKA severity by pH and bicarbonate (ADA 2009 bands, kept in 2024; from memory [M]). */
function dkaSeverity(ph: number | undefined, hco3: number | undefined): string | undefined {
  const byPh = ph === undefined ? undefined : ph < 7.0 ? 3 : ph < 7.25 ? 2 : ph < 7.3 ? 1 : 0;
  const byHco3 = hco3 === undefined ? undefined : hco3 < 10 ? 3 : hco3 < 15 ? 2 : hco3 < 18 ? 1 : 0;
  const worst = Math.max(byPh ?? 0, byHco3 ?? 0);
  return worst === 0 ? undefined : ["", "mild", "moderate", "severe"][worst];
}

export function readCrisis(c: CrisisInputs): Finding[] {
  const i = c.inputs;
  const out: Finding[] = [];
  if (i.glucose === undefined) return out;
  const bhb = i.betaHydroxybutyrate;
  const ph = i.pH;
  const hco3 = i.bicarbonate;
  const acidosis =
    (ph !== undefined && ph < DKA_PH) || (hco3 !== undefined && hco3 < DKA_BICARBONATE)
      ? true
      : ph === undefined && hco3 === undefined
        ? undefined
        : false;

  // DKA.
  let dkaMet = false;
  const dkaGlucose = glucoseAtLeast(c, DKA_GLUCOSE);
  if (dkaGlucose || acidosis || (bhb !== undefined && bhb >= KETONES)) {
    const acid = [
      ph !== undefined ? `pH ${num(ph)}` : "",
      hco3 !== undefined ? `bicarbonate ${num(hco3)}` : "",
    ]
      .filter(Boolean)
      .join(", ");
    const glucoseText = dkaGlucose
      ? "glucose ≥ 11.1 mmol/L (200 mg/dL)"
      : "glucose below 11.1 mmol/L (known diabetes also counts)";
    if (bhb !== undefined && bhb >= KETONES && acidosis) {
      dkaMet = true;
      const severity = dkaSeverity(ph, hco3);
      out.push({
        code: "dka.met",
        severity: "danger",
        text: `Diabetic ketoacidosis criteria met${severity ? ` (${severity} by pH and bicarbonate)` : ""}: β-hydroxybutyrate ${num(bhb)} ≥ 3.0, ${acid}, ${glucoseText} (2024 consensus).`,
        brief: `DKA${severity ? ` (${severity})` : ""}: β-hydroxybutyrate ${num(bhb)}, ${acid} (2024 consensus).`,
      });
    } else if (acidosis && bhb === undefined && dkaGlucose) {
      out.push({
        code: "dka.undecided",
        severity: "warning",
        text: `Acidosis (${acid}) with glucose ≥ 11.1 mmol/L: ketoacidosis cannot be decided — ketones not given. Send a blood β-hydroxybutyrate (≥ 3.0 mmol/L for DKA).`,
        brief: `Acidosis (${acid}) with high glucose: ketoacidosis first. Next: blood β-hydroxybutyrate (DKA if ≥ 3.0).`,
      });
    } else if (dkaGlucose && acidosis === undefined && bhb !== undefined && bhb >= KETONES) {
      out.push({
        code: "dka.undecided",
        severity: "warning",
        text: `β-hydroxybutyrate ${num(bhb)} ≥ 3.0 with glucose ≥ 11.1 mmol/L: ketoacidosis cannot be decided — pH and bicarbonate not given.`,
      });
    } else if (dkaGlucose && (bhb !== undefined || acidosis !== undefined)) {
      const missing = bhb === undefined ? "" : bhb < KETONES ? `β-hydroxybutyrate ${num(bhb)} < 3.0` : "";
      const noAcid = acidosis === false ? `no acidosis (${acid})` : "";
      out.push({
        code: "dka.notMet",
        severity: "info",
        text: `Diabetic ketoacidosis criteria not met: ${[missing, noAcid].filter(Boolean).join("; ") || "ketones and acid-base incomplete"} (2024 consensus).`,
      });
    }
  }

  // HHS.
  if (!glucoseAtLeast(c, HHS_GLUCOSE) || c.effective === undefined) return out;
  const total = i.measuredOsmolality ?? c.calculatedWithEthanol ?? c.calculatedNoEthanol;
  const totalName = i.measuredOsmolality !== undefined ? "measured" : "calculated";
  const effectiveMet = c.effective > HHS_EFFECTIVE;
  const totalMet = total !== undefined && total > HHS_TOTAL;
  const osmMet = effectiveMet || totalMet;
  const ketoneFail = bhb !== undefined && bhb >= KETONES;
  const acidFail = (ph !== undefined && ph < HHS_PH) || (hco3 !== undefined && hco3 < HHS_BICARBONATE);
  const notGiven = [
    bhb === undefined ? "ketones" : "",
    ph === undefined ? "pH" : "",
    hco3 === undefined ? "bicarbonate" : "",
  ].filter(Boolean);
  const parts = [
    `effective ${fmt(c.effective)} (> 300: ${effectiveMet ? "yes" : "no"})`,
    total !== undefined ? `${totalName} total ${fmt(total)} (> 320: ${totalMet ? "yes" : "no"})` : "",
  ].filter(Boolean);
  // The criterion may rest on an unexplained gap (measured total only), or on whether ethanol counts.
  let gapCaveat = "";
  if (
    totalMet &&
    !effectiveMet &&
    i.measuredOsmolality !== undefined &&
    c.gap !== undefined &&
    c.gap >= GAP_LIMIT
  )
    gapCaveat = ` The measured total includes an unexplained osmolal gap of ${fmt(c.gap)}: without it the total is ${fmt(i.measuredOsmolality - c.gap)}, and the osmolality criterion rests on that gap.`;
  // Said only when counting ethanol decides the criterion: the effective one is not met, and the
  // calculated total is above 320 with ethanol and not without it.
  let ethanolCaveat = "";
  if (
    !effectiveMet &&
    i.ethanol !== undefined &&
    c.calculatedNoEthanol !== undefined &&
    c.calculatedWithEthanol !== undefined &&
    i.measuredOsmolality === undefined &&
    c.calculatedWithEthanol > HHS_TOTAL !== c.calculatedNoEthanol > HHS_TOTAL
  )
    ethanolCaveat = ` With ethanol counted the calculated total is ${fmt(c.calculatedWithEthanol)}, without it ${fmt(c.calculatedNoEthanol)}: whether the 2024 total counts ethanol is not settled.`;
  const caveat = gapCaveat + ethanolCaveat;
  const older = [
    `ADA 2009 (effective > 320): ${c.effective > ADA2009_EFFECTIVE ? "met" : "not met"}`,
    c.calculatedNoEthanol !== undefined
      ? `UK JBDS (2·Na + glucose + urea ≥ 320, no ethanol term): ${c.calculatedNoEthanol >= JBDS_OSMOLALITY && i.glucose >= JBDS_GLUCOSE_MMOL ? "met" : "not met"}`
      : "",
  ]
    .filter(Boolean)
    .join("; ");
  const mixed = dkaMet && osmMet;
  if (mixed) {
    out.push({
      code: "dkaHhs.mixed",
      severity: "danger",
      text: `Mixed DKA and HHS: ketoacidosis with glucose ≥ 33.3 mmol/L (600 mg/dL) and a hyperosmolar state — ${parts.join(", ")}.${caveat} ${older}.`,
      brief: `Mixed DKA and HHS: ${parts.join(", ")}.`,
    });
    return out;
  }
  if (osmMet && !ketoneFail && !acidFail) {
    out.push({
      code: "hhs.met",
      severity: "danger",
      text: `Hyperosmolar hyperglycaemic state criteria met (2024 consensus): glucose ≥ 33.3 mmol/L (600 mg/dL), ${parts.join(", ")}.${notGiven.length > 0 ? ` Not given: ${notGiven.join(", ")} — DKA not excluded until they are.` : ""}${caveat} ${older}.`,
      brief: `HHS (2024): ${parts.join(", ")}.${notGiven.length > 0 ? ` Next: ${notGiven.join(", ")}.` : ""}${gapCaveat ? " The total rests on an unexplained gap." : ""}`,
    });
  } else if (osmMet) {
    out.push({
      code: "hhs.notMet",
      severity: "info",
      text: `Hyperosmolar range (${parts.join(", ")}), but HHS criteria are not met: ${[ketoneFail ? `β-hydroxybutyrate ${num(bhb!)} ≥ 3.0` : "", acidFail ? "pH < 7.3 or bicarbonate < 15" : ""].filter(Boolean).join(" and ")}.${caveat} ${older}.`,
    });
  } else {
    out.push({
      code: "hhs.notMet",
      severity: "info",
      text: `Glucose ≥ 33.3 mmol/L (600 mg/dL) without the hyperosmolar criterion of HHS: ${parts.join(", ")}. ${older}.`,
    });
  }
  return out;
}
