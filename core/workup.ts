/**
 * The hyponatraemia work-up after hypotonicity is confirmed, after the European guideline's
 * diagnostic algorithm (Spasovski et al., Eur J Endocrinol 2014;170:G1; REFERENCES §6a). The
 * thresholds and the urine-to-plasma ratio are from memory and to be confirmed against the
 * published algorithm [M]: the texts are guidance that defers to local protocols.
 */

import type { Finding } from "./findings.js";
import { fmt, num } from "./format.js";
import type { LabInputs } from "./inputs.js";

/** Urine osmolality at or below which water intake is relatively excessive [M, Spasovski 2014]. */
export const URINE_DILUTE = 100;
/** Urine sodium at or below which effective arterial blood volume is likely low [M, Spasovski 2014]. */
export const URINE_SODIUM_LOW = 30;
/** (UNa + UK) ÷ PNa bands for fluid restriction [M, Furst et al., Am J Med Sci 2000;319:240]. */
export const RATIO_HIGH = 1;
export const RATIO_LOW = 0.5;

/** Findings for a hypotonic hyponatraemia: the next step, or what the urine studies suggest. */
export function readWorkup(i: LabInputs, hypotonic: boolean): Finding[] {
  const out: Finding[] = [];
  const uOsm = i.urineOsmolality;
  const uNa = i.urineSodium;
  const uK = i.urinePotassium;
  const anyUrine = uOsm !== undefined || uNa !== undefined || uK !== undefined;
  if (!hypotonic) {
    if (anyUrine && i.sodium !== undefined && i.sodium < 135)
      out.push({
        code: "urine.notApplied",
        severity: "info",
        text: "Urine studies read; the work-up applies once the hyponatraemia is shown to be hypotonic.",
      });
    return out;
  }
  if (uOsm === undefined && uNa === undefined) {
    out.push({
      code: "hyponatraemia.nextStep",
      severity: "info",
      text: "Next: urine osmolality and urine sodium (ideally before treatment), volume status and symptoms; severe symptoms need treatment first, per local protocol.",
    });
    return out;
  }
  if (uOsm !== undefined && uOsm <= URINE_DILUTE) {
    out.push({
      code: "urine.dilute",
      severity: "info",
      text: `Urine osmolality ${num(uOsm)} ≤ 100: maximally dilute urine — relative excess water intake (primary polydipsia, low solute intake, beer potomania) (European guideline, to be confirmed locally).`,
    });
  } else if (uOsm !== undefined && uNa === undefined) {
    out.push({
      code: "hyponatraemia.nextStep",
      severity: "info",
      text: `Urine osmolality ${num(uOsm)} > 100: the urine is not maximally dilute. Next: urine sodium, and volume status.`,
    });
  } else if (uNa !== undefined) {
    const osmText = uOsm !== undefined ? `urine osmolality ${num(uOsm)} > 100 and ` : "";
    if (uOsm === undefined)
      out.push({
        code: "hyponatraemia.nextStep",
        severity: "info",
        text: "Send a urine osmolality too: the urine sodium is read after it (≤ 100 mOsm/kg points elsewhere).",
      });
    if (uNa <= URINE_SODIUM_LOW) {
      out.push({
        code: "urine.lowSodium",
        severity: "info",
        text: `With ${osmText}urine sodium ${num(uNa)} ≤ 30: low effective arterial blood volume (losses, heart failure, cirrhosis, nephrotic syndrome) (European guideline, to be confirmed locally).`,
        brief: `Urine sodium ${num(uNa)} ≤ 30: low effective arterial blood volume (losses, heart failure, cirrhosis).`,
      });
    } else {
      out.push({
        code: "urine.highSodium",
        severity: "info",
        text: `With ${osmText}urine sodium ${num(uNa)} > 30: consider diuretics, kidney disease, SIAD, adrenal insufficiency or hypothyroidism; assess extracellular volume (European guideline, to be confirmed locally).`,
        brief: `Urine sodium ${num(uNa)} > 30: diuretics, kidney disease, SIAD, adrenal insufficiency? Assess volume status.`,
      });
    }
  }
  if (uNa !== undefined && uK !== undefined && i.sodium !== undefined) {
    const ratio = (uNa + uK) / i.sodium;
    const meaning =
      ratio > RATIO_HIGH
        ? "fluid restriction alone is unlikely to work"
        : ratio >= RATIO_LOW
          ? "restrict fluid to about 500 mL a day"
          : "restrict fluid to about 1 L a day";
    out.push({
      code: "urine.electrolyteRatio",
      severity: "info",
      text: `Urine-to-plasma electrolyte ratio (UNa + UK) ÷ PNa = ${fmt(ratio, 2)}: ${meaning} (Furst 2000, to be confirmed locally).`,
    });
  }
  return out;
}
