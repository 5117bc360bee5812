/**
 * The analyte catalogue: what Solute can read and compute with. Adding an analyte starts here
 * (see DEVELOPERS.md): its canonical unit, the units people write it in, its molar mass from its
 * formula, its codes, and its typo guard.
 */
import { type Element, formulaText, molarMass } from "./molar-mass.js";
import { type CanonicalUnit, isMassUnit, massFactor, massToMolarFactor, type Unit } from "./units.js";

export const ANALYTE_IDS = [
  "sodium",
  "potassium",
  "chloride",
  "bicarbonate",
  "albumin",
  "glucose",
  "urea",
  "bun",
  "measuredOsmolality",
  "ethanol",
  "methanol",
  "ethyleneGlycol",
  "isopropanol",
  "acetone",
  "propyleneGlycol",
  "mannitol",
  "pH",
  "betaHydroxybutyrate",
  "lactate",
  "urineOsmolality",
  "urineSodium",
  "urinePotassium",
] as const;
export type AnalyteId = (typeof ANALYTE_IDS)[number];

export type UnitSystem = "si" | "conventional";

/** Where a value was measured: the main-lab serum or plasma, a urine sample, or a blood-gas analyser. */
export type Specimen = "serum" | "urine" | "bloodGas";

export interface LoincCode {
  code: string;
  /** "mass" or "moles" concentration, or "osmolality". */
  property: "mass" | "moles" | "osmolality";
  /** false where the code is from memory and not yet confirmed against LOINC. */
  confirmed: boolean;
}

export interface Analyte {
  id: AnalyteId;
  /** Plain name used in replies. */
  name: string;
  /** Short label used in echoes and working, e.g. "Na". */
  label: string;
  canonicalUnit: CanonicalUnit;
  /** Units accepted for this analyte. */
  units: readonly Unit[];
  /** The unit a bare number means whatever the channel's unit system, when that is unambiguous. */
  conventionalDefault?: Unit;
  /** What a bare number means under each declared unit system, when it depends on the system. */
  systemUnits?: Partial<Record<UnitSystem, Unit>>;
  formula?: Partial<Record<Element, number>>;
  /** g/mol, derived from `formula`. BUN is counted as its two nitrogen atoms (N2). */
  molarMass?: number;
  /** Charge, for mEq/L. */
  valence?: number;
  loinc: LoincCode[];
  /** Typo guard in canonical units: outside it a value is refused, never used. */
  plausible: { min: number; max: number };
  /** Critical-value limits in canonical units (lab-specific in practice). */
  critical?: { low?: number; high?: number };
}

function withMass(formula: Partial<Record<Element, number>>) {
  return { formula, molarMass: molarMass(formula) };
}

const GLUCOSE_MM = molarMass({ C: 6, H: 12, O: 6 });
const N2_MM = molarMass({ N: 2 });
const UREA_MM = molarMass({ C: 1, H: 4, N: 2, O: 1 });
const ETHANOL_MM = molarMass({ C: 2, H: 6, O: 1 });
const LACTATE_MM = molarMass({ C: 3, H: 6, O: 3 });
const BHB_MM = molarMass({ C: 4, H: 8, O: 3 });

/**
 * mg/dL → mmol/L for a molar mass (× 10 ÷ g/mol, by definition), used to state the typo guards in
 * the units they are published in. Conversions of values go through units.ts (mathjs).
 */
const mgdl = (mg: number, mm: number) => (mg * 10) / mm;

const ALCOHOL_UNITS: readonly Unit[] = ["mmol/L", "mg/dL", "mg/L", "g/L"];
const ALCOHOL_SYSTEM: Record<UnitSystem, Unit> = { si: "mmol/L", conventional: "mg/dL" };

