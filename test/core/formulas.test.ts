import { describe, expect, it } from "vitest";
import { ANALYTES, toCanonical } from "../../core/analytes.js";
import {
  albuminCorrectedAnionGap,
  anionGap,
  calculatedOsmolality,
  calculatedOsmolalityEthanolPurssell,
  correctedSodium,
  dorwartChalmers,
  effectiveOsmolality,
  hooperOlderAdults,
  impliedConcentration,
  osmolalGap,
  withPotassium,
} from "../../core/formulas.js";

const mg = (id: keyof typeof ANALYTES, v: number) => toCanonical(ANALYTES[id], v, "mg/dL");

describe("calculated osmolality", () => {
  it("2·Na + glucose + urea in mmol/L, with its working", () => {
    // REFERENCES.md §1 (Lynd et al. 2008, Table 1 [C]): SI form 2·Na + glucose + urea. Values [D].
    const r = calculatedOsmolality({ sodium: 140, glucose: 5, urea: 5 })!;
    expect(r.value).toBe(290);
    expect(r.formula).toBe("2·Na + glucose + urea");
    expect(r.working).toBe("2 × 140 + 5 + 5 = 290.0 mOsm/kg");
    expect(r.source).toMatch(/Smithline/);
  });

  it("agrees with the conventional form 2·Na + glucose/18 + BUN/2.8", () => {
    // REFERENCES.md §1 [C] (Lynd 2008): conventional form. The published divisors 18 and 2.8 are
    // rounded; the engine uses 18.016 and 2.801, so agreement is within 0.1 mOsm/kg here.
    const na = 131;
    const r = calculatedOsmolality({ sodium: na, glucose: mg("glucose", 450), urea: mg("bun", 42) })!;
    expect(Math.abs(r.value - (2 * na + 450 / 18 + 42 / 2.8))).toBeLessThan(0.1);
  });

  it("is undefined without all three inputs", () => {
    expect(calculatedOsmolality({ sodium: 140, glucose: 5 })).toBeUndefined();
  });

  it("adds ethanol molar when given, and the 1.25 variant beside it", () => {
    // REFERENCES.md §2 [C]: molar mg/dL ÷ 4.61 by default; Purssell 2001: 1.25 × mmol/L (÷ 3.7).
    const ethanol = mg("ethanol", 184.3); // 40 mmol/L, invented scenario
    const r = calculatedOsmolality({ sodium: 140, glucose: 5, urea: 5, ethanol })!;
    expect(r.value).toBeCloseTo(290 + 40, 1);
    const p = calculatedOsmolalityEthanolPurssell({ sodium: 140, glucose: 5, urea: 5, ethanol })!;
    expect(p.value).toBeCloseTo(290 + 184.3 / 3.7, 0);
    expect(p.value).toBeCloseTo(290 + 1.25 * ethanol, 10);
  });

  it("Dorwart–Chalmers: 1.86·Na + glucose/18 + BUN/2.8 + 9", () => {
    // REFERENCES.md §1 [C]: Dorwart & Chalmers, Clin Chem 1975;21:190. Inputs invented.
    const r = dorwartChalmers({ sodium: 140, glucose: mg("glucose", 90), urea: mg("bun", 14) })!;
    expect(r.value).toBeCloseTo(1.86 * 140 + 90 / 18 + 14 / 2.8 + 9, 1);
    expect(r.formula).toMatch(/^Dorwart–Chalmers/);
  });

  it("with potassium: 2·(Na + K) + glucose + urea", () => {
    // REFERENCES.md §1 [P]: UK practice.
    expect(withPotassium({ sodium: 140, potassium: 4, glucose: 5, urea: 5 })!.value).toBe(298);
  });

  it("older-adult screening: 1.86·(Na + K) + 1.15·glucose + urea + 14", () => {
    // REFERENCES.md §1 [C]: Hooper et al., BMJ Open 2015;5:e008846.
    expect(hooperOlderAdults({ sodium: 140, potassium: 4, glucose: 5, urea: 5 })!.value).toBeCloseTo(
      1.86 * 144 + 1.15 * 5 + 5 + 14,
      10,
    );
  });
});

describe("effective osmolality and the gap", () => {
  it("effective osmolality is 2·Na + glucose", () => {
    // REFERENCES.md §3 [C]: ADA consensus — urea and ethanol left out.
    expect(effectiveOsmolality({ sodium: 140, glucose: 5, urea: 30 })!.value).toBe(285);
    expect(effectiveOsmolality({ sodium: 140, glucose: mg("glucose", 180.156) })!.value).toBeCloseTo(290, 6);
  });

  it("gap = measured − calculated", () => {
    const inputs = { sodium: 140, glucose: 5, urea: 5, measuredOsmolality: 310 };
    const g = osmolalGap(inputs, calculatedOsmolality(inputs))!;
    expect(g.value).toBe(20);
    expect(g.working).toBe("310 − 290 = 20.0 mOsm/kg");
  });

  it("a residual gap of 20 implies methanol 64 or ethylene glycol 124 mg/dL", () => {
    // REFERENCES.md §2, example [D]: mg/dL ≈ gap × MW / 10.
    expect(impliedConcentration(20, "methanol").value).toBeCloseTo(64.1, 1);
    expect(impliedConcentration(20, "ethyleneGlycol").value).toBeCloseTo(124.1, 1);
    expect(impliedConcentration(20, "isopropanol").value).toBeCloseTo(120.2, 1);
    expect(impliedConcentration(20, "propyleneGlycol").value).toBeCloseTo(152.2, 1);
  });

  it("20 mg/dL of methanol adds only about 6 mOsm/kg", () => {
    // REFERENCES.md §2 [C]: Kraut & Kurtz, CJASN 2008.
    expect(mg("methanol", 20)).toBeCloseTo(6.2, 1);
  });
});

