/**
 * Tonicity and the class of a hyponatraemia: one coherent reading per reply.
 *
 * - Tonicity is the effective osmolality: the measured osmolality less the ineffective solutes
 *   (urea, ethanol and the other alcohols cross cell membranes) when it was measured; 2·Na +
 *   glucose (+ mannitol, an effective osmole) when it was not (REFERENCES §3).
 * - A hyponatraemia is classed by the measured osmolality when it is given; when the effective
 *   value tells another story (urea or alcohol holding the measured value up), the reply says so
 *   in the same finding instead of printing a second, contradicting one.
 * - Pseudohyponatraemia needs a low sodium, a normal measured osmolality and an osmolal gap that the
 *   sodium's shortfall explains; then the gap's toxic-alcohol reasoning is withheld.
 */

import type { Finding } from "./findings.js";
import { fmt, num } from "./format.js";
import type { LabInputs } from "./inputs.js";

export interface Range {
  low: number;
  high: number;
}

/** Hyponatraemia and hypernatraemia thresholds, mmol/L [common practice]. */
export const SODIUM_LOW = 135;
export const SODIUM_HIGH = 145;
/** Effective osmolality above which the 2024 consensus calls plasma hypertonic for HHS (Umpierrez 2024). */
export const EFFECTIVE_HIGH = 300;
/** Usual upper limit of a normal osmolal gap [common practice]. */
export const GAP_LIMIT = 10;
/** The urea a normal total osmolality already includes, mmol/L [common practice]. */
const NORMAL_UREA = 5;
/** Sodium taken as normal when judging how much of a gap a low sodium could explain [common practice]. */
const NORMAL_SODIUM = 140;

/** Ineffective solutes known from the inputs, mmol/L: urea, ethanol and the measured alcohols. */
export function ineffectiveSolutes(i: LabInputs): { total: number; named: string[] } {
  const parts: [string, number | undefined][] = [
    ["urea", i.urea],
    ["ethanol", i.ethanol],
    ["methanol", i.methanol],
    ["ethylene glycol", i.ethyleneGlycol],
    ["isopropanol", i.isopropanol],
    ["acetone", i.acetone],
    ["propylene glycol", i.propyleneGlycol],
  ];
  let total = 0;
  const named: string[] = [];
  for (const [name, v] of parts) {
    if (v !== undefined && v > 0) {
      total += v;
      named.push(`${name} ${num(v)}`);
    }
  }
  return { total, named };
}

export interface TonicityReading {
  /** The effective osmolality used for tonicity, and how it was found. */
  value?: number;
  from?: "measured" | "calculated";
  /** True when the gap is best read as pseudohyponatraemia: the toxic-alcohol reasoning is withheld. */
  pseudo: boolean;
  findings: Finding[];
}

/**
 * Classes the sodium by tonicity. `gap` is the osmolal gap (after ethanol), when it could be
 * computed; `range` is the lab's reference range for measured osmolality.
 */
