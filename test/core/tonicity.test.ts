import { describe, expect, it } from "vitest";
import { ANALYTES, toCanonical } from "../../core/analytes.js";
import { assess } from "../../core/assess.js";
import { CAUTIONS } from "../../core/cautions.js";
import { ineffectiveSolutes, readTonicity } from "../../core/tonicity.js";

const mg = (id: keyof typeof ANALYTES, v: number) => toCanonical(ANALYTES[id], v, "mg/dL");
const codes = (a: ReturnType<typeof assess>) => a.findings.map((f) => f.code);

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

// What the tonicity findings say, and the edges the mutation run found unguarded [D].
describe("effective osmolality and its texts", () => {
  const find = (i: Parameters<typeof assess>[0], prefix: string) =>
    assess(i).findings.find((f) => f.code.startsWith(prefix));

  it("from the measured value less urea and alcohols when both are given, else 2·Na + glucose", () => {
    expect(find({ sodium: 140, glucose: 5, urea: 5, measuredOsmolality: 290 }, "tonicity.")!.text).toBe(
      "Effective osmolality 285.0 (measured less urea and alcohols): not hypotonic, not above 300.",
    );
    expect(find({ sodium: 140, glucose: 5 }, "tonicity.")!.text).toBe(
      "Effective osmolality 285.0 (2·Na + glucose): not hypotonic, not above 300.",
    );
    // Measured and urea without glucose: still from the measured value.
    expect(find({ sodium: 140, urea: 5, measuredOsmolality: 290 }, "tonicity.")!.text).toContain(
      "285.0 (measured less urea and alcohols)",
    );
    // Sodium alone: nothing to say about tonicity.
    expect(find({ sodium: 140 }, "tonicity.")).toBeUndefined();
  });

  it.each([
    [4.9, "tonicity.low"],
    [5, "tonicity.normal"],
  ])("Na 135, glucose %s: effective below 275 is hypotonic", (glucose, code) => {
    expect(find({ sodium: 135, glucose }, "tonicity.")!.code).toBe(code);
  });

  it.each([
    [10, "tonicity.normal"],
    [10.1, "tonicity.high"],
  ])("Na 145, glucose %s: effective above 300 is hypertonic", (glucose, code) => {
    expect(find({ sodium: 145, glucose }, "tonicity.")!.code).toBe(code);
  });

  it("a hypernatraemia gives its effective osmolality when it is known", () => {
    expect(find({ sodium: 150, glucose: 5 }, "hypernatraemia")!.text).toBe(
      "Hypernatraemia (Na 150): plasma is hypertonic (effective osmolality 305.0).",
    );
    expect(find({ sodium: 150 }, "hypernatraemia")!.text).toBe(
      "Hypernatraemia (Na 150): plasma is hypertonic.",
    );
  });

  it("an unclassified hyponatraemia gives the calculated effective osmolality, and a high glucose beside it", () => {
    expect(find({ sodium: 130, glucose: 5 }, "hyponatraemia.")!.text).toContain(
      "The calculated effective osmolality is 265.0.",
    );
    expect(find({ sodium: 130, glucose: 20 }, "hyponatraemia.")!.text).toContain(
      "is 280.0, with glucose 360 mg/dL (20 mmol/L).",
    );
    expect(find({ sodium: 130 }, "hyponatraemia.")!.text).not.toContain("calculated effective");
  });

  it.each([
    [9.9, false],
    [10, true],
  ])("glucose %s mmol/L is named as the effective solute from 10 (180 mg/dL)", (glucose, named) => {
    const f = find({ sodium: 130, glucose, urea: 5, measuredOsmolality: 285 }, "hyponatraemia.")!;
    expect(f.text.includes("glucose"), f.text).toBe(named);
  });

  it.each([
    [4.9, false],
    [5, true],
  ])("mannitol %s mmol/L is named as the effective solute from 5", (mannitol, named) => {
    const f = find(
      { sodium: 130, glucose: 5, urea: 5, mannitol, measuredOsmolality: 285 },
      "hyponatraemia.",
    )!;
    expect(f.text.includes("mannitol"), f.text).toBe(named);
  });

  it("a normal measured osmolality with a gap larger than a low sodium explains names an unmeasured osmole", () => {
    // Na 134 (short by 6: a false sodium explains a gap up to 22); calculated 272; measured 295: gap 23.
    const f = find({ sodium: 134, glucose: 2, urea: 2, measuredOsmolality: 295 }, "hyponatraemia.")!;
    expect(f.code).toBe("hyponatraemia.isotonic");
    expect(f.text).toContain(
      "the raised osmolal gap is more than a low sodium explains — an unmeasured osmole",
    );
    const small = find({ sodium: 134, glucose: 2, urea: 2, measuredOsmolality: 280 }, "hyponatraemia.")!;
    expect(small.text).not.toContain("unmeasured osmole");
  });
});

