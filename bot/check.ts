/**
 * Checking a colleague's result: compares a claimed calculated or effective osmolality, osmolal
 * gap, corrected sodium or anion gap with the engine's, and when it does not hold, looks for the
 * usual slip that explains it (mg/dL vs mmol/L, BUN vs urea, ethanol left out or counted another
 * way, another formula, potassium counted, sodium not doubled).
 */
import type { Assessment } from "../core/assess.js";
import { fmt } from "../core/format.js";
import { dorwartChalmers, glucoseMgPerDl, HILLIER_FACTOR, KATZ_FACTOR } from "../core/formulas.js";
import type { Claim, Reading, ReadValue } from "../core/reader/index.js";
import type { ClaimKind } from "../core/reader/vocabulary.js";

export interface Verdict {
  kind: ClaimKind;
  claimed: number;
  /** The engine's value for the same thing; undefined when the inputs for it are missing. */
  ours?: number;
  holds: boolean;
  /** One line for the reply. */
  text: string;
}

const LABELS: Record<ClaimKind, string> = {
  calculatedOsmolality: "calculated osmolality",
  effectiveOsmolality: "effective osmolality",
  osmolalGap: "osmolal gap",
  correctedSodium: "corrected sodium",
  anionGap: "anion gap",
};

const NEEDS: Record<ClaimKind, string> = {
  calculatedOsmolality: "Na, glucose and urea (or BUN)",
  effectiveOsmolality: "Na and glucose",
  osmolalGap: "Na, glucose, urea (or BUN) and the measured osmolality",
  correctedSodium: "Na and glucose",
  anionGap: "Na, Cl and HCO3",
};

/** Allowed difference for rounding: a whole mOsm/kg for osmolalities, half a mmol/L otherwise. */
function tolerance(kind: ClaimKind): number {
  return kind === "correctedSodium" || kind === "anionGap" ? 0.6 : 1.0;
}

interface Candidate {
  slip: string;
  value: number;
}

export function checkClaims(reading: Reading, assessment: Assessment): Verdict[] {
  return reading.claims.map((claim) => verdictFor(claim, reading, assessment));
}

function verdictFor(claim: Claim, reading: Reading, a: Assessment): Verdict {
  const ours = oursFor(claim.kind, a, claim.withPotassium === true);
  const label = claim.withPotassium ? "anion gap with potassium" : LABELS[claim.kind];
  if (ours === undefined) {
    return {
      kind: claim.kind,
      claimed: claim.value,
      holds: false,
      text: `Cannot check the ${label} ${fmt(claim.value)}: it needs ${NEEDS[claim.kind]}.`,
    };
  }
  const tol = tolerance(claim.kind);
  const diff = claim.value - ours.value;
  if (Math.abs(diff) <= tol) {
    const rounding = Math.abs(diff) >= 0.05 ? " (the difference is rounding)" : "";
    return {
      kind: claim.kind,
      claimed: claim.value,
      ours: ours.value,
      holds: true,
      text: `The ${label} ${fmt(claim.value)} holds: ${ours.how} gives ${fmt(ours.value)}${rounding}.`,
    };
  }
  const explained = candidatesFor(claim.kind, reading, a)
    .filter((c) => Math.abs(c.value - claim.value) <= tol)
    .sort((x, y) => Math.abs(x.value - claim.value) - Math.abs(y.value - claim.value));
  const because =
    explained.length > 0
      ? ` It is explained by: ${explained
          .slice(0, 2)
          .map((c) => `${c.slip} (gives ${fmt(c.value)})`)
          .join("; or ")}.`
      : " No single common slip explains it: recheck the values and the arithmetic.";
  return {
    kind: claim.kind,
    claimed: claim.value,
    ours: ours.value,
    holds: false,
    text: `The ${label} ${fmt(claim.value)} does not hold: ${ours.how} gives ${fmt(ours.value)} (difference ${fmt(diff)}).${because}`,
  };
}

function oursFor(
  kind: ClaimKind,
  a: Assessment,
  withPotassium = false,
): { value: number; how: string } | undefined {
  const r = a.results;
  if (kind === "anionGap" && withPotassium) {
    const k = a.alternatives.find((x) => x.id === "anionGap.potassium");
    return k && { value: k.value, how: k.formula };
  }
  switch (kind) {
    case "calculatedOsmolality":
      return (
        r.calculatedOsmolality && { value: r.calculatedOsmolality.value, how: r.calculatedOsmolality.formula }
      );
    case "effectiveOsmolality":
      return (
        r.effectiveOsmolality && { value: r.effectiveOsmolality.value, how: r.effectiveOsmolality.formula }
      );
    case "osmolalGap":
      return (
        r.osmolalGap && { value: r.osmolalGap.value, how: `measured − (${r.calculatedOsmolality!.formula})` }
      );
    case "anionGap":
      return r.anionGap && { value: r.anionGap.value, how: r.anionGap.formula };
    case "correctedSodium":
      return r.correctedSodium && { value: r.correctedSodium.katz.value, how: "Katz (1.6 per 100 mg/dL)" };
  }
}

function written(reading: Reading, analyte: string): ReadValue | undefined {
  return reading.values.find((v) => v.analyte === analyte);
}

