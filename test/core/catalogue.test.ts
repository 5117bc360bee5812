import ucum from "@lhncbc/ucum-lhc";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { ANALYTE_IDS, ANALYTES, fromCanonical, toCanonical, toCanonicalFactor } from "../../core/analytes.js";
import { molarMass } from "../../core/molar-mass.js";
import { UCUM_CODES, type Unit } from "../../core/units.js";

const ucumUtils = ucum.UcumLhcUtils.getInstance();

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

describe("unit conversions", () => {
  // REFERENCES.md §6 [D]: mg/dL ÷ 18.016 (glucose), ÷ 2.801 (BUN), ÷ 6.006 (urea), ÷ 4.607 (ethanol).
  it.each([
    ["glucose", 18.016],
    ["bun", 2.801],
    ["urea", 6.006],
    ["ethanol", 4.607],
  ] as const)("%s: mg/dL ÷ %s = mmol/L", (id, divisor) => {
    expect(toCanonical(ANALYTES[id], 540, "mg/dL")).toBeCloseTo(540 / divisor, 1);
    expect(Math.abs(1 / toCanonicalFactor(ANALYTES[id], "mg/dL")! - divisor)).toBeLessThan(0.001);
  });

  // REFERENCES.md §6 [D]: for Na and K, mEq/L = mmol/L.
  it("mEq/L equals mmol/L for monovalent ions", () => {
    expect(toCanonical(ANALYTES.sodium, 128, "mEq/L")).toBe(128);
    expect(toCanonical(ANALYTES.potassium, 3.1, "mEq/L")).toBe(3.1);
  });

  it("albumin g/dL to g/L", () => {
    expect(toCanonical(ANALYTES.albumin, 3.2, "g/dL")).toBeCloseTo(32, 10);
  });

  it("refuses units an analyte is not read in", () => {
    expect(toCanonicalFactor(ANALYTES.sodium, "mg/dL")).toBeUndefined();
    expect(() => toCanonical(ANALYTES.measuredOsmolality, 300, "mmol/L")).toThrow();
  });

  // Cross-check against an independent implementation of UCUM: @lhncbc/ucum-lhc (US National
  // Library of Medicine), converting mass ↔ moles with the molecular weight.
  it("every accepted unit of every analyte agrees with the UCUM library", () => {
    let checked = 0;
    for (const id of ANALYTE_IDS) {
      const analyte = ANALYTES[id];
      for (const unit of analyte.units) {
        if (unit === "mOsm/L") continue; // read as mOsm/kg by convention, not by conversion
        const ours = toCanonical(analyte, 100, unit);
        const theirs = ucumUtils.convertUnitTo(
          UCUM_CODES[unit],
          100,
          UCUM_CODES[analyte.canonicalUnit as Unit],
          {
            molecularWeight: analyte.molarMass,
            charge: analyte.valence,
          },
        );
        expect(theirs.status, `${id} ${unit}`).toBe("succeeded");
        expect(ours, `${id} ${unit}`).toBeCloseTo(theirs.toVal as number, 9);
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(40);
  });

  it("UCUM codes are valid UCUM", () => {
    for (const code of Object.values(UCUM_CODES)) {
      expect(ucumUtils.validateUnitString(code).status, code).toBe("valid");
    }
  });

  it("round-trips every unit (property)", () => {
    const pairs = ANALYTE_IDS.flatMap((id) => ANALYTES[id].units.map((unit) => [id, unit] as const));
    fc.assert(
      fc.property(
        fc.constantFrom(...pairs),
        fc.double({ min: 0.001, max: 5000, noNaN: true }),
        ([id, unit], v) => {
          const analyte = ANALYTES[id];
          const back = fromCanonical(analyte, toCanonical(analyte, v, unit), unit);
          expect(back).toBeCloseTo(v, 8);
        },
      ),
    );
  });
});

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
