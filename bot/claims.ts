/**
 * Checking a colleague's result: a claimed calculated or effective osmolality, osmolal gap,
 * corrected sodium or anion gap is compared with the engine's default; if it does not match, with
 * the published alternatives Solute itself shows (a match is "matches <method>", not a slip); if
 * still not, with the usual slips (mg/dL not converted, BUN and urea swapped, ethanol forgotten or
 * counted twice, potassium or a corrected sodium in the anion gap, urea in the effective
 * osmolality, the wrong glucose factor …). Every claim gets exactly one verdict.
 */
import type { Assessment } from "../core/assess.js";
import { fmt, num } from "../core/format.js";
import { glucoseMgPerDl, HILLIER_FACTOR, KATZ_FACTOR } from "../core/formulas.js";
import type { Claim, ClaimKind, Reading, ReadValue } from "../core/reader/index.js";

export type VerdictStatus = "holds" | "matchesAlternative" | "doesNotHold" | "cannotCheck";

export interface Verdict {
  kind: ClaimKind;
  /** The number the colleague wrote, exactly as written. */
  claimed: number;
  /** The engine's value by the team's default method; undefined when the inputs for it are missing. */
  ours?: number;
  status: VerdictStatus;
  /** True for "holds" and "matchesAlternative". */
  holds: boolean;
  /** The method the claim matches, when it matches one. */
  method?: string;
  /** The slip that explains a claim that does not hold. */
  slip?: string;
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

/** Allowed difference for rounding: a whole mOsm/kg for osmolalities, 0.6 mmol/L otherwise. */
function tolerance(kind: ClaimKind): number {
  return kind === "correctedSodium" || kind === "anionGap" ? 0.6 : 1.0;
}

interface Candidate {
  /** For a published method: its name; for a slip: what went wrong. */
  what: string;
  value: number;
}

export function checkClaims(reading: Reading, assessment: Assessment): Verdict[] {
  return reading.claims.map((claim) => verdictFor(claim, reading, assessment));
}

function verdictFor(claim: Claim, reading: Reading, a: Assessment): Verdict {
  const withK = claim.withPotassium === true && claim.kind === "anionGap";
  const label = withK ? "anion gap with potassium" : LABELS[claim.kind];
  const ours = oursFor(claim.kind, a, withK);
  const base = { kind: claim.kind, claimed: claim.value };
  if (ours === undefined) {
    return {
      ...base,
      status: "cannotCheck",
      holds: false,
      text: `Cannot check the ${label} ${num(claim.value, 6)}: it needs ${NEEDS[claim.kind]}.`,
    };
  }
  const tol = tolerance(claim.kind);
  const near = (v: number) => Math.abs(v - claim.value) <= tol;
  const diff = claim.value - ours.value;
  if (near(ours.value)) {
    const rounding = Math.abs(diff) >= 0.05 ? " (the difference is rounding)" : "";
    return {
      ...base,
      ours: ours.value,
      status: "holds",
      holds: true,
      method: ours.how,
      text: `The ${label} ${num(claim.value, 6)} holds: ${ours.how} gives ${fmt(ours.value)}${rounding}.`,
    };
  }
  const closest = (list: Candidate[]) =>
    list
      .filter((c) => near(c.value))
      .sort((x, y) => Math.abs(x.value - claim.value) - Math.abs(y.value - claim.value))[0];
  const method = closest(alternativesFor(claim.kind, a));
  if (method) {
    return {
      ...base,
      ours: ours.value,
      status: "matchesAlternative",
      holds: true,
      method: method.what,
      text: `The ${label} ${num(claim.value, 6)} matches ${method.what}, a published method. Solute's default, ${ours.how}, gives ${fmt(ours.value)}: ${fmt(Math.abs(diff))} ${diff > 0 ? "lower" : "higher"}. Say which method the team uses.`,
    };
  }
  const slip = closest(slipsFor(claim.kind, reading, a));
  return {
    ...base,
    ours: ours.value,
    status: "doesNotHold",
    holds: false,
    ...(slip && { slip: slip.what }),
    text: `The ${label} ${num(claim.value, 6)} does not hold: ${ours.how} gives ${fmt(ours.value)} (difference ${fmt(diff)}).${
      slip
        ? ` It is explained by ${slip.what} (that gives ${fmt(slip.value)}).`
        : " No single common slip explains it: recheck the values and the arithmetic."
    }`,
  };
}

function oursFor(kind: ClaimKind, a: Assessment, withK: boolean): { value: number; how: string } | undefined {
  const r = a.results;
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
    case "anionGap": {
      if (withK) {
        const k = a.alternatives.find((x) => x.id === "anionGap.potassium");
        return k && { value: k.value, how: k.formula };
      }
      return r.anionGap && { value: r.anionGap.value, how: r.anionGap.formula };
    }
    case "correctedSodium":
      return r.correctedSodium && { value: r.correctedSodium.katz.value, how: "Katz (1.6 per 100 mg/dL)" };
  }
}

