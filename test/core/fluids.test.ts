import { describe, expect, it } from "vitest";
import {
  adrogueMadias,
  freeWaterDeficit,
  INFUSATES,
  tbwFraction,
  totalBodyWater,
  volumeChange,
} from "../../core/fluids.js";

describe("the formulas against REFERENCES.md §5", () => {
  // Check values [D], REFERENCES.md §5; formula: Adrogué & Madias, NEJM 2000;342:1581 [C].
  it("Na 110, TBW 30 L, 1 L 3% NaCl → +13.0", () => {
    expect(adrogueMadias(110, 30, INFUSATES["saline-3"]!).value).toBeCloseTo(13.0, 1);
  });
  it("same with 0.9% NaCl → +1.42", () => {
    expect(adrogueMadias(110, 30, INFUSATES["saline-0.9"]!).value).toBeCloseTo(1.42, 2);
  });
  it("Na 168, TBW 34 L, 1 L 5% dextrose → −4.80", () => {
    expect(adrogueMadias(168, 34, INFUSATES["dextrose-5"]!).value).toBeCloseTo(-4.8, 2);
  });
  it("70 kg man (TBW 42 L), Na 160 → free water deficit 6.0 L", () => {
    expect(tbwFraction("adult", "male")! * 70).toBeCloseTo(42, 10);
    expect(freeWaterDeficit(160, 42).value).toBeCloseTo(6.0, 10);
  });
  it("potassium counts like sodium", () => {
    expect(adrogueMadias(120, 30, { name: "x", sodium: 130, potassium: 4 }).value).toBeCloseTo(14 / 31, 10);
  });
  it("one litre by the volume balance equals Adrogué–Madias", () => {
    expect(volumeChange(118, 35, INFUSATES["saline-0.9"]!, 1).value).toBeCloseTo(
      adrogueMadias(118, 35, INFUSATES["saline-0.9"]!).value,
      12,
    );
  });

  it("TBW fractions: 0.6 children and men, 0.5 women and older men, 0.45 older women", () => {
    // REFERENCES.md §5 — from memory [M], not yet confirmed in the original.
    expect([
      tbwFraction("child", undefined),
      tbwFraction("adult", "male"),
      tbwFraction("adult", "female"),
      tbwFraction("elderly", "male"),
      tbwFraction("elderly", "female"),
    ]).toEqual([0.6, 0.6, 0.5, 0.5, 0.45]);
  });

  it("infusates per litre", () => {
    // REFERENCES.md §5 [C]; the saline and bicarbonate strengths are derived here from IUPAC molar
    // masses (NaCl 58.44, NaHCO3 84.01 g/mol) and match the published 154, 77, 513, 856 [D], 1000.
    const na = Object.fromEntries(Object.values(INFUSATES).map((f) => [f.id, [f.sodium, f.potassium]]));
    expect(na).toEqual({
      "saline-0.9": [154, 0],
      "saline-0.45": [77, 0],
      "saline-3": [513, 0],
      "saline-5": [856, 0],
      "lactated-ringers": [130, 4],
      hartmanns: [131, 5],
      balanced: [140, 5],
      "dextrose-5": [0, 0],
      "bicarbonate-8.4": [1000, 0],
    });
  });
});

describe("total body water and the volume balance, worked by hand", () => {
  it("total body water is weight × fraction, with its working", () => {
    // Common teaching (REFERENCES.md §5, from memory [M]): 70 kg × 0.6 = 42 L.
    const tbw = totalBodyWater(70, 0.6, "adult male");
    expect(tbw.value).toBeCloseTo(42, 10);
    expect(tbw.unit).toBe("L");
    expect(tbw.working).toBe("70 kg × 0.6 (adult male) = 42.0 L");
    expect(totalBodyWater(80, 0.5, "adult female").value).toBeCloseTo(40, 10);
  });

  it("an adult or older person of no stated sex has no fraction; a child has one", () => {
    expect(tbwFraction("adult", undefined)).toBeUndefined();
    expect(tbwFraction("elderly", undefined)).toBeUndefined();
    expect(tbwFraction("child", "female")).toBe(0.6);
  });

  it("the potassium of the fluid counts, for any volume", () => {
    // Adrogué–Madias mass balance (NEJM 2000;342:1581), worked by hand: 0.5 L of a fluid with
    // Na 130 and K 4 into 40 L at Na 120: 0.5 × (130 + 4 − 120) ÷ 40.5 = 0.1728…
    const fluid = { name: "test fluid", sodium: 130, potassium: 4 };
    const r = volumeChange(120, 40, fluid, 0.5);
    expect(r.value).toBeCloseTo((0.5 * 14) / 40.5, 10);
    expect(r.label).toBe("Change in serum sodium for 500 mL");
    expect(adrogueMadias(120, 40, fluid).value).toBeCloseTo(14 / 41, 10);
  });
});
