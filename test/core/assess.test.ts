import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { ANALYTES, toCanonical } from "../../core/analytes.js";
import { assess } from "../../core/assess.js";
import { CAUTIONS } from "../../core/cautions.js";
import { validateInputs } from "../../core/inputs.js";

const mg = (id: keyof typeof ANALYTES, v: number) => toCanonical(ANALYTES[id], v, "mg/dL");
const codes = (a: ReturnType<typeof assess>) => a.findings.map((f) => f.code);

describe("assess: the whole panel", () => {
  // Invented scenario: a resident's panel, Na 128, glucose 540 mg/dL, urea 14 mmol/L, osm 310.
  const a = assess({ sodium: 128, glucose: mg("glucose", 540), urea: 14, measuredOsmolality: 310 });

  it("computes every result it can, at full precision", () => {
    expect(a.results.calculatedOsmolality!.value).toBeCloseTo(256 + 540 / 18.0156 + 14, 9);
    expect(a.results.effectiveOsmolality!.value).toBeCloseTo(256 + 540 / 18.0156, 9);
    expect(a.results.osmolalGap!.value).toBeCloseTo(310 - (270 + 540 / 18.0156), 9);
    expect(a.results.correctedSodium!.katz.value).toBeCloseTo(128 + 1.6 * 4.4, 9);
    expect(a.results.correctedSodium!.hillier.value).toBeCloseTo(128 + 2.4 * 4.4, 9);
    expect(a.results.anionGap).toBeUndefined();
  });

  it("classes the hyponatraemia by measured osmolality", () => {
    // REFERENCES.md §3: hypertonic > 295 [M, from memory], common teaching range 275–295 [P].
    expect(codes(a)).toContain("sodium.low.hypertonic");
  });

  it("names the alternatives", () => {
    expect(a.alternatives.map((r) => r.id)).toContain("calculatedOsmolality.dorwartChalmers");
  });

  it("ends with the general caution and carries the gap cautions", () => {
    expect(a.cautions.at(-1)).toBe(CAUTIONS.general);
    expect(a.cautions).toContain(CAUTIONS.gapNormalDoesNotExclude);
    expect(a.cautions).toContain(CAUTIONS.osmometerMethod);
    expect(a.cautions).toContain(CAUTIONS.glucoseCorrection);
  });
});

describe("hyponatraemia classes", () => {
  const base = { sodium: 124, glucose: 5, urea: 5 };
  it("hypotonic below 275", () => {
    // REFERENCES.md §3: hypotonic < 275 (Spasovski 2014) — from memory [M].
    expect(codes(assess({ ...base, measuredOsmolality: 258 }))).toContain("sodium.low.hypotonic");
  });
  it("normal measured osmolality hints at pseudohyponatraemia", () => {
    // REFERENCES.md §3 [C]: Fortgens & Pillay 2011 — low Na with normal measured osmolality.
    const a = assess({ ...base, measuredOsmolality: 288 });
    expect(codes(a)).toContain("sodium.low.isotonic");
    expect(a.cautions).toContain(CAUTIONS.pseudohyponatraemia);
  });
  it("high measured but low effective osmolality: ineffective osmoles", () => {
    // REFERENCES.md §3 [C]: urea crosses cell membranes (ADA consensus footnotes).
    expect(codes(assess({ sodium: 124, glucose: 5, urea: 60, measuredOsmolality: 320 }))).toContain(
      "sodium.low.ineffectiveOsmoles",
    );
  });
  it("without measured osmolality it does not class", () => {
    expect(codes(assess(base))).toContain("sodium.low.unclassified");
  });
  it("a configurable reference range", () => {
    const a = assess({ ...base, measuredOsmolality: 278 }, { osmolalityRange: { low: 280, high: 300 } });
    expect(codes(a)).toContain("sodium.low.hypotonic");
  });
});

describe("the osmolal gap and ethanol", () => {
  it("< 10 is normal, ≥ 10 raised", () => {
    // REFERENCES.md §2 [P]: usual rule < 10 normal.
    expect(codes(assess({ sodium: 140, glucose: 5, urea: 5, measuredOsmolality: 299 }))).toContain(
      "gap.normal",
    );
    const raised = assess({ sodium: 140, glucose: 5, urea: 5, measuredOsmolality: 310 });
    expect(codes(raised)).toContain("gap.raised");
    expect(raised.cautions).toContain(CAUTIONS.gapOtherCauses);
    expect(codes(raised)).toContain("gap.impliedConcentrations");
  });

  it("ethanol that explains the gap, and a verdict that depends on the factor", () => {
    // Invented: ethanol 230 mg/dL ≈ 49.9 mmol/L; ÷ 4.61 and ÷ 3.7 (REFERENCES.md §2 [C]) disagree.
    const ethanol = mg("ethanol", 230);
    const a = assess({ sodium: 140, glucose: 5, urea: 5, ethanol, measuredOsmolality: 290 + 49.9 + 12 });
    expect(a.results.calculatedOsmolality!.formula).toContain("ethanol");
    expect(a.results.osmolalGap!.value).toBeCloseTo(12, 0);
    expect(codes(a)).toContain("gap.dependsOnEthanolFactor");
    expect(a.cautions).toContain(CAUTIONS.ethanolFactor);
    const explained = assess({
      sodium: 140,
      glucose: 5,
      urea: 5,
      ethanol,
      measuredOsmolality: 290 + 49.9 + 2,
    });
    expect(codes(explained)).toContain("gap.explainedByEthanol");
  });

  it("measured alcohols account for part of the gap", () => {
    const a = assess({ sodium: 140, glucose: 5, urea: 5, methanol: 15, measuredOsmolality: 310 });
    expect(codes(a)).toContain("gap.measuredAlcohols");
    expect(codes(a)).not.toContain("gap.impliedConcentrations");
  });

  it("a strongly negative gap asks for a recheck", () => {
    expect(codes(assess({ sodium: 140, glucose: 5, urea: 5, measuredOsmolality: 270 }))).toContain(
      "gap.negative",
    );
  });

  it("reads the anion gap beside the osmolal gap", () => {
    // REFERENCES.md §2a [C]: Kraut & Kurtz 2008 — early high osmolal gap, normal anion gap.
    const early = assess({
      sodium: 140,
      chloride: 104,
      bicarbonate: 26,
      glucose: 5,
      urea: 5,
      measuredOsmolality: 320,
    });
    expect(codes(early)).toContain("pattern.earlyAlcohol");
    const late = assess({
      sodium: 140,
      chloride: 100,
      bicarbonate: 8,
      glucose: 5,
      urea: 5,
      measuredOsmolality: 295,
    });
    expect(codes(late)).toContain("pattern.lateAlcohol");
  });
});

