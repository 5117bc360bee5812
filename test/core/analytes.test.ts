import { describe, expect, it } from "vitest";
import { ANALYTE_IDS, ANALYTES } from "../../core/analytes.js";

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
