/**
 * Caution texts, in our own words. The general caution ends every interpreting reply; the specific
 * ones come with the results they qualify (sources: REFERENCES.md §2–§4).
 */
export const CAUTIONS = {
  general:
    "Decision support only. Check every number against the laboratory's reported values and follow your local protocols; the treating clinician decides.",
  gapNormalDoesNotExclude:
    "A normal osmolal gap does not rule out toxic alcohol poisoning: 20 mg/dL of methanol adds only about 6 mOsm/kg (Kraut & Kurtz, CJASN 2008).",
  gapTimeCourse:
    "The osmolal gap is highest early and falls as the alcohol is metabolised, while the anion gap rises; a late presentation can show a normal osmolal gap (Kraut & Kurtz, CJASN 2008).",
  gapFormulaDependent:
    "What counts as a normal gap depends on the formula used (about −5 to +15 across equations; Hoffman et al. 1993): compare like with like.",
  osmometerMethod:
    "Only freezing-point osmometry counts volatile alcohols; a vapour-pressure osmometer misses them. Ask the lab which method it used.",
  gapOtherCauses:
    "Other causes of a raised osmolal gap: alcoholic or diabetic ketoacidosis, renal failure, shock, mannitol, glycine, contrast media.",
  ethanolFactor:
    "Ethanol can be counted as mg/dL ÷ 4.61 (molar) or ÷ 3.7 (1.25 × molar, Purssell 2001). Both are shown; in dosed volunteers ÷ 4.6 left a normal gap far more often (Marino 2025).",
  glucoseCorrection:
    "Glucose-corrected sodium is an estimate: Katz (1.6) and Hillier (2.4 per 100 mg/dL) differ, and the relation is not linear at very high glucose (Hillier 1999). Both are shown.",
  pseudohyponatraemia:
    "Low sodium with a normal measured osmolality suggests pseudohyponatraemia: main-lab indirect ion-selective electrodes read falsely low with very high lipids or proteins; a blood-gas (direct ISE) sodium does not (Fortgens & Pillay 2011).",
  anionGapRange:
    "Anion-gap reference intervals depend on the analyser (about 3–11 mmol/L on modern ion-selective methods, 8–16 on older ones): use your lab's.",
  criticalValue:
    "A value is in the critical range: confirm it and act per your hospital's critical-result process.",
} as const;

export type CautionId = keyof typeof CAUTIONS;

/**
 * The same cautions in one short line each, for the first view of a reply on a phone; the full
 * texts, with their sources, are in the JSON and behind "more".
 */
export const SHORT_CAUTIONS: Record<CautionId, string> = {
  general: "Decision support only; local protocols and the treating clinician decide.",
  gapNormalDoesNotExclude: "A normal osmolal gap does not rule out a toxic alcohol.",
  gapTimeCourse: "The osmolal gap falls as an alcohol is metabolised, while the anion gap rises.",
  gapFormulaDependent: "What counts as a normal gap depends on the formula.",
  osmometerMethod: "Vapour-pressure osmometers miss volatile alcohols.",
  gapOtherCauses: "Ketoacidosis, renal failure, shock and mannitol raise the gap too.",
  ethanolFactor: "The ethanol factor (÷ 4.61 or ÷ 3.7) can change whether the gap is raised.",
  glucoseCorrection: "Corrected sodium is an estimate: Katz and Hillier differ.",
  pseudohyponatraemia: "Recheck the sodium by direct ISE (blood gas) before treating it.",
  anionGapRange: "Anion-gap ranges depend on the analyser: use your lab's.",
  criticalValue: "Critical value: confirm it and follow your critical-result process.",
};

/** Which cautions matter most, in order: at most two are shown in the first view. */
export const CAUTION_PRIORITY: readonly CautionId[] = [
  "criticalValue",
  "pseudohyponatraemia",
  "gapOtherCauses",
  "osmometerMethod",
  "ethanolFactor",
  "gapTimeCourse",
];
