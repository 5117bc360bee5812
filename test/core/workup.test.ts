import { describe, expect, it } from "vitest";
import { assess } from "../../core/assess.js";

const codes = (a: ReturnType<typeof assess>) => a.findings.map((f) => f.code);

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

  // Edges the mutation run found unguarded [D].
  const ratioText = (uNa: number, uK: number) =>
    assess({ ...hypo, urineOsmolality: 500, urineSodium: uNa, urinePotassium: uK }).findings.find(
      (f) => f.code === "urine.electrolyteRatio",
    )!.text;
  it.each([
    // (uNa + uK) ÷ 120: 1.00 is not above 1; 0.50 is not below 0.5.
    [70, 50, /about 500 mL a day/],
    [71, 50, /restriction alone is unlikely/],
    [40, 20, /about 500 mL a day/],
    [39, 20, /about 1 L a day/],
  ] as const)("the ratio's edges: urine Na %s + K %s", (uNa, uK, meaning) => {
    expect(ratioText(uNa, uK)).toMatch(meaning);
  });

  it("no ratio without a urine potassium", () => {
    const a = assess({ ...hypo, urineOsmolality: 500, urineSodium: 80 });
    expect(codes(a)).not.toContain("urine.electrolyteRatio");
  });

  it("without urine studies, the next step is named; with only a urine sodium, the osmolality is asked for too", () => {
    expect(codes(assess(hypo))).toEqual(expect.arrayContaining(["hyponatraemia.nextStep"]));
    const onlyNa = assess({ ...hypo, urineSodium: 20 });
    expect(codes(onlyNa)).toEqual(expect.arrayContaining(["hyponatraemia.nextStep", "urine.lowSodium"]));
    const onlyOsm = assess({ ...hypo, urineOsmolality: 400 });
    expect(codes(onlyOsm)).toContain("hyponatraemia.nextStep");
    expect(codes(onlyOsm).filter((c) => c.startsWith("urine."))).toEqual([]);
  });

  it("urine studies beside a sodium of 135 or more are not called unapplied", () => {
    expect(codes(assess({ sodium: 134.9, urineOsmolality: 500 }))).toContain("urine.notApplied");
    expect(codes(assess({ sodium: 135, urineOsmolality: 500 }))).not.toContain("urine.notApplied");
    expect(codes(assess({ sodium: 125 }))).not.toContain("urine.notApplied");
  });
});

describe("the urine sodium's text, with and without a urine osmolality", () => {
  // Invented hypotonic hyponatraemia (2 × 120 + 5 + 4 = 249; measured 250).
  const hypo = { sodium: 120, glucose: 5, urea: 4, measuredOsmolality: 250 };
  it("with both, the text gives the osmolality first and asks for nothing more", () => {
    const a = assess({ ...hypo, urineOsmolality: 300, urineSodium: 20 });
    const low = a.findings.find((f) => f.code === "urine.lowSodium")!;
    expect(low.text).toContain("With urine osmolality 300 > 100 and urine sodium 20 ≤ 30");
    expect(codes(a)).not.toContain("hyponatraemia.nextStep");
  });
  it("with the sodium alone, it asks for the osmolality and says nothing of it", () => {
    const a = assess({ ...hypo, urineSodium: 40 });
    const high = a.findings.find((f) => f.code === "urine.highSodium")!;
    expect(high.text).toMatch(/^With urine sodium 40 > 30/);
    expect(a.findings.find((f) => f.code === "hyponatraemia.nextStep")!.text).toMatch(/urine osmolality too/);
  });
});