export function readTonicity(
  i: LabInputs,
  gap: number | undefined,
  range: Range,
  si = false,
): TonicityReading {
  const findings: Finding[] = [];
  const na = i.sodium;
  const measured = i.measuredOsmolality;
  const ineffective = ineffectiveSolutes(i);
  const calculatedEffective =
    na !== undefined && i.glucose !== undefined ? 2 * na + i.glucose + (i.mannitol ?? 0) : undefined;
  const fromMeasured =
    measured !== undefined && i.urea !== undefined ? measured - ineffective.total : undefined;
  // An unexplained gap may be an alcohol (ineffective): then tonicity is taken from 2·Na + glucose.
  const useMeasured =
    fromMeasured !== undefined &&
    !(gap !== undefined && gap >= GAP_LIMIT && calculatedEffective !== undefined);
  const value = useMeasured ? fromMeasured : (calculatedEffective ?? fromMeasured);
  const from: "measured" | "calculated" | undefined = useMeasured
    ? "measured"
    : calculatedEffective !== undefined
      ? "calculated"
      : fromMeasured !== undefined
        ? "measured"
        : undefined;
  const out: TonicityReading = {
    pseudo: false,
    findings,
    ...(value !== undefined && { value }),
    ...(from && { from }),
  };
  if (na === undefined) return out;

  if (na > SODIUM_HIGH) {
    findings.push({
      code: "hypernatraemia",
      severity: "warning",
      text: `Hypernatraemia (Na ${num(na)}): plasma is hypertonic${value !== undefined ? ` (effective osmolality ${fmt(value)})` : ""}.`,
    });
    return out;
  }
  if (na >= SODIUM_LOW) {
    if (value !== undefined) findings.push(tonicityFinding(value, from!, range));
    return out;
  }

  // Hyponatraemia.
  const effectiveSolute = effectiveSoluteText(i, si);
  if (measured === undefined) {
    const by =
      calculatedEffective !== undefined
        ? ` The calculated effective osmolality is ${fmt(calculatedEffective)}${effectiveSolute ? `, with ${effectiveSolute}` : ""}.`
        : "";
    findings.push({
      code: "hyponatraemia.unclassified",
      severity: "warning",
      text: `Hyponatraemia (Na ${num(na)}), not yet classed: send a measured osmolality to tell true (hypotonic) from translocational or pseudohyponatraemia.${by}`,
      brief: `Hyponatraemia not yet classed. Next: a measured osmolality.`,
    });
    return out;
  }
  const effText = fromMeasured !== undefined ? `effective ${fmt(fromMeasured)}` : "";

  if (measured < range.low) {
    findings.push({
      code: "hyponatraemia.hypotonic",
      severity: "warning",
      text: `Hypotonic hyponatraemia: Na ${num(na)}, measured osmolality ${num(measured)} (below ${range.low}).`,
    });
    return out;
  }

  // Measured osmolality normal or high: what holds it up? The reference range is for total
  // osmolality, which includes a normal urea; only ineffective solutes above that are the excess.
  const excess = Math.max(0, ineffective.total - NORMAL_UREA);
  if (fromMeasured !== undefined && excess > 0 && measured - excess < range.low) {
    findings.push({
      code: "hyponatraemia.hypotonic",
      severity: "warning",
      text: `Hypotonic in effect: Na ${num(na)}; the measured osmolality ${num(measured)} is held up by ${ineffective.named.join(", ")} mmol/L, which cross cell membranes — ${effText}, so the cells see hypotonic plasma.`,
    });
    findings.push({
      code: "osmolality.ineffectiveExcess",
      severity: "info",
      text: `Measured osmolality ${num(measured)} less the ineffective solutes (${ineffective.named.join(", ")}) leaves ${fmt(fromMeasured)}.`,
    });
    return out;
  }
  const shortfall = Math.max(0, NORMAL_SODIUM - na);
  const highGlucoseOrMannitol = effectiveSolute !== "";
  if (measured <= range.high) {
    if (gap !== undefined && gap >= GAP_LIMIT && gap <= 2 * shortfall + GAP_LIMIT && !highGlucoseOrMannitol) {
      out.pseudo = true;
      findings.push({
        code: "hyponatraemia.isotonic",
        severity: "warning",
        text: `Hyponatraemia with a normal measured osmolality (${num(measured)}): isotonic.`,
      });
      findings.push({
        code: "pseudohyponatraemia.possible",
        severity: "warning",
        text: `Likely pseudohyponatraemia: the osmolal gap of ${fmt(gap)} is what a falsely low sodium would make. Recheck the sodium by direct ISE (blood-gas analyser) and send lipids and total protein; the gap is not read as a toxic alcohol here.`,
        brief: `A gap of ${fmt(gap)} is what a falsely low sodium makes. Next: sodium by direct ISE (blood gas), lipids, total protein.`,
      });
      return out;
    }
    findings.push({
      code: "hyponatraemia.isotonic",
      severity: "warning",
      text: highGlucoseOrMannitol
        ? `Isotonic hyponatraemia: measured osmolality ${num(measured)} is normal; ${effectiveSolute} accounts for the low sodium (translocational).`
        : `Hyponatraemia with a normal measured osmolality (${num(measured)}): isotonic${gap !== undefined && gap >= GAP_LIMIT ? "; the raised osmolal gap is more than a low sodium explains — an unmeasured osmole" : ""}.`,
    });
    return out;
  }
  // Measured above the range: an effective solute (glucose, mannitol) draws water out of cells —
  // or an unmeasured osmole whose effect cannot be told.
  if (highGlucoseOrMannitol) {
    findings.push({
      code: "hyponatraemia.hypertonic",
      severity: "warning",
      text: `Hypertonic (translocational) hyponatraemia: measured osmolality ${num(measured)}; ${effectiveSolute} draws water out of cells${effText ? ` (${effText})` : ""}.`,
      brief: `Translocational: ${effectiveSolute} draws water out of cells.`,
    });
  } else {
    findings.push({
      code: "hyponatraemia.unclassified",
      severity: "warning",
      text: `Hyponatraemia with a high measured osmolality (${num(measured)}) that glucose does not explain: an unmeasured osmole is present. Whether the cells see hypertonic plasma depends on what it is: mannitol, glycine and sorbitol are effective osmoles; alcohols are not.`,
    });
  }
  return out;
}

/** " glucose 45 mmol/L" or "mannitol …" when an effective solute is high enough to matter. */
function effectiveSoluteText(i: LabInputs, si: boolean): string {
  const parts: string[] = [];
  // Glucose above about 10 mmol/L (180 mg/dL) moves the sodium by 2 mmol/L or more [common practice].
  if (i.glucose !== undefined && i.glucose >= 10) {
    const mmol = `${num(i.glucose, 1)} mmol/L`;
    const mg = `${num(i.glucose * 18.0156, 0)} mg/dL`;
    parts.push(`glucose ${si ? `${mmol} (${mg})` : `${mg} (${mmol})`}`);
  }
  if (i.mannitol !== undefined && i.mannitol >= 5) parts.push(`mannitol ${num(i.mannitol, 1)} mmol/L`);
  return parts.join(" and ");
}

function tonicityFinding(value: number, from: "measured" | "calculated", range: Range): Finding {
  const how = from === "measured" ? "measured less urea and alcohols" : "2·Na + glucose";
  if (value < range.low)
    return {
      code: "tonicity.low",
      severity: "warning",
      text: `Effective osmolality ${fmt(value)} (${how}) is below ${range.low}: hypotonic.`,
    };
  if (value > EFFECTIVE_HIGH)
    return {
      code: "tonicity.high",
      severity: "warning",
      text: `Effective osmolality ${fmt(value)} (${how}) is above ${EFFECTIVE_HIGH}: hypertonic.`,
    };
  return {
    code: "tonicity.normal",
    severity: "info",
    text: `Effective osmolality ${fmt(value)} (${how}): not hypotonic, not above ${EFFECTIVE_HIGH}.`,
  };
}