describe("anion gap", () => {
  it("Na − (Cl + HCO3), and with K", () => {
    // REFERENCES.md §2a [P]: definition; some labs add K.
    const i = { sodium: 140, potassium: 4, chloride: 104, bicarbonate: 24 };
    expect(anionGap(i)!.value).toBe(12);
    expect(anionGap(i, true)!.value).toBe(16);
  });

  it("albumin-corrected: AG + 2.5 × (4.0 − albumin g/dL)", () => {
    // REFERENCES.md §2a: Figge et al., Crit Care Med 1998 — from memory [M], not yet confirmed.
    const i = { sodium: 140, chloride: 104, bicarbonate: 24, albumin: 20 }; // 2.0 g/dL
    expect(albuminCorrectedAnionGap(i)!.value).toBeCloseTo(17, 10);
  });
});

describe("glucose-corrected sodium", () => {
  // REFERENCES.md §4: Katz 1973 [C via ADA], Hillier 1999 [C]; per mmol/L above baseline 0.288 and
  // 0.432 [D]; baseline 100 mg/dL = 5.55 mmol/L [D].
  it("Katz adds 1.6 and Hillier 2.4 per 100 mg/dL above 100", () => {
    const i = { sodium: 128, glucose: mg("glucose", 600) };
    expect(correctedSodium(i, "katz")!.value).toBeCloseTo(128 + 8, 6);
    expect(correctedSodium(i, "hillier")!.value).toBeCloseTo(128 + 12, 6);
  });

  it("per mmol/L above 5.55: 0.288 (Katz), 0.432 (Hillier)", () => {
    const base = mg("glucose", 100);
    expect(base).toBeCloseTo(5.55, 2);
    const katz = correctedSodium({ sodium: 130, glucose: base + 10 }, "katz")!.value - 130;
    const hillier = correctedSodium({ sodium: 130, glucose: base + 10 }, "hillier")!.value - 130;
    expect(katz / 10).toBeCloseTo(0.288, 3);
    expect(hillier / 10).toBeCloseTo(0.432, 3);
  });

  it("no correction at or below 100 mg/dL", () => {
    expect(correctedSodium({ sodium: 130, glucose: 4 }, "katz")!.value).toBe(130);
  });
});

// A formula with an input missing gives nothing, never NaN (the mutation run found these guards
// unguarded). Each formula is tried with each of its inputs left out in turn [D].
describe("a missing input gives no result", () => {
  const full = {
    sodium: 140,
    potassium: 4,
    chloride: 100,
    bicarbonate: 24,
    glucose: 5,
    urea: 5,
    ethanol: 10,
    albumin: 30,
  };
  const table: [string, (i: typeof full) => unknown, (keyof typeof full)[]][] = [
    ["calculated osmolality", (i) => calculatedOsmolality(i), ["sodium", "glucose", "urea"]],
    [
      "with ethanol × 1.25",
      (i) => calculatedOsmolalityEthanolPurssell(i),
      ["sodium", "glucose", "urea", "ethanol"],
    ],
    ["Dorwart–Chalmers", (i) => dorwartChalmers(i), ["sodium", "glucose", "urea"]],
    ["with potassium", (i) => withPotassium(i), ["sodium", "potassium", "glucose", "urea"]],
    ["older-adult screening", (i) => hooperOlderAdults(i), ["sodium", "potassium", "glucose", "urea"]],
    ["effective osmolality", (i) => effectiveOsmolality(i), ["sodium", "glucose"]],
    ["anion gap", (i) => anionGap(i), ["sodium", "chloride", "bicarbonate"]],
    ["anion gap with K", (i) => anionGap(i, true), ["sodium", "chloride", "bicarbonate", "potassium"]],
    ["Katz", (i) => correctedSodium(i, "katz"), ["sodium", "glucose"]],
  ];
  it.each(table)("%s", (_, formula, needs) => {
    const whole = formula(full) as { value: number } | undefined;
    expect(Number.isFinite(whole?.value)).toBe(true);
    for (const key of needs) {
      const { [key]: _dropped, ...rest } = full;
      expect(formula(rest as typeof full), `without ${key}`).toBeUndefined();
    }
  });
});
