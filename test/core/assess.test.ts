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

describe("tonicity and the class of a hyponatraemia", () => {
  const base = { sodium: 124, glucose: 5, urea: 5 };
  it("hypotonic below 275, and 275 itself is not", () => {
    // REFERENCES.md §3: hypotonic < 275 (Spasovski 2014) — from memory [M].
    expect(codes(assess({ ...base, measuredOsmolality: 274.9 }))).toContain("hyponatraemia.hypotonic");
    expect(codes(assess({ ...base, measuredOsmolality: 275 }))).not.toContain("hyponatraemia.hypotonic");
  });

  it("a lab's own range is used", () => {
    const a = assess({ ...base, measuredOsmolality: 278 }, { osmolalityRange: { low: 280, high: 300 } });
    expect(codes(a)).toContain("hyponatraemia.hypotonic");
  });

  it("pseudohyponatraemia needs a normal measured osmolality and a gap the sodium's shortfall explains", () => {
    // REFERENCES.md §3 [C]: Fortgens & Pillay 2011. Na 124: calculated 258, measured 285, gap 27 ≤ 2 × 16 + 10.
    const a = assess({ ...base, measuredOsmolality: 285 });
    expect(codes(a)).toEqual(
      expect.arrayContaining(["hyponatraemia.isotonic", "pseudohyponatraemia.possible"]),
    );
    // …and then the gap is not read as a toxic alcohol.
    expect(codes(a)).not.toContain("toxicAlcohol.possible");
    expect(a.alternatives.some((r) => r.id.startsWith("impliedConcentration"))).toBe(false);
    expect(a.cautions).toContain(CAUTIONS.pseudohyponatraemia);
  });

  it("no pseudohyponatraemia when glucose or urea explains a normal osmolality", () => {
    // Na 125, glucose 30 mmol/L, urea 5: calculated 285, measured 288, gap 3 — translocational, isotonic.
    const a = assess({ sodium: 125, glucose: 30, urea: 5, measuredOsmolality: 288 });
    expect(codes(a)).toContain("hyponatraemia.isotonic");
    expect(codes(a)).not.toContain("pseudohyponatraemia.possible");
  });

  it("a measured osmolality held up by urea is hypotonic in effect, never hypertonic", () => {
    // REFERENCES.md §3 [C]: urea crosses cell membranes (ADA consensus footnotes). 320 − 60 = 260.
    const a = assess({ sodium: 124, glucose: 5, urea: 60, measuredOsmolality: 320 });
    expect(codes(a)).toEqual(
      expect.arrayContaining(["hyponatraemia.hypotonic", "osmolality.ineffectiveExcess"]),
    );
    expect(codes(a)).not.toContain("hyponatraemia.hypertonic");
  });

  it("a high measured osmolality with no glucose to explain it is not called translocational", () => {
    const a = assess({ sodium: 128, glucose: 5, urea: 5, measuredOsmolality: 310 });
    expect(codes(a)).not.toContain("hyponatraemia.hypertonic");
    expect(codes(a)).toContain("hyponatraemia.unclassified");
  });

  it("mannitol is an effective osmole", () => {
    // REFERENCES.md §2: mannitol raises the gap; §3 it is effective, like glucose.
    const m = mg("mannitol", 1000); // 54.9 mmol/L [D]
    const a = assess({ sodium: 126, glucose: 5, urea: 5, mannitol: m, measuredOsmolality: 320 });
    expect(a.results.effectiveOsmolality!.formula).toBe("2·Na + glucose + mannitol");
    expect(codes(a)).toContain("hyponatraemia.hypertonic");
  });

  it("without a measured osmolality the hyponatraemia is not classed, and the next step is named", () => {
    const a = assess(base);
    expect(codes(a)).toContain("hyponatraemia.unclassified");
    expect(a.findings.find((f) => f.code === "hyponatraemia.unclassified")!.text).toMatch(
      /measured osmolality/,
    );
  });

  it("effective osmolality is labelled effective and judged against its own threshold (> 300, 2024 consensus)", () => {
    // Umpierrez et al., Diabetes Care 2024: effective > 300 for HHS [C]; Na 140 + glucose: 2·140 + 20 = 300 [D].
    expect(codes(assess({ sodium: 140, glucose: 20, urea: 5 }))).toContain("tonicity.normal");
    expect(codes(assess({ sodium: 140, glucose: 20.2, urea: 5 }))).toContain("tonicity.high");
    const t = assess({ sodium: 140, glucose: 5, urea: 5 }).findings.find((f) =>
      f.code.startsWith("tonicity"),
    )!;
    expect(t.text).toMatch(/^Effective osmolality/);
  });

  it("the hypotonic hyponatraemia work-up: next step without urine studies", () => {
    const a = assess({ ...base, measuredOsmolality: 255 });
    expect(codes(a)).toContain("hyponatraemia.nextStep");
  });
});

