/**
 * Planning aid for sodium correction (REFERENCES.md §5): total body water, the Adrogué–Madias
 * estimate of the change in serum sodium from one litre of an infusate, the same mass balance for
 * another volume, and the free water deficit. Pure functions; strong cautions go with every use.
 */
import { fmt, num } from "./format.js";
import { molarMass } from "./molar-mass.js";
import type { Result } from "./results.js";

export type AgeBand = "child" | "adult" | "elderly";
export type Sex = "male" | "female";

/** Fraction of body weight that is water (REFERENCES.md §5, from memory [M]). */
export function tbwFraction(age: AgeBand, sex: Sex | undefined): number | undefined {
  if (age === "child") return 0.6;
  if (sex === undefined) return undefined;
  if (age === "adult") return sex === "male" ? 0.6 : 0.5;
  return sex === "male" ? 0.5 : 0.45;
}

export interface Infusate {
  id: string;
  name: string;
  /** mmol/L */
  sodium: number;
  /** mmol/L */
  potassium: number;
}

const NACL_MM = molarMass({ Na: 1, Cl: 1 });
const NAHCO3_MM = molarMass({ Na: 1, H: 1, C: 1, O: 3 });
/** mmol/L of sodium in a w/v percentage solution: g per 100 mL × 10 ÷ molar mass × 1000. */
const percent = (p: number, mm: number) => Math.round(((p * 10) / mm) * 1000);

/** Generic infusates per litre (REFERENCES.md §5); saline strengths derived from NaCl's molar mass. */
export const INFUSATES: Record<string, Infusate> = {
  "saline-0.9": { id: "saline-0.9", name: "0.9% NaCl", sodium: percent(0.9, NACL_MM), potassium: 0 },
  "saline-0.45": { id: "saline-0.45", name: "0.45% NaCl", sodium: percent(0.45, NACL_MM), potassium: 0 },
  "saline-3": { id: "saline-3", name: "3% NaCl", sodium: percent(3, NACL_MM), potassium: 0 },
  "saline-5": { id: "saline-5", name: "5% NaCl", sodium: percent(5, NACL_MM), potassium: 0 },
  "lactated-ringers": { id: "lactated-ringers", name: "lactated Ringer's", sodium: 130, potassium: 4 },
  hartmanns: { id: "hartmanns", name: "Hartmann's", sodium: 131, potassium: 5 },
  balanced: { id: "balanced", name: "balanced multi-electrolyte solution", sodium: 140, potassium: 5 },
  "dextrose-5": { id: "dextrose-5", name: "5% dextrose", sodium: 0, potassium: 0 },
  "bicarbonate-8.4": {
    id: "bicarbonate-8.4",
    name: "8.4% sodium bicarbonate",
    sodium: percent(8.4, NAHCO3_MM),
    potassium: 0,
  },
};

export function totalBodyWater(weightKg: number, fraction: number, basis: string): Result {
  const value = weightKg * fraction;
  return {
    id: "totalBodyWater",
    label: "Total body water",
    formula: "weight × fraction",
    value,
    unit: "L",
    working: `${num(weightKg, 1)} kg × ${fraction} (${basis}) = ${fmt(value)} L`,
    source: "fractions of body weight: common teaching (from memory)",
  };
}

/** Adrogué–Madias: ΔNa per litre = (infusate Na + K − serum Na) ÷ (TBW + 1). */
export function adrogueMadias(
  serumNa: number,
  tbw: number,
  infusate: { sodium: number; potassium: number; name: string },
): Result {
  const value = (infusate.sodium + infusate.potassium - serumNa) / (tbw + 1);
  return {
    id: "sodiumChangePerLitre",
    label: `Change in serum sodium per litre of ${infusate.name}`,
    formula: "Adrogué–Madias: (infusate Na + K − serum Na) ÷ (TBW + 1)",
    value,
    unit: "mmol/L",
    working: `(${num(infusate.sodium)} + ${num(infusate.potassium)} − ${num(serumNa)}) ÷ (${fmt(tbw)} + 1) = ${fmt(value, 2)} mmol/L`,
    source: "Adrogué & Madias, NEJM 2000;342:1581",
  };
}

/** The same mass balance for V litres: V × (infusate Na + K − serum Na) ÷ (TBW + V). */
export function volumeChange(
  serumNa: number,
  tbw: number,
  infusate: { sodium: number; potassium: number; name: string },
  litres: number,
): Result {
  const value = (litres * (infusate.sodium + infusate.potassium - serumNa)) / (tbw + litres);
  return {
    id: "sodiumChangeForVolume",
    label: `Change in serum sodium for ${num(litres * 1000, 0)} mL`,
    formula: "V × (infusate Na + K − serum Na) ÷ (TBW + V)",
    value,
    unit: "mmol/L",
    working: `${num(litres, 3)} × (${num(infusate.sodium)} + ${num(infusate.potassium)} − ${num(serumNa)}) ÷ (${fmt(tbw)} + ${num(litres, 3)}) = ${fmt(value, 2)} mmol/L`,
    source: "the Adrogué–Madias mass balance, for a volume other than one litre",
  };
}

/** Free water deficit = TBW × (Na ÷ 140 − 1). */
export function freeWaterDeficit(serumNa: number, tbw: number): Result {
  const value = tbw * (serumNa / 140 - 1);
  return {
    id: "freeWaterDeficit",
    label: "Free water deficit",
    formula: "TBW × (Na ÷ 140 − 1)",
    value,
    unit: "L",
    working: `${fmt(tbw)} × (${num(serumNa)} ÷ 140 − 1) = ${fmt(value)} L`,
    source: "common teaching (from memory); ignores ongoing losses",
  };
}

/** Plausible body weight, kg: outside it a weight is refused (our own typo guard). */
export const WEIGHT_RANGE = { min: 0.5, max: 350 } as const;
/** Plausible total body water, L. */
export const TBW_RANGE = { min: 0.3, max: 250 } as const;
/** Plausible volume for one plan, L. */
export const VOLUME_RANGE = { min: 0.01, max: 10 } as const;