export const ANALYTES: Record<AnalyteId, Analyte> = {
  sodium: {
    id: "sodium",
    name: "sodium",
    label: "Na",
    canonicalUnit: "mmol/L",
    units: ["mmol/L", "mEq/L"],
    conventionalDefault: "mmol/L",
    ...withMass({ Na: 1 }),
    valence: 1,
    loinc: [{ code: "2951-2", property: "moles", confirmed: true }],
    // Typo guard 90–200 [common practice]; critical < 120 or > 160 (Kost, JAMA 1990;263:704).
    plausible: { min: 90, max: 200 },
    critical: { low: 120, high: 160 },
  },
  potassium: {
    id: "potassium",
    name: "potassium",
    label: "K",
    canonicalUnit: "mmol/L",
    units: ["mmol/L", "mEq/L"],
    conventionalDefault: "mmol/L",
    ...withMass({ K: 1 }),
    valence: 1,
    loinc: [{ code: "2823-3", property: "moles", confirmed: true }],
    plausible: { min: 1, max: 12 },
    // Our own flags; potassium critical limits vary by lab [common practice].
    critical: { low: 2.5, high: 6.5 },
  },
  chloride: {
    id: "chloride",
    name: "chloride",
    label: "Cl",
    canonicalUnit: "mmol/L",
    units: ["mmol/L", "mEq/L"],
    conventionalDefault: "mmol/L",
    ...withMass({ Cl: 1 }),
    valence: 1,
    loinc: [{ code: "2075-0", property: "moles", confirmed: false }],
    // Our own typo guard [common practice], wide on purpose.
    plausible: { min: 50, max: 160 },
  },
  bicarbonate: {
    id: "bicarbonate",
    name: "bicarbonate",
    label: "HCO3",
    canonicalUnit: "mmol/L",
    units: ["mmol/L", "mEq/L"],
    conventionalDefault: "mmol/L",
    ...withMass({ H: 1, C: 1, O: 3 }),
    valence: 1,
    loinc: [{ code: "1963-8", property: "moles", confirmed: false }],
    plausible: { min: 1, max: 60 },
  },
  albumin: {
    id: "albumin",
    name: "albumin",
    label: "Alb",
    canonicalUnit: "g/L",
    units: ["g/L", "g/dL"],
    systemUnits: { si: "g/L", conventional: "g/dL" },
    loinc: [{ code: "1751-7", property: "mass", confirmed: false }],
    plausible: { min: 5, max: 70 },
  },
  glucose: {
    id: "glucose",
    name: "glucose",
    label: "glucose",
    canonicalUnit: "mmol/L",
    units: ["mmol/L", "mg/dL", "mg/L", "g/L"],
    systemUnits: { si: "mmol/L", conventional: "mg/dL" },
    formula: { C: 6, H: 12, O: 6 },
    molarMass: GLUCOSE_MM,
    loinc: [
      { code: "2345-7", property: "mass", confirmed: true },
      { code: "14749-6", property: "moles", confirmed: true },
    ],
    // Typo guard 10–3000 mg/dL [common practice]; critical < 46 or > 484 mg/dL (Kost 1990).
    plausible: { min: mgdl(10, GLUCOSE_MM), max: mgdl(3000, GLUCOSE_MM) },
    critical: { low: mgdl(46, GLUCOSE_MM), high: mgdl(484, GLUCOSE_MM) },
  },
  urea: {
    id: "urea",
    name: "urea",
    label: "urea",
    canonicalUnit: "mmol/L",
    units: ["mmol/L", "mg/dL", "mg/L", "g/L"],
    // A bare "urea" under conventional units may mean BUN or urea itself: the reader asks.
    systemUnits: { si: "mmol/L" },
    formula: { C: 1, H: 4, N: 2, O: 1 },
    molarMass: UREA_MM,
    loinc: [
      { code: "3091-6", property: "mass", confirmed: true },
      { code: "22664-7", property: "moles", confirmed: true },
    ],
    // The BUN guard 1–300 mg/dL expressed as urea [common practice].
    plausible: { min: mgdl(1, N2_MM), max: mgdl(300, N2_MM) },
  },
  bun: {
    id: "bun",
    name: "blood urea nitrogen",
    label: "BUN",
    canonicalUnit: "mmol/L",
    units: ["mg/dL", "mmol/L", "mg/L", "g/L"],
    conventionalDefault: "mg/dL",
    // BUN counts urea's two nitrogen atoms: one mmol of BUN is one mmol of urea.
    formula: { N: 2 },
    molarMass: N2_MM,
    loinc: [
      { code: "3094-0", property: "mass", confirmed: true },
      { code: "14937-7", property: "moles", confirmed: true },
    ],
    plausible: { min: mgdl(1, N2_MM), max: mgdl(300, N2_MM) },
  },
  measuredOsmolality: {
    id: "measuredOsmolality",
    name: "measured osmolality",
    label: "measured osm",
    canonicalUnit: "mOsm/kg",
    units: ["mOsm/kg", "mOsm/L"],
    conventionalDefault: "mOsm/kg",
    loinc: [{ code: "2692-2", property: "osmolality", confirmed: true }],
    plausible: { min: 200, max: 450 },
  },
  ethanol: {
    id: "ethanol",
    name: "ethanol",
    label: "EtOH",
    canonicalUnit: "mmol/L",
    units: ALCOHOL_UNITS,
    systemUnits: ALCOHOL_SYSTEM,
    formula: { C: 2, H: 6, O: 1 },
    molarMass: ETHANOL_MM,
    loinc: [
      { code: "5643-2", property: "mass", confirmed: true },
      { code: "14719-9", property: "moles", confirmed: true },
    ],
    // Above about 1,000 mg/dL (217 mmol/L) is beyond survivable levels: refused [common practice].
    plausible: { min: 0, max: mgdl(1000, ETHANOL_MM) },
  },
  methanol: alcohol("methanol", "methanol", "MeOH", { C: 1, H: 4, O: 1 }, 1000),
  ethyleneGlycol: alcohol("ethyleneGlycol", "ethylene glycol", "EG", { C: 2, H: 6, O: 2 }, 1000),
  isopropanol: alcohol("isopropanol", "isopropanol", "IPA", { C: 3, H: 8, O: 1 }, 1000),
  acetone: alcohol("acetone", "acetone", "acetone", { C: 3, H: 6, O: 1 }, 1000),
  propyleneGlycol: alcohol("propyleneGlycol", "propylene glycol", "PG", { C: 3, H: 8, O: 2 }, 1000),
  mannitol: alcohol("mannitol", "mannitol", "mannitol", { C: 6, H: 14, O: 6 }, 5000),
  pH: {
    id: "pH",
    name: "pH",
    label: "pH",
    canonicalUnit: "pH",
    units: ["pH"],
    conventionalDefault: "pH",
    loinc: [{ code: "2744-1", property: "moles", confirmed: false }],
    // Our own typo guard [common practice]: outside 6.5–8.0 is a typo, not a patient.
    plausible: { min: 6.5, max: 8.0 },
  },
  betaHydroxybutyrate: {
    id: "betaHydroxybutyrate",
    name: "β-hydroxybutyrate",
    label: "β-OHB",
    canonicalUnit: "mmol/L",
    units: ["mmol/L", "mg/dL"],
    // Reported in mmol/L almost everywhere; a bare value in a channel without SI units is asked about.
    systemUnits: { si: "mmol/L" },
    formula: { C: 4, H: 8, O: 3 },
    molarMass: BHB_MM,
    loinc: [{ code: "53060-9", property: "moles", confirmed: false }],
    plausible: { min: 0, max: 30 },
  },
  lactate: {
    id: "lactate",
    name: "lactate",
    label: "lactate",
    canonicalUnit: "mmol/L",
    units: ["mmol/L", "mg/dL"],
    systemUnits: { si: "mmol/L" },
    formula: { C: 3, H: 6, O: 3 },
    molarMass: LACTATE_MM,
    loinc: [{ code: "2524-7", property: "moles", confirmed: false }],
    plausible: { min: 0, max: 40 },
  },
  urineOsmolality: {
    id: "urineOsmolality",
    name: "urine osmolality",
    label: "urine osm",
    canonicalUnit: "mOsm/kg",
    units: ["mOsm/kg", "mOsm/L"],
    conventionalDefault: "mOsm/kg",
    loinc: [{ code: "2695-5", property: "osmolality", confirmed: false }],
    // Urine can be diluted to about 50 and concentrated to about 1200 [common practice]; guard wider.
    plausible: { min: 20, max: 1500 },
  },
  urineSodium: {
    id: "urineSodium",
    name: "urine sodium",
    label: "urine Na",
    canonicalUnit: "mmol/L",
    units: ["mmol/L", "mEq/L"],
    conventionalDefault: "mmol/L",
    ...withMass({ Na: 1 }),
    valence: 1,
    loinc: [{ code: "2955-3", property: "moles", confirmed: false }],
    plausible: { min: 0, max: 400 },
  },
  urinePotassium: {
    id: "urinePotassium",
    name: "urine potassium",
    label: "urine K",
    canonicalUnit: "mmol/L",
    units: ["mmol/L", "mEq/L"],
    conventionalDefault: "mmol/L",
    ...withMass({ K: 1 }),
    valence: 1,
    loinc: [{ code: "2829-0", property: "moles", confirmed: false }],
    plausible: { min: 0, max: 250 },
  },
};

