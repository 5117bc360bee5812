import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { ANALYTES, toCanonical } from "../../core/analytes.js";
import { assess } from "../../core/assess.js";
import { CAUTIONS } from "../../core/cautions.js";
import { contradictions } from "../../core/findings.js";
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

  it("classes the hyponatraemia as translocational: glucose, an effective solute, holds the osmolality up", () => {
    // REFERENCES.md §3: hypertonic > 295 [M, from memory], common teaching range 275–295 [P].
    expect(codes(a)).toContain("hyponatraemia.hypertonic");
  });

  it("findings are ordered danger first, each with a severity", () => {
    const order = { danger: 0, warning: 1, info: 2 } as const;
    const ranks = a.findings.map((f) => order[f.severity]);
    expect(ranks).toEqual([...ranks].sort((x, y) => x - y));
  });

  it("ends with the general caution", () => {
    expect(a.cautions.at(-1)).toBe(CAUTIONS.general);
    expect(a.cautions).toContain(CAUTIONS.glucoseCorrection);
  });
});

describe("the osmolal gap, ethanol and toxic alcohols", () => {
  it("< 10 is normal, ≥ 10 raised, < −10 negative", () => {
    // REFERENCES.md §2 [P]: usual rule < 10 normal. Calculated 2·140 + 5 + 5 = 290 [D].
    const at = (m: number) => codes(assess({ sodium: 140, glucose: 5, urea: 5, measuredOsmolality: m }));
    expect(at(299.9)).toContain("gap.normal");
    expect(at(300)).toContain("gap.raised");
    expect(at(280)).toContain("gap.normal");
    expect(at(279.9)).toContain("gap.negative");
  });

  it("a raised gap names a possible toxic alcohol with a next step", () => {
    const raised = assess({ sodium: 140, glucose: 5, urea: 5, measuredOsmolality: 310 });
    const f = raised.findings.find((x) => x.code === "toxicAlcohol.possible")!;
    expect(f.severity).toBe("danger");
    expect(f.text).toMatch(/Next:/);
    // REFERENCES.md §2 [D]: gap 20 → methanol 64, ethylene glycol 124 mg/dL.
    expect(f.text).toMatch(/methanol about 64, ethylene glycol about 124/);
    expect(raised.cautions).toContain(CAUTIONS.gapOtherCauses);
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
    expect(codes(explained)).not.toContain("toxicAlcohol.possible");
  });

  it("measured alcohols account for part of the gap", () => {
    const a = assess({ sodium: 140, glucose: 5, urea: 5, methanol: 15, measuredOsmolality: 310 });
    expect(codes(a)).toContain("gap.measuredAlcohols");
    expect(codes(a)).not.toContain("toxicAlcohol.possible");
  });

  it("reads the anion gap beside the osmolal gap (Kraut & Kurtz 2008 [C])", () => {
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

  it("the anion gap is judged against the lab's interval, not a fixed 11", () => {
    // REFERENCES.md §2a [M]: about 3–11 on modern analysers, 8–16 on older ones. AG 140 − 100 − 26 = 14 [D].
    const i = { sodium: 140, chloride: 100, bicarbonate: 26 };
    expect(codes(assess(i))).toContain("anionGap.raised");
    expect(codes(assess(i, { anionGapRange: { low: 8, high: 16 } }))).toContain("anionGap.normal");
    expect(codes(assess({ ...i, bicarbonate: 29 }))).toContain("anionGap.normal"); // 11: at the edge, not raised
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
    ["pH", 6.4],
    ["pH", 8.1],
    ["ethanol", mg("ethanol", 1001)],
  ] as const)("refuses %s %s", (key, value) => {
    const { inputs, issues } = validateInputs({ [key]: value, sodium: key === "sodium" ? value : 140 });
    expect(issues.map((i) => i.key)).toContain(key);
    expect(inputs[key]).toBeUndefined();
  });

  it("flags critical sodium and glucose (Kost, JAMA 1990 [C]: Na < 120 or > 160; glucose < 46 or > 484 mg/dL)", () => {
    const subjects = (i: Parameters<typeof assess>[0]) =>
      assess(i)
        .findings.filter((f) => f.code === "critical.value")
        .map((f) => f.subject);
    expect(subjects({ sodium: 119.9 })).toEqual(["sodium.low"]);
    expect(subjects({ sodium: 120 })).toEqual([]);
    expect(subjects({ sodium: 160 })).toEqual([]);
    expect(subjects({ sodium: 160.1 })).toEqual(["sodium.high"]);
    expect(subjects({ sodium: 140, glucose: mg("glucose", 45) })).toEqual(["glucose.low"]);
    expect(subjects({ sodium: 140, glucose: mg("glucose", 490) })).toEqual(["glucose.high"]);
    expect(subjects({ sodium: 140, glucose: mg("glucose", 480) })).toEqual([]);
    expect(assess({ sodium: 118 }).findings[0]!.severity).toBe("danger");
  });
});

describe("invariants (property tests)", () => {
  const panel = fc.record(
    {
      sodium: fc.double({ min: 90, max: 200, noNaN: true }),
      potassium: fc.double({ min: 1, max: 12, noNaN: true }),
      chloride: fc.double({ min: 50, max: 160, noNaN: true }),
      bicarbonate: fc.double({ min: 1, max: 60, noNaN: true }),
      glucose: fc.double({ min: 0.6, max: 160, noNaN: true }),
      urea: fc.double({ min: 0, max: 100, noNaN: true }),
      measuredOsmolality: fc.double({ min: 200, max: 450, noNaN: true }),
      ethanol: fc.double({ min: 0, max: 200, noNaN: true }),
      mannitol: fc.double({ min: 0, max: 100, noNaN: true }),
      pH: fc.double({ min: 6.5, max: 8, noNaN: true }),
      betaHydroxybutyrate: fc.double({ min: 0, max: 30, noNaN: true }),
      urineOsmolality: fc.double({ min: 20, max: 1500, noNaN: true }),
      urineSodium: fc.double({ min: 0, max: 400, noNaN: true }),
      urinePotassium: fc.double({ min: 0, max: 250, noNaN: true }),
    },
    { requiredKeys: ["sodium"] },
  );

  it("no reply carries two findings that contradict each other", () => {
    fc.assert(
      fc.property(panel, (i) => {
        expect(contradictions(codes(assess(i)))).toEqual([]);
      }),
      { numRuns: 3000 },
    );
  });

  it("effective ≤ calculated when urea ≥ 0 and no mannitol, and gap = measured − calculated", () => {
    fc.assert(
      fc.property(panel, (i) => {
        const a = assess({ ...i, mannitol: undefined, ethanol: undefined });
        if (!a.results.calculatedOsmolality) return;
        expect(a.results.effectiveOsmolality!.value).toBeLessThanOrEqual(
          a.results.calculatedOsmolality.value,
        );
        if (i.measuredOsmolality !== undefined)
          expect(a.results.osmolalGap!.value).toBeCloseTo(
            i.measuredOsmolality - a.results.calculatedOsmolality.value,
            9,
          );
        expect(a.cautions.at(-1)).toBe(CAUTIONS.general);
      }),
    );
  });

  it("corrected sodium ≥ measured sodium when glucose is above 100 mg/dL", () => {
    fc.assert(
      fc.property(panel, (i) => {
        if (i.glucose === undefined) return;
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

// Edges and texts the mutation run found unguarded [D].
describe("assess: what the mutation run found unguarded", () => {
  const codes = (i: Parameters<typeof assess>[0]) => assess(i).findings.map((f) => f.code);
  const text = (i: Parameters<typeof assess>[0], code: string) =>
    assess(i).findings.find((f) => f.code === code)?.text;

  it("the glucose-correction caution from a glucose above 100 mg/dL", () => {
    expect(assess({ sodium: 140, glucose: 5.5 }).cautionIds).not.toContain("glucoseCorrection");
    expect(assess({ sodium: 140, glucose: 5.6 }).cautionIds).toContain("glucoseCorrection");
  });

  it("a gap raised with ethanol ÷ 4.61 but not with ÷ 3.7 says it depends on the factor", () => {
    // Calculated 310 (ethanol molar) or 315 (× 1.25); measured 321: gap 11 or 6.
    expect(
      text(
        { sodium: 140, glucose: 5, urea: 5, ethanol: 20, measuredOsmolality: 321 },
        "gap.dependsOnEthanolFactor",
      ),
    ).toBe(
      "Whether the gap is raised depends on the ethanol factor: 11.0 with mg/dL ÷ 4.61, 6.0 with ÷ 3.7.",
    );
    expect(codes({ sodium: 140, glucose: 5, urea: 5, ethanol: 20, measuredOsmolality: 330 })).not.toContain(
      "gap.dependsOnEthanolFactor",
    );
  });

  it("a measured mannitol accounts for part of the gap; the rest is the residual", () => {
    const i = { sodium: 140, glucose: 5, urea: 5, mannitol: 10, measuredOsmolality: 320 };
    expect(text(i, "gap.measuredAlcohols")).toContain("about 10.0 of the gap; 20.0 is left unexplained");
    expect(text(i, "toxicAlcohol.possible")).toContain("unexplained osmolal gap of 20.0");
  });

  it.each([
    [3.9, "ketoacidosis, lactic acidosis or renal failure first"],
    [4, "lactic acidosis first"],
  ])("a raised anion gap with a normal osmolal gap and lactate %s: %s", (lactate, first) => {
    const i = {
      sodium: 140,
      chloride: 100,
      bicarbonate: 15,
      glucose: 5,
      urea: 5,
      measuredOsmolality: 292,
      lactate,
    };
    expect(text(i, "pattern.lateAlcohol")).toContain(`normal osmolal gap: ${first}`);
  });

  it("both gaps raised: ketoacidosis explains part when it is present", () => {
    const base = { sodium: 140, chloride: 100, bicarbonate: 10, urea: 5, measuredOsmolality: 320 };
    expect(text({ ...base, glucose: 20, pH: 7.1, betaHydroxybutyrate: 5 }, "pattern.bothRaised")).toContain(
      "ketoacidosis explains part of both",
    );
    expect(text({ ...base, glucose: 20, pH: 7.1 }, "pattern.bothRaised")).toContain(
      "ketoacidosis explains part of both",
    );
    expect(text({ ...base, glucose: 5 }, "pattern.bothRaised")).toContain(
      "a toxic alcohol being metabolised, or ketoacidosis",
    );
  });
});

describe("the osmolal gap's edges with ethanol, mannitol and the anion gap", () => {
  // Canonical inputs (mmol/L), invented. Without ethanol the calculated osmolality is
  // 2 × 140 + 5 + 5 = 290 (Smithline & Gardner); ethanol adds its molar value (Purssell: × 1.25).
  // The usual limit is a gap below 10 (common practice; REFERENCES.md §3).
  const base = { sodium: 140, glucose: 5, urea: 5 };

  it.each([
    // [ethanol, measured, explained by ethanol?]: without ethanol the gap is measured − 290.
    [4, 300, true], // 10 before ethanol, 6 after
    [4, 299.9, false], // 9.9 before: nothing to explain
    [4, 303.9, true], // 9.9 after
    [4, 304, false], // 10 after: still raised
  ] as const)("ethanol %s, measured %s: explained is %s", (ethanol, measured, explained) => {
    const a = assess({ ...base, ethanol, measuredOsmolality: measured });
    expect(codes(a).includes("gap.explainedByEthanol")).toBe(explained);
  });

  it.each([
    // [measured, the ethanol factor decides?] with ethanol 8: gap = measured − 298, by 1.25 = measured − 300.
    [308, true], // 10 and 8
    [307.9, false], // 9.9 and 7.9
    [310, false], // 12 and 10
    [309.9, true], // 11.9 and 9.9
  ] as const)("ethanol 8, measured %s: the factor decides is %s", (measured, decides) => {
    const a = assess({ ...base, ethanol: 8, measuredOsmolality: measured });
    expect(codes(a).includes("gap.dependsOnEthanolFactor")).toBe(decides);
  });

  it("an alcohol or mannitol measured at 0 explains nothing and is not named", () => {
    const a = assess({ ...base, measuredOsmolality: 305, methanol: 0, mannitol: 0 });
    expect(codes(a)).not.toContain("gap.measuredAlcohols");
    expect(a.results.effectiveOsmolality!.value).toBe(285);
    expect(a.results.effectiveOsmolality!.formula).toBe("2·Na + glucose");
  });

  it("mannitol counts in the effective osmolality, and ethanol in the potassium formula", () => {
    // By hand: 2 × 140 + 5 + 10 = 295; 2 × (140 + 4) + 5 + 5 + 10 = 308.
    const a = assess({ ...base, mannitol: 10 });
    expect(a.results.effectiveOsmolality!.value).toBe(295);
    expect(a.results.effectiveOsmolality!.working).toBe("2 × 140 + 5 + 10 = 295.0 mOsm/kg");
    const k = assess({ ...base, potassium: 4, ethanol: 10 });
    const withK = k.alternatives.find((r) => r.id === "calculatedOsmolality.potassium")!;
    expect(withK.value).toBe(308);
    expect(withK.formula).toBe("2·(Na + K) + glucose + urea + ethanol");
  });

  // Anion gap 140 − (100 + 10) = 30, raised (range up to 11); glucose 5: no crisis reading.
  const acid = { ...base, chloride: 100, bicarbonate: 10 };
  it.each([
    [300, "pattern.bothRaised"], // gap 10
    [299.9, "pattern.lateAlcohol"], // gap 9.9
  ] as const)("measured %s with a raised anion gap: %s", (measured, pattern) => {
    expect(codes(assess({ ...acid, measuredOsmolality: measured }))).toContain(pattern);
  });

  it.each([
    [4, "lactic acidosis first"],
    [3.9, "ketoacidosis, lactic acidosis or renal failure first"],
  ] as const)("lactate %s with a raised anion gap and a normal osmolal gap: %s", (lactate, text) => {
    const late = assess({ ...acid, measuredOsmolality: 295, lactate }).findings.find(
      (f) => f.code === "pattern.lateAlcohol",
    )!;
    expect(late.text).toContain(text);
  });

  it("ketoacidosis, decided or not yet, takes the place of the late-alcohol pattern", () => {
    // Anion gap 30 throughout (Na − (Cl 100 + HCO3 10) with Na 140; 40 with Na 150).
    const acidic = { urea: 5, chloride: 100, bicarbonate: 10 };
    // DKA met (2024 consensus): β-hydroxybutyrate ≥ 3.0 with bicarbonate < 18 and glucose ≥ 11.1.
    const dka = assess({
      ...acidic,
      sodium: 140,
      glucose: 15,
      betaHydroxybutyrate: 5,
      measuredOsmolality: 305,
    });
    expect(codes(dka)).toContain("dka.met");
    expect(codes(dka)).not.toContain("pattern.lateAlcohol");
    // Acidosis with glucose ≥ 11.1 and no ketones given: undecided, and still no late-alcohol pattern.
    const undecided = assess({ ...acidic, sodium: 140, glucose: 15, measuredOsmolality: 305 });
    expect(codes(undecided)).toContain("dka.undecided");
    expect(codes(undecided)).not.toContain("pattern.lateAlcohol");
    // The mixed state: glucose 40, effective 2 × 150 + 40 = 340 > 300, with DKA.
    const mixedPanel = { ...acidic, sodium: 150, glucose: 40, betaHydroxybutyrate: 5 };
    const mixed = assess({ ...mixedPanel, measuredOsmolality: 350 });
    expect(codes(mixed)).toContain("dkaHhs.mixed");
    expect(codes(mixed)).not.toContain("pattern.lateAlcohol");
    // Beside any of them, a raised gap keeps a toxic alcohol in the differential as a warning.
    const gapped = assess({ ...mixedPanel, measuredOsmolality: 370 });
    expect(gapped.findings.find((f) => f.code === "toxicAlcohol.possible")!.severity).toBe("warning");
  });
});
