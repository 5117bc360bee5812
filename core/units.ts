/**
 * Units and conversions. Conversion factors are worked out once per (unit, molar mass) with
 * mathjs units — mass concentration divided by molar mass gives amount concentration — and cached,
 * so the hot path is a single multiplication. mathjs (its unit factories only) is loaded by
 * loadUnits(), which the conversation awaits once before its first message, so start-up does not
 * wait for it.
 */
import type { Unit as MathUnit } from "mathjs";

let math: typeof import("./unit-math.js").math | undefined;
let loading: Promise<void> | undefined;

/** Loads the unit machinery; call (and await) once before converting. Idempotent. */
export function loadUnits(): Promise<void> {
  loading ??= import("./unit-math.js").then((m) => {
    math = m.math;
  });
  return loading;
}

function units(): NonNullable<typeof math> {
  if (!math) throw new Error("units are not loaded: await loadUnits() first");
  return math;
}

/** The spellings we accept, normalised. UCUM codes for each are in UCUM_CODES. */
export const UNITS = ["mmol/L", "mEq/L", "mg/dL", "mg/L", "g/L", "g/dL", "mOsm/kg", "mOsm/L", "pH"] as const;
export type Unit = (typeof UNITS)[number];

/** Canonical units the engine computes in. */
export type CanonicalUnit = "mmol/L" | "mOsm/kg" | "g/L" | "pH";

/** UCUM case-sensitive codes (UCUM specification; `eq` and `osm` are 1 mol in UCUM). */
export const UCUM_CODES: Record<Unit, string> = {
  "mmol/L": "mmol/L",
  "mEq/L": "meq/L",
  "mg/dL": "mg/dL",
  "mg/L": "mg/L",
  "g/L": "g/L",
  "g/dL": "g/dL",
  "mOsm/kg": "mosm/kg",
  "mOsm/L": "mosm/L",
  pH: "[pH]",
};

/** Units of mass concentration: they need a molar mass to become mmol/L. */
const MASS_UNITS: ReadonlySet<Unit> = new Set<Unit>(["mg/dL", "mg/L", "g/L", "g/dL"]);

export function isMassUnit(unit: Unit): boolean {
  return MASS_UNITS.has(unit);
}

const cache = new Map<string, number>();

/**
 * mmol/L per one `unit` of a substance of the given molar mass (g/mol), e.g. mg/dL of glucose
 * (180.156 g/mol) → 0.0555. Computed with mathjs units and cached.
 */
export function massToMolarFactor(unit: Unit, molarMassGPerMol: number): number {
  const key = `${unit}|${molarMassGPerMol}`;
  let factor = cache.get(key);
  if (factor === undefined) {
    if (!MASS_UNITS.has(unit)) throw new Error(`not a mass concentration unit: ${unit}`);
    const m = units();
    const amount = m.unit(1, unit).divide(m.unit(molarMassGPerMol, "g/mol")) as MathUnit;
    factor = amount.toNumber("mmol/L");
    cache.set(key, factor);
  }
  return factor;
}

/** Factor between two mass-concentration units (e.g. g/dL → g/L = 10), with mathjs units. */
export function massFactor(from: Unit, to: Unit): number {
  const key = `${from}>${to}`;
  let factor = cache.get(key);
  if (factor === undefined) {
    factor = units().unit(1, from).toNumber(to);
    cache.set(key, factor);
  }
  return factor;
}