describe("the urine work-up (Spasovski 2014 algorithm — from memory [M], to be confirmed)", () => {
  const hypo = { sodium: 120, glucose: 5, urea: 4, measuredOsmolality: 250 };
  it.each([
    [{ urineOsmolality: 100 }, "urine.dilute"],
    [{ urineOsmolality: 101, urineSodium: 30 }, "urine.lowSodium"],
    [{ urineOsmolality: 101, urineSodium: 31 }, "urine.highSodium"],
    [{ urineOsmolality: 450, urineSodium: 80 }, "urine.highSodium"],
  ] as const)("%j → %s", (urine, code) => {
    expect(codes(assess({ ...hypo, ...urine }))).toContain(code);
  });

  it("the urine-to-plasma ratio (Furst 2000, from memory [M])", () => {
    // (80 + 50) ÷ 120 = 1.08 > 1: restriction alone unlikely to work [D].
    const high = assess({ ...hypo, urineOsmolality: 500, urineSodium: 80, urinePotassium: 50 });
    expect(high.findings.find((f) => f.code === "urine.electrolyteRatio")!.text).toMatch(
      /1\.08: fluid restriction alone is unlikely/,
    );
    // (30 + 20) ÷ 120 = 0.42 < 0.5 [D].
    const low = assess({ ...hypo, urineOsmolality: 500, urineSodium: 30, urinePotassium: 20 });
    expect(low.findings.find((f) => f.code === "urine.electrolyteRatio")!.text).toMatch(/about 1 L a day/);
  });

  it("is not applied before hypotonicity is shown", () => {
    const a = assess({ sodium: 125, urineOsmolality: 500, urineSodium: 40 });
    expect(codes(a).filter((c) => c.startsWith("urine."))).toEqual(["urine.notApplied"]);
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

describe("DKA, HHS and mixed states (Umpierrez et al., Diabetes Care 2024 [C])", () => {
  const dka = {
    sodium: 132,
    chloride: 96,
    bicarbonate: 10,
    glucose: 25,
    urea: 6,
    betaHydroxybutyrate: 5.2,
    pH: 7.15,
  };

  it("DKA met, with its severity (ADA 2009 bands, from memory [M])", () => {
    const f = assess(dka).findings.find((x) => x.code === "dka.met")!;
    expect(f.severity).toBe("danger");
    expect(f.text).toMatch(/moderate/);
  });

  it("a high anion gap with high glucose and low bicarbonate names ketoacidosis first, not a late toxic alcohol", () => {
    const a = assess({ sodium: 130, chloride: 95, bicarbonate: 10, glucose: 45, urea: 7 });
    expect(codes(a)).toContain("dka.undecided");
    expect(a.findings.find((f) => f.code === "dka.undecided")!.text).toMatch(/ketones not given/);
    expect(codes(a)).not.toContain("pattern.lateAlcohol");
  });

  it.each([
    // β-hydroxybutyrate ≥ 3.0; pH < 7.3 and/or bicarbonate < 18; glucose ≥ 11.1 mmol/L (200 mg/dL).
    [{ ...dka, betaHydroxybutyrate: 3.0 }, "dka.met"],
    [{ ...dka, betaHydroxybutyrate: 2.9 }, "dka.notMet"],
    [{ ...dka, pH: 7.3, bicarbonate: 18 }, "dka.notMet"],
    [{ ...dka, pH: 7.29, bicarbonate: 18 }, "dka.met"],
    [{ ...dka, pH: 7.3, bicarbonate: 17.9 }, "dka.met"],
  ] as const)("DKA boundary %#", (inputs, code) => {
    expect(codes(assess(inputs))).toContain(code);
  });

  it("the DKA glucose edge is compared in the unit written", () => {
    const i = { sodium: 135, bicarbonate: 12, pH: 7.2 };
    const at = (value: number, unit: "mg/dL" | "mmol/L") =>
      codes(
        assess(
          { ...i, glucose: toCanonical(ANALYTES.glucose, value, unit) },
          { glucoseWritten: { value, unit } },
        ),
      );
    expect(at(200, "mg/dL")).toContain("dka.undecided");
    expect(at(199, "mg/dL")).not.toContain("dka.undecided");
    expect(at(11.1, "mmol/L")).toContain("dka.undecided");
    expect(at(11.0, "mmol/L")).not.toContain("dka.undecided");
  });

  const hhs = { sodium: 145, glucose: 40, urea: 12, betaHydroxybutyrate: 0.8, pH: 7.38, bicarbonate: 22 };
  it("HHS met: effective > 300 (2·145 + 40 = 330 [D])", () => {
    const f = assess(hhs).findings.find((x) => x.code === "hhs.met")!;
    expect(f.severity).toBe("danger");
    expect(f.text).toMatch(/ADA 2009 \(effective > 320\): met/);
  });

  it("33.3 mmol/L meets the 2024 glucose criterion in SI units, 599 mg/dL does not", () => {
    const i = { sodium: 140, urea: 10, betaHydroxybutyrate: 0.5, pH: 7.4, bicarbonate: 24 };
    const at = (value: number, unit: "mg/dL" | "mmol/L") =>
      codes(
        assess(
          { ...i, glucose: toCanonical(ANALYTES.glucose, value, unit) },
          { glucoseWritten: { value, unit } },
        ),
      );
    expect(at(33.3, "mmol/L")).toContain("hhs.met");
    expect(at(33.2, "mmol/L").join()).not.toMatch(/hhs/);
    expect(at(600, "mg/dL")).toContain("hhs.met");
    expect(at(599, "mg/dL").join()).not.toMatch(/hhs/);
  });

  it("HHS effective and total edges: > 300, > 320 (2024); ADA 2009 > 320; JBDS ≥ 320 without ethanol", () => {
    const i = { glucose: 35, urea: 0, betaHydroxybutyrate: 0.5, pH: 7.4, bicarbonate: 24 };
    // 2·Na + 35: Na 132.5 → 300 (not met), 132.6 → 300.2 (met) [D].
    expect(codes(assess({ ...i, sodium: 132.5 }))).toContain("hhs.notMet");
    expect(codes(assess({ ...i, sodium: 132.6 }))).toContain("hhs.met");
    // Total 320 vs 320.1 by the measured osmolality, effective below 300.
    const low = { ...i, sodium: 125, urea: 10 };
    expect(codes(assess({ ...low, measuredOsmolality: 320 }))).toContain("hhs.notMet");
    expect(codes(assess({ ...low, measuredOsmolality: 320.1 }))).toContain("hhs.met");
    // JBDS: 2·142.5 + 35 + 0 = 320 ≥ 320 → met; ethanol does not count in it.
    const jbds = assess({ ...i, sodium: 142.5, ethanol: 30 }).findings.find((f) => f.code === "hhs.met")!;
    expect(jbds.text).toMatch(/UK JBDS .*: met/);
    expect(assess({ ...i, sodium: 142.4 }).findings.find((f) => f.code === "hhs.met")!.text).toMatch(
      /UK JBDS .*: not met/,
    );
  });

  it("HHS met on a measured osmolality that an unexplained gap inflates: says so", () => {
    // Na 128, glucose 36, urea 10: calculated 302; measured 336, gap 34; effective 292 [D].
    const a = assess({
      sodium: 128,
      glucose: 36,
      urea: 10,
      measuredOsmolality: 336,
      betaHydroxybutyrate: 0.4,
      pH: 7.36,
      bicarbonate: 21,
    });
    expect(a.findings.find((f) => f.code === "hhs.met")!.text).toMatch(/unexplained osmolal gap of 34\.0/);
  });

  it("a mixed DKA and HHS state carries dkaHhs.mixed, never hhs.notMet", () => {
    const a = assess({ ...hhs, betaHydroxybutyrate: 4.5, pH: 7.2, bicarbonate: 12, glucose: 50 });
    expect(codes(a)).toEqual(expect.arrayContaining(["dka.met", "dkaHhs.mixed"]));
    expect(codes(a)).not.toContain("hhs.notMet");
  });

  it("HHS with ketones, pH or bicarbonate not given says DKA is not excluded", () => {
    const f = assess({ sodium: 145, glucose: 40, urea: 12 }).findings.find((x) => x.code === "hhs.met")!;
    expect(f.text).toMatch(/Not given: ketones, pH, bicarbonate/);
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