/** The published methods Solute shows beside its default, by what they give. */
function alternativesFor(kind: ClaimKind, a: Assessment): Candidate[] {
  const alt = (id: string) => a.alternatives.find((x) => x.id === id);
  const out: Candidate[] = [];
  const add = (what: string, id: string) => {
    const r = alt(id);
    if (r) out.push({ what, value: r.value });
  };
  if (kind === "calculatedOsmolality") {
    add("Dorwart–Chalmers (1.86·Na + glucose + urea + 9)", "calculatedOsmolality.dorwartChalmers");
    add("the formula with potassium, 2·(Na + K) + glucose + urea", "calculatedOsmolality.potassium");
    add("ethanol counted as mg/dL ÷ 3.7 (1.25 × molar, Purssell 2001)", "calculatedOsmolality.ethanol125");
    add("the older-adult screening equation (Hooper 2015)", "calculatedOsmolality.olderAdults");
  } else if (kind === "osmolalGap") {
    add("the gap from Dorwart–Chalmers", "osmolalGap.dorwartChalmers");
    add("the gap with ethanol counted as mg/dL ÷ 3.7 (Purssell 2001)", "osmolalGap.ethanol125");
    const m = a.inputs.measuredOsmolality;
    const k = alt("calculatedOsmolality.potassium");
    if (m !== undefined && k)
      out.push({ what: "the gap from 2·(Na + K) + glucose + urea", value: m - k.value });
    const h = alt("calculatedOsmolality.olderAdults");
    if (m !== undefined && h)
      out.push({ what: "the gap from the older-adult equation (Hooper 2015)", value: m - h.value });
  } else if (kind === "correctedSodium") {
    const h = a.results.correctedSodium?.hillier;
    if (h) out.push({ what: `Hillier (${HILLIER_FACTOR} per 100 mg/dL)`, value: h.value });
  } else if (kind === "anionGap") {
    add("the albumin-corrected anion gap (Figge 1998)", "anionGap.albuminCorrected");
  }
  return out;
}

function written(reading: Reading, analyte: string): ReadValue | undefined {
  return reading.values.find((v) => v.analyte === analyte);
}

