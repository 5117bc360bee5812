import ucum from "@lhncbc/ucum-lhc";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { ANALYTE_IDS, ANALYTES, fromCanonical, toCanonical, toCanonicalFactor } from "../../core/analytes.js";
import { UCUM_CODES, type Unit } from "../../core/units.js";

const ucumUtils = ucum.UcumLhcUtils.getInstance();

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
