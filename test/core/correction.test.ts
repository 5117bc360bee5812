/**
 * The correction model at its edges. Limits: European guideline (Spasovski et al., Eur J
 * Endocrinol 2014 [C]) ≤ 10 mmol/L in the first 24 h, ≤ 8 in each 24 h after, ≤ 18 over 48 h [D];
 * high risk 8 per 24 h (Verbalis 2013, from memory [M]); lowering a chronic hypernatraemia about
 * 10 per 24 h (REFERENCES §5 [M/P]). Check values derived by hand [D].
 */
import { describe, expect, it } from "vitest";
import { correctionTrend, planFits, type SodiumPoint } from "../../core/correction.js";
import { clockAt } from "../../core/series.js";

const pts = (...pairs: [number, number][]): SodiumPoint[] =>
  pairs.map(([hours, sodium]) => ({ hours, sodium }));
const codes = (p: SodiumPoint[], o = {}) => correctionTrend(p, o)!.findings.map((f) => f.code);

describe("windows from the start of correction", () => {
  it("the first 24 h: +10 is within, +10.1 is too fast", () => {
    expect(codes(pts([0, 110], [20, 120]))).toContain("correction.withinLimits");
    expect(codes(pts([0, 110], [20, 120.1]))).toContain("correction.tooFast");
  });

  it("the peak counts, not only the last value: 110 → 122 → 119 is +12", () => {
    const t = correctionTrend(pts([0, 110], [12, 122], [20, 119]))!;
    expect(t.windows[0]!.change).toBe(12);
    expect(t.findings[0]!.code).toBe("correction.tooFast");
  });

  it("a series under 24 h can already exceed the 24 h limit: 110, 121 (14 h), 122 (17 h)", () => {
    expect(codes(pts([0, 110], [14, 121], [17, 122]))).toContain("correction.tooFast");
  });

  it("each later 24 h is judged from the sodium at its start (interpolated) with a limit of 8", () => {
    // 110 (0) → 120 (24 h): +10 in window 1. Window 2 starts at 120: 128 (40 h) is +8 (within), 128.1 too fast.
    expect(correctionTrend(pts([0, 110], [24, 120], [40, 128]))!.windows[1]).toMatchObject({
      start: 120,
      change: 8,
      limit: 8,
      exceeded: false,
    });
    expect(codes(pts([0, 110], [24, 120], [40, 128.1]))).toContain("correction.tooFast");
    // Interpolated start: 119 at 20 h, 125 at 30 h → 121.4 at 24 h [D].
    expect(correctionTrend(pts([0, 110], [20, 119], [30, 125]))!.windows[1]!.start).toBeCloseTo(121.4, 9);
  });

  it("over 48 h: at most 18", () => {
    // 110 → 119 (24 h) → 127 (48 h): +9 then +8, 17 in 48 h: within. 110 → 120 → 128.5: window 2 +8.5 too fast.
    expect(codes(pts([0, 110], [24, 119], [48, 127]))).toContain("correction.withinLimits");
    expect(codes(pts([0, 110], [24, 120], [48, 128.5]))).toContain("correction.tooFast");
  });

  it("high risk: 8 in the first 24 h (8.0 within, 8.1 too fast); Na ≤ 105 is high risk by itself", () => {
    expect(codes(pts([0, 118], [20, 126]), { highRisk: true })).toContain("correction.withinLimits");
    expect(codes(pts([0, 118], [20, 126.1]), { highRisk: true })).toContain("correction.tooFast");
    expect(correctionTrend(pts([0, 105], [12, 112]))!.highRisk).toBe(true);
    expect(correctionTrend(pts([0, 106], [12, 112]))!.highRisk).toBe(false);
    expect(codes(pts([0, 104], [12, 112.5]))).toContain("correction.tooFast");
  });

  it("an open window says how much more is allowed and until when", () => {
    const t = correctionTrend(pts([0, 118], [14, 125]), { nowHours: 14, clock: (h) => clockAt(22 * 60, h) })!;
    expect(t.roomLeft).toEqual({ mmol: 3, untilHours: 24 });
    expect(t.findings.find((f) => f.code === "correction.windowOpen")!.text).toMatch(
      /\+7\.0 so far in hours 0–24; 3\.0 more allowed until 22:00/,
    );
  });

  it("a rate from a few hours is labelled a projection", () => {
    const t = correctionTrend(pts([0, 120], [2, 122]), { nowHours: 2 })!;
    expect(t.projected!.perHour).toBe(1);
    expect(t.findings.find((f) => f.code === "correction.windowOpen")!.text).toMatch(/a projection/);
    expect(t.findings.find((f) => f.code === "correction.windowOpen")!.severity).toBe("warning");
  });
});

describe("both directions", () => {
  it("a falling sodium in hyponatraemia is worsening, neither within limits nor too fast", () => {
    expect(codes(pts([0, 125], [6, 122]))).toEqual(["correction.worsening"]);
  });
  it("a rising sodium in hypernatraemia is worsening", () => {
    expect(codes(pts([0, 155], [6, 158]))).toEqual(["correction.worsening"]);
  });
  it("lowering a hypernatraemia: −10 in 24 h within, −10.1 too fast", () => {
    expect(codes(pts([0, 165], [20, 155]))).toContain("correction.withinLimits");
    expect(codes(pts([0, 165], [20, 154.9]))).toContain("correction.tooFast");
    expect(correctionTrend(pts([0, 165], [20, 154.9]))!.findings[0]!.text).not.toMatch(
      /demyelination|re-lowering/,
    );
  });
});

describe("hyperglycaemia: judged on the glucose-corrected sodium", () => {
  it("Na 127 (glucose 45) → 139 (glucose 12) in 10 h is not too fast: corrected 138.4 → 140.9 (Katz) [D]", () => {
    const t = correctionTrend([
      { hours: 0, sodium: 127, glucose: 45 },
      { hours: 10, sodium: 139, glucose: 12 },
    ])!;
    expect(t.measure).toBe("correctedSodium");
    expect(t.windows[0]!.change).toBeCloseTo(0.288 * (12 - 5.55) + 139 - (127 + 0.288 * (45 - 5.55)), 9);
    expect(t.findings.map((f) => f.code)).toContain("correction.withinLimits");
    expect(t.findings[0]!.text).toMatch(/glucose-corrected/);
    // The same measured sodiums without glucose: +12, too fast.
    expect(codes(pts([0, 127], [10, 139]))).toContain("correction.tooFast");
  });
});

describe("plans in the current window", () => {
  it("counts what is already used: +12 already, so any rise is too fast", () => {
    const t = correctionTrend(pts([0, 110], [14, 121], [20, 122]), { nowHours: 20 })!;
    expect(planFits(t, 5.5, false, 122)).toMatchObject({ already: 12, limit: 10, fits: false, room: 0 });
  });
  it("+4 already and +5.5 planned fits 10; +6.5 does not", () => {
    const t = correctionTrend(pts([0, 118], [6, 122]), { nowHours: 6 })!;
    expect(planFits(t, 5.5, false, 122).fits).toBe(true);
    expect(planFits(t, 6.5, false, 122).fits).toBe(false);
  });
});