/** Values a colleague would get from each usual slip. */
function slipsFor(kind: ClaimKind, reading: Reading, a: Assessment): Candidate[] {
  const i = a.inputs;
  const na = i.sodium;
  const glu = i.glucose;
  const urea = i.urea;
  const out: Candidate[] = [];
  if (na === undefined) return out;

  if (kind === "anionGap") {
    const { chloride: cl, bicarbonate: hco3, potassium: k } = i;
    if (cl === undefined || hco3 === undefined) return out;
    if (k !== undefined)
      out.push({ what: "potassium added (Na + K − Cl − HCO3)", value: na + k - cl - hco3 });
    const corrected = a.results.correctedSodium?.katz.value;
    if (corrected !== undefined && glu !== undefined && glucoseMgPerDl(glu) > 100)
      out.push({
        what: "the glucose-corrected sodium used; the anion gap takes the measured sodium (2024 consensus)",
        value: corrected - cl - hco3,
      });
    out.push({ what: "bicarbonate not subtracted", value: na - cl });
    out.push({ what: "chloride not subtracted", value: na - hco3 });
    return out;
  }
  if (glu === undefined) return out;

  const gluW = written(reading, "glucose");
  const bunW = written(reading, "bun");
  const ureaW = written(reading, "urea");
  const etoh = i.ethanol ?? 0;
  const etohW = written(reading, "ethanol");

  // Variants of the glucose term.
  const gluTerms: Candidate[] = [{ what: "", value: glu }];
  if (gluW && gluW.unit === "mg/dL")
    gluTerms.push({ what: "glucose in mg/dL added without dividing by 18", value: gluW.written });
  if (gluW && gluW.unit === "mmol/L")
    gluTerms.push({ what: "glucose already in mmol/L divided by 18 again", value: gluW.written / 18 });

  if (kind === "correctedSodium") {
    const mg = glucoseMgPerDl(glu);
    const excess = Math.max(0, mg - 100);
    if (mg > 400)
      out.push({
        what: "Hillier's 4.0 per 100 mg/dL above 400 mg/dL (a nonlinear reading, not a fixed rule)",
        value: na + (HILLIER_FACTOR * 300) / 100 + (4 * (mg - 400)) / 100,
      });
    out.push({
      what: "the factor applied to the whole glucose, not the excess over 100 mg/dL",
      value: na + (KATZ_FACTOR * mg) / 100,
    });
    out.push({
      what: "the factor applied per mmol/L instead of per 100 mg/dL",
      value: na + KATZ_FACTOR * Math.max(0, glu - 5.55),
    });
    out.push({
      what: "the correction subtracted instead of added",
      value: na - (KATZ_FACTOR * excess) / 100,
    });
    if (gluW && gluW.unit === "mmol/L")
      out.push({
        what: "the glucose in mmol/L used as if it were mg/dL",
        value: na + (KATZ_FACTOR * Math.max(0, gluW.written - 100)) / 100,
      });
    return out;
  }

  if (kind === "effectiveOsmolality") {
    for (const g of gluTerms) if (g.what) out.push({ what: g.what, value: 2 * na + g.value });
    if (urea !== undefined)
      out.push({
        what: "urea included — that is the total calculated osmolality; urea is not an effective osmole",
        value: 2 * na + glu + urea,
      });
    if (i.ethanol !== undefined)
      out.push({ what: "ethanol included; it crosses cell membranes", value: 2 * na + glu + etoh });
    out.push({ what: "sodium not doubled", value: na + glu });
    return out;
  }

  // Calculated osmolality, and the gap made from it.
  if (urea === undefined) return out;
  const ureaTerms: Candidate[] = [{ what: "", value: urea }];
  if (bunW && bunW.unit === "mg/dL") {
    ureaTerms.push({ what: "BUN in mg/dL added without dividing by 2.8", value: bunW.written });
    ureaTerms.push({
      what: "BUN in mg/dL divided by 6 as if it were urea (BUN is ÷ 2.8)",
      value: bunW.written / 6.006,
    });
  }
  if (ureaW && ureaW.unit === "mmol/L")
    ureaTerms.push({
      what: "urea in mmol/L divided by 2.8 as if it were BUN in mg/dL",
      value: ureaW.written / 2.8,
    });
  if (ureaW && ureaW.unit === "mg/dL") {
    ureaTerms.push({
      what: "urea in mg/dL divided by 2.8 as if it were BUN (urea itself is ÷ 6.0)",
      value: ureaW.written / 2.8,
    });
    ureaTerms.push({ what: "urea in mg/dL added without dividing", value: ureaW.written });
  }
  const ethanolTerms: Candidate[] = [{ what: "", value: etoh }];
  if (i.ethanol !== undefined) {
    ethanolTerms.push({ what: "ethanol left out", value: 0 });
    ethanolTerms.push({ what: "ethanol counted twice", value: 2 * etoh });
    if (etohW && etohW.unit === "mg/dL")
      ethanolTerms.push({ what: "ethanol in mg/dL added without dividing", value: etohW.written });
  }
  const calcs: Candidate[] = [];
  for (const g of gluTerms) {
    for (const u of ureaTerms) {
      for (const e of ethanolTerms) {
        const slips = [g.what, u.what, e.what].filter(Boolean);
        if (slips.length === 0 || slips.length > 2) continue;
        calcs.push({ what: slips.join(" and "), value: 2 * na + g.value + u.value + e.value });
      }
    }
  }
  calcs.push({ what: "sodium not doubled", value: na + glu + urea + etoh });
  calcs.push({ what: "urea left out — that is the effective osmolality", value: 2 * na + glu + etoh });
  calcs.push({ what: "glucose left out", value: 2 * na + urea + etoh });

  if (kind === "calculatedOsmolality") return calcs;
  const measured = i.measuredOsmolality;
  if (measured === undefined) return out;
  const ours = a.results.calculatedOsmolality!.value;
  out.push({ what: "the subtraction reversed (calculated − measured)", value: ours - measured });
  for (const c of calcs) out.push({ what: c.what, value: measured - c.value });
  return out;
}

/** The headline of a check: the verdict on what the colleague claimed, the worst first. */
export function checkHeadline(
  verdicts: Verdict[],
  arithmetic?: { text: string; value: number; claimed: number },
): string {
  if (arithmetic)
    return `Check: the written total is wrong — ${arithmetic.text} is ${fmt(arithmetic.value)}, not ${num(arithmetic.claimed, 6)}`;
  const failed = verdicts.find((v) => v.status === "doesNotHold");
  if (failed)
    return `Check: the ${LABELS[failed.kind]} ${num(failed.claimed, 6)} does not hold — ${fmt(failed.ours!)} by Solute's default`;
  const alternative = verdicts.find((v) => v.status === "matchesAlternative");
  if (alternative)
    return `Check: the ${LABELS[alternative.kind]} ${num(alternative.claimed, 6)} matches ${alternative.method!.split(" (")[0]}`;
  if (verdicts.length > 0 && verdicts.every((v) => v.status === "cannotCheck"))
    return "Check: cannot be checked with these values";
  const held = verdicts.find((v) => v.status === "holds");
  return held ? `Check: the ${LABELS[held.kind]} ${num(held.claimed, 6)} holds` : "Check";
}