describe("readTonicity: the ineffective solutes and where tonicity comes from [D]", () => {
  const range = { low: 275, high: 295 };

  it("urea, ethanol and every measured alcohol are ineffective; a zero is not counted", () => {
    const { total, named } = ineffectiveSolutes({
      urea: 5,
      ethanol: 10,
      methanol: 2,
      ethyleneGlycol: 1,
      isopropanol: 1.5,
      acetone: 0.5,
      propyleneGlycol: 1,
      mannitol: 20,
    });
    expect(total).toBe(21);
    expect(named).toEqual([
      "urea 5",
      "ethanol 10",
      "methanol 2",
      "ethylene glycol 1",
      "isopropanol 1.5",
      "acetone 0.5",
      "propylene glycol 1",
    ]);
    expect(ineffectiveSolutes({ urea: 0, ethanol: 0 })).toEqual({ total: 0, named: [] });
  });

  it("from the measured value less the ineffective solutes, unless a gap of 10 or more may be an alcohol", () => {
    const i = { sodium: 140, glucose: 5, urea: 5, measuredOsmolality: 295 };
    expect(readTonicity(i, 5, range)).toMatchObject({ value: 290, from: "measured" });
    expect(readTonicity(i, 9.9, range)).toMatchObject({ value: 290, from: "measured" });
    expect(readTonicity(i, 10, range)).toMatchObject({ value: 285, from: "calculated" });
    // Without a urea the measured value cannot be corrected: 2·Na + glucose.
    expect(
      readTonicity({ sodium: 140, glucose: 5, measuredOsmolality: 295 }, undefined, range),
    ).toMatchObject({ value: 285, from: "calculated" });
    // Without a glucose, the measured value is all there is.
    expect(readTonicity({ sodium: 140, urea: 5, measuredOsmolality: 295 }, 10, range)).toMatchObject({
      value: 290,
      from: "measured",
    });
    // Mannitol is an effective osmole: it counts in 2·Na + glucose + mannitol.
    expect(readTonicity({ sodium: 140, glucose: 5, mannitol: 10 }, undefined, range)).toMatchObject({
      value: 295,
      from: "calculated",
    });
    // Without a sodium: no value, no finding.
    const none = readTonicity({ glucose: 5 }, undefined, range);
    expect(none.value).toBeUndefined();
    expect(none.findings).toEqual([]);
  });

  it.each([
    [289.9, true],
    [290, false],
  ])("hypotonic in effect: Na 130, urea 20 (15 above normal), measured %s", (measured, hypotonic) => {
    // 290 − 15 = 275, the range's low end: not below it.
    const t = readTonicity({ sodium: 130, glucose: 5, urea: 20, measuredOsmolality: measured }, 5, range);
    expect(t.findings.some((f) => f.code === "osmolality.ineffectiveExcess")).toBe(hypotonic);
  });

  it("names ethanol among what holds the measured value up", () => {
    // Calculated with ethanol 2·130 + 5 + 5 + 20 = 290, measured 294: gap 4; 294 − (30 − 5) = 269.
    const t = readTonicity(
      { sodium: 130, glucose: 5, urea: 5, ethanol: 20, measuredOsmolality: 294 },
      4,
      range,
    );
    const f = t.findings.find((x) => x.code === "hyponatraemia.hypotonic")!;
    expect(f.text).toContain("held up by urea 5, ethanol 20 mmol/L");
    expect(f.text).toContain("effective 269.0");
  });
});
