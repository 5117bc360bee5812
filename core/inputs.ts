/**
 * The engine's typed inputs: every value in its analyte's canonical unit (mmol/L; mOsm/kg for
 * measured osmolality; g/L for albumin). BUN is read into `urea` (one mmol of BUN is one mmol of
 * urea). Validated with zod: a value outside its typo guard is refused, never used.
 */
import { z } from "zod";
import { ANALYTES, type AnalyteId, plausibleLimits } from "./analytes.js";

export const INPUT_KEYS = [
  "sodium",
  "potassium",
  "chloride",
  "bicarbonate",
  "albumin",
  "glucose",
  "urea",
  "measuredOsmolality",
  "ethanol",
  "methanol",
  "ethyleneGlycol",
  "isopropanol",
  "acetone",
  "propyleneGlycol",
  "mannitol",
  // Added later: appended, so the Redis log's index encoding of older records stays valid.
  "pH",
  "betaHydroxybutyrate",
  "lactate",
  "urineOsmolality",
  "urineSodium",
  "urinePotassium",
] as const satisfies readonly AnalyteId[];
export type InputKey = (typeof INPUT_KEYS)[number];

function guarded(id: InputKey) {
  const { plausible, name, canonicalUnit } = ANALYTES[id];
  // The reader's typo guard (isPlausible), so whatever the reader takes is stored and read back.
  const limits = plausibleLimits(ANALYTES[id]);
  return z
    .number()
    .finite()
    .min(limits.min, {
      message: `${name} below ${round(plausible.min)} ${canonicalUnit} is not plausible`,
    })
    .max(limits.max, {
      message: `${name} above ${round(plausible.max)} ${canonicalUnit} is not plausible`,
    })
    .optional();
}

function round(n: number): number {
  return Math.round(n * 10) / 10;
}

export const LabInputsSchema = z
  .object(
    Object.fromEntries(INPUT_KEYS.map((k) => [k, guarded(k)])) as Record<
      InputKey,
      ReturnType<typeof guarded>
    >,
  )
  .strict();

export type LabInputs = Partial<Record<InputKey, number>>;

export interface InputIssue {
  key: InputKey;
  message: string;
}

/** Validates inputs; returns the inputs that pass and one issue per refused value. */
export function validateInputs(raw: Record<string, unknown>): { inputs: LabInputs; issues: InputIssue[] } {
  const parsed = LabInputsSchema.safeParse(raw);
  if (parsed.success) return { inputs: parsed.data as LabInputs, issues: [] };
  const refused = new Set<string>();
  const issues: InputIssue[] = [];
  for (const issue of parsed.error.issues) {
    const key = String(issue.path[0] ?? "");
    if ((INPUT_KEYS as readonly string[]).includes(key)) {
      refused.add(key);
      issues.push({ key: key as InputKey, message: issue.message });
    } else {
      throw new Error(`unexpected input: ${issue.message}`);
    }
  }
  const kept = Object.fromEntries(Object.entries(raw).filter(([k]) => !refused.has(k)));
  return { inputs: LabInputsSchema.parse(kept) as LabInputs, issues };
}