describe("HHS osmolality criteria", () => {
  // REFERENCES.md §3 [C]: 2024 consensus (Umpierrez et al., Diabetes Care 2024): glucose ≥ 600 mg/dL
  // (33.3 mmol/L) and effective > 300 or total > 320; ADA 2009 (Kitabchi): effective > 320;
  // JBDS 2023: 2·Na + glucose + urea ≥ 320.
  it("600 mg/dL is 33.3 mmol/L", () => {
    expect(mg("glucose", 600)).toBeCloseTo(33.3, 1);
  });
  it("met by 2024 but not by 2009", () => {
    const a = assess({ sodium: 134, glucose: mg("glucose", 620), urea: 10 });
    const f = a.findings.find((x) => x.code === "hhs.osmolalityMet")!;
    expect(f.text).toMatch(/2024 consensus .*: met/);
    expect(f.text).toMatch(/ADA 2009 \(effective > 320\): not met/);
    expect(a.cautions).toContain(CAUTIONS.hhsKetones);
  });
  it("not assessed below 600 mg/dL", () => {
    expect(codes(assess({ sodium: 150, glucose: mg("glucose", 500), urea: 10 })).join()).not.toMatch(/hhs/);
  });
});

describe("typo guards and critical values", () => {
  // REFERENCES.md §6 [P]: typo guards Na 90–200, K 1–12, glucose 10–3000 mg/dL, osm 200–450.
  it.each([
    ["sodium", 89],
    ["sodium", 201],
    ["potassium", 0.5],
    ["potassium", 13],
    ["glucose", mg("glucose", 3100)],
    ["glucose", mg("glucose", 9)],
    ["measuredOsmolality", 199],
    ["measuredOsmolality", 451],
    ["urea", mg("bun", 310)],
  ] as const)("refuses %s %s", (key, value) => {
    const { inputs, issues } = validateInputs({ [key]: value, sodium: key === "sodium" ? value : 140 });
    expect(issues.map((i) => i.key)).toContain(key);
    expect(inputs[key]).toBeUndefined();
  });

  it("keeps the values that pass", () => {
    const { inputs, issues } = validateInputs({ sodium: 300, glucose: 5 });
    expect(issues).toHaveLength(1);
    expect(inputs).toEqual({ glucose: 5 });
  });

  it("flags critical sodium and glucose", () => {
    // REFERENCES.md §6 [C]: Kost, JAMA 1990 — Na < 120 or > 160; glucose < 46 or > 484 mg/dL.
    expect(codes(assess({ sodium: 118 }))).toContain("critical.sodium.low");
    expect(codes(assess({ sodium: 161 }))).toContain("critical.sodium.high");
    expect(codes(assess({ sodium: 140, glucose: mg("glucose", 45) }))).toContain("critical.glucose.low");
    expect(codes(assess({ sodium: 140, glucose: mg("glucose", 490) }))).toContain("critical.glucose.high");
    expect(codes(assess({ sodium: 140, glucose: mg("glucose", 480) })).join()).not.toMatch(/critical/);
  });
});

describe("invariants (property tests)", () => {
  const panel = fc.record({
    sodium: fc.double({ min: 90, max: 200, noNaN: true }),
    potassium: fc.double({ min: 1, max: 12, noNaN: true }),
    glucose: fc.double({ min: 0.6, max: 160, noNaN: true }),
    urea: fc.double({ min: 0, max: 100, noNaN: true }),
    measuredOsmolality: fc.double({ min: 200, max: 450, noNaN: true }),
  });

  it("effective ≤ calculated when urea ≥ 0, and gap = measured − calculated", () => {
    fc.assert(
      fc.property(panel, (i) => {
        const a = assess(i);
        expect(a.results.effectiveOsmolality!.value).toBeLessThanOrEqual(
          a.results.calculatedOsmolality!.value,
        );
        expect(a.results.osmolalGap!.value).toBeCloseTo(
          i.measuredOsmolality - a.results.calculatedOsmolality!.value,
          9,
        );
        expect(a.cautions.at(-1)).toBe(CAUTIONS.general);
      }),
    );
  });

  it("corrected sodium ≥ measured sodium when glucose is above 100 mg/dL", () => {
    fc.assert(
      fc.property(panel, (i) => {
        const a = assess(i);
        if (i.glucose * 18.0156 > 100) {
          expect(a.results.correctedSodium!.katz.value).toBeGreaterThan(i.sodium);
          expect(a.results.correctedSodium!.hillier.value).toBeGreaterThan(
            a.results.correctedSodium!.katz.value,
          );
        } else {
          expect(a.results.correctedSodium!.katz.value).toBe(i.sodium);
        }
      }),
    );
  });
});
