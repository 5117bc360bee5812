import { describe, expect, it } from "vitest";
import { ANALYTES, toCanonical } from "../../core/analytes.js";
import { assess } from "../../core/assess.js";
import { CAUTIONS } from "../../core/cautions.js";

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
