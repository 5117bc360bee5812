import { describe, expect, it } from "vitest";
import { ANALYTE_IDS, ANALYTES, fromCanonical, toCanonical, toCanonicalFactor } from "../../core/analytes.js";
import { readMessage } from "../../core/reader/index.js";

describe("codes", () => {
  // REFERENCES.md §7 [C]: LOINC codes.
  it.each([
    ["sodium", "2951-2"],
    ["potassium", "2823-3"],
    ["glucose", "2345-7"],
    ["glucose", "14749-6"],
    ["bun", "3094-0"],
    ["bun", "14937-7"],
    ["urea", "3091-6"],
    ["urea", "22664-7"],
    ["measuredOsmolality", "2692-2"],
    ["ethanol", "5643-2"],
    ["ethanol", "14719-9"],
  ] as const)("%s has LOINC %s, confirmed", (id, code) => {
    expect(ANALYTES[id].loinc).toContainEqual(expect.objectContaining({ code, confirmed: true }));
  });

  it("every analyte's canonical unit is among its units", () => {
    for (const id of ANALYTE_IDS) expect(ANALYTES[id].units).toContain(ANALYTES[id].canonicalUnit);
  });
});

describe("typo guards: each analyte's plausible range, at and just beyond its ends", () => {
  // Our own typo guards (common practice: values outside these are almost always a typo or the
  // wrong unit), written in the unit a resident would type. At the limit a value is read; a step
  // beyond it is refused with value.implausible.
  const rows: [message: (v: string) => string, low: number | undefined, high: number, step: number][] = [
    [(v) => `Na ${v}`, 90, 200, 0.1],
    [(v) => `K ${v}`, 1, 12, 0.1],
    [(v) => `Cl ${v}`, 50, 160, 0.1],
    [(v) => `HCO3 ${v}`, 1, 60, 0.1],
    [(v) => `albumin ${v} g/L`, 5, 70, 0.1],
    [(v) => `albumin ${v} g/dL`, 0.5, 7, 0.01],
    [(v) => `glucose ${v} mg/dL`, 10, 3000, 0.1],
    [(v) => `BUN ${v}`, 1, 300, 0.1],
    [(v) => `osm ${v}`, 200, 450, 0.1],
    [(v) => `EtOH ${v} mg/dL`, undefined, 1000, 0.1],
    [(v) => `methanol ${v} mg/dL`, undefined, 1000, 0.1],
    [(v) => `ethylene glycol ${v} mg/dL`, undefined, 1000, 0.1],
    [(v) => `isopropanol ${v} mg/dL`, undefined, 1000, 0.1],
    [(v) => `acetone ${v} mg/dL`, undefined, 1000, 0.1],
    [(v) => `propylene glycol ${v} mg/dL`, undefined, 1000, 0.1],
    [(v) => `mannitol ${v} mg/dL`, undefined, 5000, 0.1],
    [(v) => `pH ${v}`, 6.5, 8, 0.01],
    [(v) => `BHB ${v} mmol/L`, undefined, 30, 0.1],
    [(v) => `lactate ${v} mmol/L`, undefined, 40, 0.1],
    [(v) => `urine osm ${v}`, 20, 1500, 0.1],
    [(v) => `urine Na ${v}`, undefined, 400, 0.1],
    [(v) => `urine K ${v}`, undefined, 250, 0.1],
  ];
  const read = (m: string) => {
    const r = readMessage(m);
    return { used: Object.keys(r.inputs).length === 1, codes: r.problems.map((p) => p.code) };
  };
  it.each(rows)("%s", (message, low, high, step) => {
    const at = (v: number) => message(String(Number(v.toFixed(4))));
    expect(read(at(high)), at(high)).toEqual({ used: true, codes: [] });
    expect(read(at(high + step)), at(high + step)).toEqual({ used: false, codes: ["value.implausible"] });
    if (low !== undefined) {
      expect(read(at(low)), at(low)).toEqual({ used: true, codes: [] });
      expect(read(at(low - step)), at(low - step)).toEqual({ used: false, codes: ["value.implausible"] });
    } else {
      expect(read(at(0)), at(0)).toEqual({ used: true, codes: [] });
    }
  });
});

describe("conversion factors against published molar masses", () => {
  // Molar masses from IUPAC standard atomic weights (C 12.011, H 1.008, N 14.007, O 15.999;
  // conventional values, from memory): mg/dL × 10 ÷ M = mmol/L. BUN counts the two nitrogens of
  // urea (28.014); lactate in mg/dL is reported as lactic acid (90.078), β-hydroxybutyrate as the
  // acid (104.105) — common practice.
  it.each([
    ["glucose", 180.156],
    ["urea", 60.056],
    ["bun", 28.014],
    ["ethanol", 46.069],
    ["methanol", 32.042],
    ["ethyleneGlycol", 62.068],
    ["isopropanol", 60.096],
    ["acetone", 58.08],
    ["propyleneGlycol", 76.095],
    ["mannitol", 182.172],
    ["betaHydroxybutyrate", 104.105],
    ["lactate", 90.078],
  ] as const)("%s: M = %s g/mol", (id, m) => {
    const a = ANALYTES[id];
    expect(toCanonicalFactor(a, "mg/dL")).toBeCloseTo(10 / m, 9);
    if (a.units.includes("mg/L")) expect(toCanonicalFactor(a, "mg/L")).toBeCloseTo(1 / m, 9);
    if (a.units.includes("g/L")) expect(toCanonicalFactor(a, "g/L")).toBeCloseTo(1000 / m, 9);
    expect(toCanonical(a, 100, "mg/dL")).toBeCloseTo(1000 / m, 9);
    expect(fromCanonical(a, 1000 / m, "mg/dL")).toBeCloseTo(100, 9);
  });

  it("monovalent ions: mEq/L is mmol/L; albumin g/dL is 10 g/L; osmolality per litre is read per kg", () => {
    for (const id of [
      "sodium",
      "potassium",
      "chloride",
      "bicarbonate",
      "urineSodium",
      "urinePotassium",
    ] as const)
      expect(toCanonicalFactor(ANALYTES[id], "mEq/L")).toBe(1);
    expect(toCanonicalFactor(ANALYTES.albumin, "g/dL")).toBe(10);
    expect(toCanonicalFactor(ANALYTES.measuredOsmolality, "mOsm/L")).toBe(1);
    expect(toCanonicalFactor(ANALYTES.bun, "mmol/L")).toBe(1);
    // A unit an analyte is not read in has no factor, and converting with it throws.
    expect(toCanonicalFactor(ANALYTES.sodium, "mg/dL")).toBeUndefined();
    expect(() => toCanonical(ANALYTES.sodium, 1, "mg/dL")).toThrow(/sodium is not read in mg\/dL/);
  });
});
