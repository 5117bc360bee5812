import { describe, expect, it } from "vitest";
import { ANALYTES, toCanonical } from "../../core/analytes.js";
import { assess } from "../../core/assess.js";

const _mg = (id: keyof typeof ANALYTES, v: number) => toCanonical(ANALYTES[id], v, "mg/dL");
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
});