/** Toxic alcohols and other osmoles measured directly; LOINC codes not listed rather than guessed. */
function alcohol(
  id: AnalyteId,
  name: string,
  label: string,
  formula: Partial<Record<Element, number>>,
  maxMgPerDl: number,
): Analyte {
  const { molarMass: mm } = withMass(formula);
  return {
    id,
    name,
    label,
    canonicalUnit: "mmol/L",
    units: ALCOHOL_UNITS,
    systemUnits: ALCOHOL_SYSTEM,
    formula,
    molarMass: mm,
    loinc: [],
    // Our own typo guard [common practice].
    plausible: { min: 0, max: mgdl(maxMgPerDl, mm) },
  };
}

/**
 * Whether a canonical value passes the analyte's typo guard. The limits are inclusive in every
 * unit: a limit written in mg/dL and converted to mmol/L differs from the catalogue's in the last
 * bits of a double, so "methanol 1000 mg/dL" must not fall just outside a limit of 1000 mg/dL.
 */
export function isPlausible(analyte: Analyte, canonical: number): boolean {
  return canonical >= analyte.plausible.min * (1 - 1e-12) && canonical <= analyte.plausible.max * (1 + 1e-12);
}

/** The typo guard's limits in the canonical unit, widened by a part in 10¹² as in isPlausible. */
export function plausibleLimits(analyte: Analyte): { min: number; max: number } {
  return { min: analyte.plausible.min * (1 - 1e-12), max: analyte.plausible.max * (1 + 1e-12) };
}