/** Values a colleague would get from each usual slip. */
function candidatesFor(kind: ClaimKind, reading: Reading, a: Assessment): Candidate[] {
  const i = a.inputs;
  const na = i.sodium;
  const glu = i.glucose;
  const urea = i.urea;
  const out: Candidate[] = [];
  if (na === undefined || glu === undefined) return out;

  const gluW = written(reading, "glucose");
  const bunW = written(reading, "bun");
  const ureaW = written(reading, "urea");
  const etoh = i.ethanol ?? 0;
  const etohW = written(reading, "ethanol");

  // Variants of the glucose term.
  const gluTerms: Candidate[] = [{ slip: "", value: glu }];
  if (gluW && gluW.unit === "mg/dL")
    gluTerms.push({ slip: "glucose in mg/dL added without dividing by 18", value: gluW.written });
  if (gluW && gluW.unit === "mmol/L")
    gluTerms.push({ slip: "glucose already in mmol/L divided by 18 again", value: gluW.written / 18 });

  if (kind === "correctedSodium") {
    const mg = glucoseMgPerDl(glu);
    const excess = Math.max(0, mg - 100);
    out.push({
      slip: `Hillier's factor (${HILLIER_FACTOR} per 100 mg/dL) — also published, and shown beside Katz`,
      value: na + (HILLIER_FACTOR * excess) / 100,
    });
    if (mg > 400)
      out.push({
        slip: "Hillier's 4.0 per 100 mg/dL above 400 mg/dL (a nonlinear reading; not a fixed rule)",
        value: na + (HILLIER_FACTOR * 300) / 100 + (4 * (mg - 400)) / 100,
      });
    out.push({
      slip: "the factor applied to the whole glucose, not the excess over 100 mg/dL",
      value: na + (KATZ_FACTOR * mg) / 100,
    });
    out.push({
      slip: "the factor applied per mmol/L instead of per 100 mg/dL",
      value: na + KATZ_FACTOR * Math.max(0, glu - 5.55),
    });
    out.push({
      slip: "the correction subtracted instead of added",
      value: na - (KATZ_FACTOR * excess) / 100,
    });
    return out;
  }

  if (kind === "anionGap") {
    const { chloride: cl, bicarbonate: hco3, potassium: k } = i;
    if (cl === undefined || hco3 === undefined) return out;
    if (k !== undefined)
      out.push({
        slip: "potassium added (Na + K − Cl − HCO3), which some labs do",
        value: na + k - cl - hco3,
      });
    const corrected = a.alternatives.find((r) => r.id === "anionGap.albuminCorrected");
    if (corrected) out.push({ slip: "the albumin-corrected anion gap", value: corrected.value });
    out.push({ slip: "bicarbonate not subtracted", value: na - cl });
    return out;
  }

  if (kind === "effectiveOsmolality") {
    for (const g of gluTerms) if (g.slip) out.push({ slip: g.slip, value: 2 * na + g.value });
    if (urea !== undefined)
      out.push({
        slip: "urea included — that is the total calculated osmolality; urea is not an effective osmole",
        value: 2 * na + glu + urea,
      });
    if (i.ethanol !== undefined)
      out.push({ slip: "ethanol included; it crosses cell membranes", value: 2 * na + glu + etoh });
    out.push({ slip: "sodium not doubled", value: na + glu });
    return out;
  }

  // Calculated osmolality, and the gap made from it.
  if (urea === undefined) return out;
  const ureaTerms: Candidate[] = [{ slip: "", value: urea }];
  if (bunW && bunW.unit === "mg/dL")
    ureaTerms.push({ slip: "BUN in mg/dL added without dividing by 2.8", value: bunW.written });
  if (ureaW && ureaW.unit === "mmol/L")
    ureaTerms.push({
      slip: "urea in mmol/L divided by 2.8 as if it were BUN in mg/dL",
      value: ureaW.written / 2.8,
    });
  if (ureaW && ureaW.unit === "mg/dL") {
    ureaTerms.push({
      slip: "urea in mg/dL divided by 2.8 as if it were BUN (urea itself is ÷ 6.0)",
      value: ureaW.written / 2.8,
    });
    ureaTerms.push({ slip: "urea in mg/dL added without dividing", value: ureaW.written });
  }
  const ethanolTerms: Candidate[] = [{ slip: "", value: etoh }];
  if (i.ethanol !== undefined) {
    ethanolTerms.push({ slip: "ethanol left out", value: 0 });
    ethanolTerms.push({
      slip: "ethanol counted as mg/dL ÷ 3.7 (1.25 × molar) — also published, and shown beside",
      value: 1.25 * etoh,
    });
    if (etohW && etohW.unit === "mg/dL")
      ethanolTerms.push({ slip: "ethanol in mg/dL added without dividing", value: etohW.written });
  }
  const calcs: Candidate[] = [];
  for (const g of gluTerms) {
    for (const u of ureaTerms) {
      for (const e of ethanolTerms) {
        const slips = [g.slip, u.slip, e.slip].filter(Boolean);
        if (slips.length === 0 || slips.length > 2) continue;
        calcs.push({ slip: slips.join(" and "), value: 2 * na + g.value + u.value + e.value });
      }
    }
  }
  const dc = dorwartChalmers(i);
  if (dc)
    calcs.push({
      slip: "the Dorwart–Chalmers formula (1.86·Na + glucose + urea + 9) — a published alternative",
      value: dc.value,
    });
  if (i.potassium !== undefined)
    calcs.push({
      slip: "potassium counted: 2·(Na + K) + glucose + urea — a published alternative",
      value: 2 * (na + i.potassium) + glu + urea + etoh,
    });
  calcs.push({ slip: "sodium not doubled", value: na + glu + urea + etoh });
  calcs.push({ slip: "urea left out — that is the effective osmolality", value: 2 * na + glu + etoh });
  calcs.push({ slip: "glucose left out", value: 2 * na + urea + etoh });

  if (kind === "calculatedOsmolality") return calcs;
  const measured = i.measuredOsmolality;
  if (measured === undefined) return out;
  const ours = a.results.calculatedOsmolality!.value;
  out.push({ slip: "the subtraction reversed (calculated − measured)", value: ours - measured });
  for (const c of calcs) out.push({ slip: c.slip, value: measured - c.value });
  return out;
}
