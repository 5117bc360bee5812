import { describe, expect, it } from "vitest";
import { ANALYTES } from "../../core/analytes.js";
import { formulaText, molarMass } from "../../core/molar-mass.js";

describe("molar masses from IUPAC atomic weights", () => {
  // REFERENCES.md §2 [D]: molar masses from IUPAC conventional atomic weights.
  it.each([
    ["methanol", 32.04],
    ["ethanol", 46.07],
    ["acetone", 58.08],
    ["isopropanol", 60.1],
    ["ethyleneGlycol", 62.07],
    ["propyleneGlycol", 76.09],
    ["mannitol", 182.17],
  ] as const)("%s is %s g/mol", (id, expected) => {
    expect(ANALYTES[id].molarMass).toBeCloseTo(expected, 1);
    expect(Math.abs(ANALYTES[id].molarMass! - expected)).toBeLessThan(0.01);
  });

  // REFERENCES.md §6 [D]: glucose 180.156, urea 60.056, N2 28.013 (IUPAC atomic weights).
  it("glucose, urea and urea nitrogen", () => {
    expect(ANALYTES.glucose.molarMass).toBeCloseTo(180.156, 3);
    expect(ANALYTES.urea.molarMass).toBeCloseTo(60.056, 3);
    expect(Math.abs(ANALYTES.bun.molarMass! - 28.013)).toBeLessThan(0.002);
  });

  it("diethylene glycol, not in the catalogue, checks the formula helper", () => {
    // REFERENCES.md §2 [D]: diethylene glycol 106.12.
    expect(molarMass({ C: 4, H: 10, O: 3 })).toBeCloseTo(106.12, 2);
  });
});

describe("a formula written out", () => {
  // Common practice: element symbols in the order given, a count of one not written.
  it.each([
    [{ C: 2, H: 6, O: 1 }, "C2H6O"],
    [{ C: 6, H: 12, O: 6 }, "C6H12O6"],
    [{ Na: 1, Cl: 1 }, "NaCl"],
    [{}, ""],
  ] as const)("%j is %s", (formula, text) => {
    expect(formulaText(formula)).toBe(text);
  });

  it("sums every element, each times its count", () => {
    // IUPAC conventional atomic weights (core/molar-mass.ts): NaCl = 22.99 + 35.45.
    expect(molarMass({ Na: 1, Cl: 1 })).toBeCloseTo(58.44, 2);
    expect(molarMass({ H: 2, O: 1 })).toBeCloseTo(2 * 1.008 + 15.999, 6);
    expect(molarMass({})).toBe(0);
  });
});