/** Factor from `unit` to the analyte's canonical unit, or undefined when the unit is not accepted. */
const FACTORS = new Map<AnalyteId, Map<Unit, number | undefined>>();

export function toCanonicalFactor(analyte: Analyte, unit: Unit): number | undefined {
  let byUnit = FACTORS.get(analyte.id);
  if (!byUnit) {
    byUnit = new Map();
    FACTORS.set(analyte.id, byUnit);
  }
  if (byUnit.has(unit)) return byUnit.get(unit);
  const factor = computeFactor(analyte, unit);
  byUnit.set(unit, factor);
  return factor;
}

function computeFactor(analyte: Analyte, unit: Unit): number | undefined {
  if (!analyte.units.includes(unit)) return undefined;
  if (unit === analyte.canonicalUnit) return 1;
  if (unit === "mEq/L") return 1 / (analyte.valence ?? 1);
  if (unit === "mOsm/L") return 1; // measured osmolality written per litre: read as per kg (see reader)
  if (analyte.canonicalUnit === "g/L") return massFactor(unit, "g/L");
  if (isMassUnit(unit) && analyte.molarMass) return massToMolarFactor(unit, analyte.molarMass);
  if (unit === "mmol/L") return 1;
  return undefined;
}

export function toCanonical(analyte: Analyte, value: number, unit: Unit): number {
  const factor = toCanonicalFactor(analyte, unit);
  if (factor === undefined) throw new Error(`${analyte.name} is not read in ${unit}`);
  return value * factor;
}

export function fromCanonical(analyte: Analyte, value: number, unit: Unit): number {
  return value / toCanonical(analyte, 1, unit);
}

export { formulaText };
