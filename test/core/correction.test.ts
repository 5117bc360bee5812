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

// Edges the mutation run (npm run mutate) found unguarded. Derived by hand [D].
describe("worsening and noise", () => {
  it("a dip of up to 1 mmol/L in a hyponatraemia is noise, not worsening; beyond 1 it is worsening", () => {
    expect(codes(pts([0, 125], [6, 124]))).not.toContain("correction.worsening");
    expect(codes(pts([0, 125], [6, 123.9]))).toEqual(["correction.worsening"]);
  });

  it("a rise of up to 1 mmol/L in a hypernatraemia is noise; beyond 1 it is worsening", () => {
    expect(codes(pts([0, 155], [6, 156]))).not.toContain("correction.worsening");
    expect(codes(pts([0, 155], [6, 156.1]))).toEqual(["correction.worsening"]);
  });

  it("the worsening text gives the change with its sign and the hours", () => {
    const [f] = correctionTrend(pts([0, 125], [6, 122]))!.findings;
    expect(f!.text).toContain("from 125.0 to 122.0 (−3.0 over 6 h)");
    const [g] = correctionTrend(pts([0, 155], [6, 158]))!.findings;
    expect(g!.text).toContain("risen from 155.0 to 158.0 (+3.0 over 6 h)");
  });

  it("a normal sodium that stays normal has no finding and no windows; one that leaves the range is worsening", () => {
    const steady = correctionTrend(pts([0, 140], [6, 144]))!;
    expect(steady.direction).toBe("none");
    expect(steady.findings).toEqual([]);
    expect(steady.windows).toEqual([]);
    expect(codes(pts([0, 140], [6, 134.9]))).toEqual(["correction.worsening"]);
    expect(codes(pts([0, 140], [6, 145.1]))).toEqual(["correction.worsening"]);
    expect(codes(pts([0, 140], [6, 135]))).toEqual([]);
    expect(codes(pts([0, 140], [6, 145]))).toEqual([]);
  });
});

describe("the series as given", () => {
  it("needs two values; one is not a trend", () => {
    expect(correctionTrend(pts([0, 120]))).toBeUndefined();
  });

  it("puts the values in time order, whatever order they came in", () => {
    const t = correctionTrend(pts([20, 131], [0, 120]))!;
    expect(t.baseline).toBe(120);
    expect(t.findings[0]!.code).toBe("correction.tooFast");
  });

  it("shows each value with its corrected sodiums and effective osmolality when glucose was measured", () => {
    const t = correctionTrend([
      { hours: 0, sodium: 125, glucose: 25.55 },
      { hours: 6, sodium: 127 },
    ])!;
    // Katz 0.288 and Hillier 0.432 per mmol/L of glucose above 5.55: 20 × 0.288 = 5.76, × 0.432 = 8.64.
    expect(t.points[0]!.corrected!.katz).toBeCloseTo(130.76, 9);
    expect(t.points[0]!.corrected!.hillier).toBeCloseTo(133.64, 9);
    expect(t.points[0]!.effective).toBeCloseTo(2 * 125 + 25.55, 9);
    expect(t.points[1]!.corrected).toBeUndefined();
  });

  it("a glucose below 5.55 corrects nothing", () => {
    const t = correctionTrend([
      { hours: 0, sodium: 125, glucose: 3 },
      { hours: 6, sodium: 127, glucose: 12 },
    ])!;
    expect(t.points[0]!.corrected!.katz).toBe(125);
    expect(t.points[0]!.corrected!.hillier).toBe(125);
  });

  it("now is never before the last value", () => {
    expect(correctionTrend(pts([0, 120], [10, 124]), { nowHours: 5 })!.nowHours).toBe(10);
    expect(correctionTrend(pts([0, 120], [10, 124]), { nowHours: 30 })!.nowHours).toBe(30);
  });
});

describe("windows and the room left", () => {
  it("a window is open until now reaches its end: at hour 24 exactly the first one has ended", () => {
    expect(correctionTrend(pts([0, 120], [24, 126]))!.windows).toEqual([
      expect.objectContaining({ fromHours: 0, toHours: 24, open: false }),
    ]);
    expect(correctionTrend(pts([0, 120], [23.9, 126]))!.windows[0]!.open).toBe(true);
  });

  it("a value at the start of a window is not inside it: the second window starts there", () => {
    const t = correctionTrend(pts([0, 120], [24, 128], [30, 129]))!;
    expect(t.windows[1]).toMatchObject({ fromHours: 24, start: 128, change: 1 });
  });

  it("the room left is the limit less the change so far, until the window's end", () => {
    const t = correctionTrend(pts([0, 120], [12, 122]))!;
    expect(t.roomLeft).toEqual({ mmol: 8, untilHours: 24 });
    const f = t.findings.find((x) => x.code === "correction.windowOpen")!;
    expect(f.text).toContain("+2.0 so far in hours 0–24; 8.0 more allowed until hour 24");
    // +2 in 12 h projects to +4 by hour 24: no warning.
    expect(f.severity).toBe("info");
    // +4 in 6 h projects to +16: the same room, with a warning.
    // The warning is said first, before "within the limits so far".
    expect(correctionTrend(pts([0, 120], [6, 124]))!.findings.map((x) => [x.code, x.severity])).toEqual([
      ["correction.windowOpen", "warning"],
      ["correction.withinLimits", "info"],
    ]);
    expect(t.findings.map((x) => x.code)).toEqual(["correction.withinLimits", "correction.windowOpen"]);
  });

  it("the projection starts after an hour of the window, from a rise only", () => {
    expect(correctionTrend(pts([0, 120], [0.9, 121]))!.projected).toBeUndefined();
    expect(correctionTrend(pts([0, 120], [1, 121]))!.projected).toEqual({ perHour: 1, atWindowEnd: 24 });
    // No rise since the window's start: nothing to project.
    expect(correctionTrend(pts([0, 120], [2, 120.5], [4, 120]))!.projected).toBeUndefined();
  });

  it("a projection above the limit warns; one at the limit does not", () => {
    // +10 over 24 h is exactly the limit: no warning. A little more and it warns.
    const at = correctionTrend(pts([0, 120], [12, 125]))!;
    expect(at.projected!.atWindowEnd).toBeCloseTo(10, 9);
    expect(at.findings.find((f) => f.code === "correction.windowOpen")!.severity).toBe("info");
    const over = correctionTrend(pts([0, 120], [12, 125.1]))!;
    const warn = over.findings.find((f) => f.code === "correction.windowOpen")!;
    expect(warn.severity).toBe("warning");
    expect(warn.text).toContain("(+0.42 per hour, a projection) the rise would reach 10.2");
  });

  it("lowering projects a fall with its sign", () => {
    const t = correctionTrend(pts([0, 160], [12, 155]))!;
    expect(t.projected!.perHour).toBeCloseTo(-5 / 12, 9);
    expect(t.projected!.atWindowEnd).toBeCloseTo(-10, 9);
  });

  it("too fast names the window, the change and the limit, and, after the first day, where it started", () => {
    const first = correctionTrend(pts([0, 120], [20, 131]))!.findings[0]!;
    expect(first.text).toContain("rose +11.0 mmol/L in hours 0–20, above the limit of 10 (European");
    const later = correctionTrend(pts([0, 120], [24, 130], [40, 139]))!.findings[0]!;
    expect(later.text).toContain("+9.0 mmol/L in hours 24–40 (from 130.0 at hour 24), above the limit of 8");
    const risky = correctionTrend(pts([0, 104], [20, 113]))!.findings[0]!;
    expect(risky.text).toContain("above the limit of 8 at high risk");
    const lowering = correctionTrend(pts([0, 165], [20, 154]))!.findings[0]!;
    expect(lowering.text).toContain("fell −11.0 mmol/L in hours 0–20");
    expect(lowering.text).not.toContain("high risk");
  });

  it("within limits lists every window with its change and limit", () => {
    const t = correctionTrend(pts([0, 120], [24, 129], [30, 131]))!;
    expect(t.findings[0]!.text).toBe(
      "Within the correction limits so far: +9.0 in hours 0–24 (limit 10); +2.0 in hours 24–30 (limit 8).",
    );
  });
});

describe("planFits without a logged trend", () => {
  it.each([
    [134.9, "raising"],
    [135, "none"],
    [145, "none"],
    [145.1, "lowering"],
  ])("a first sodium of %s is %s", (na, direction) => {
    expect(planFits(undefined, 1, false, na).direction).toBe(direction);
  });

  it("uses the last window when none is open", () => {
    const t = correctionTrend(pts([0, 120], [24, 127]))!;
    expect(planFits(t, 3, false, 127)).toMatchObject({ already: 7, limit: 10, fits: true, room: 3 });
    expect(planFits(t, 3.1, false, 127).fits).toBe(false);
  });
});

describe("a rise measured only either side of hour 24", () => {
  it("is judged at hour 24 on the line between the values: 120 at hour 0, 137 at hour 25 is too fast", () => {
    // 120 + 17 × 24 / 25 = 136.32 at hour 24: + 16.3 in the first 24 h [D]. Counting only values
    // inside each window, this rise fell into no window and was called within limits.
    const t = correctionTrend(pts([0, 120], [25, 137]))!;
    expect(t.windows[0]).toMatchObject({ change: expect.closeTo(16.32, 9), exceeded: true, estimated: true });
    expect(t.findings[0]!.code).toBe("correction.tooFast");
    expect(t.findings[0]!.text).toContain("(at hour 24, on the line between the values either side of it)");
  });

  it("a window with a measured value above the line is judged on the measured value, not estimated", () => {
    const t = correctionTrend(pts([0, 120], [20, 129], [30, 128]))!;
    expect(t.windows[0]!.change).toBe(9);
    expect(t.windows[0]!.estimated).toBeUndefined();
  });

  it("lowering is judged the same way", () => {
    // 160 − 14 × 24 / 26 = 147.08 at hour 24: − 12.9 [D].
    const t = correctionTrend(pts([0, 160], [26, 146]))!;
    expect(t.windows[0]!.change).toBeCloseTo(12.92, 2);
    expect(t.findings[0]!.code).toBe("correction.tooFast");
  });

  it("the open window is not judged at an end it has not reached", () => {
    const t = correctionTrend(pts([0, 120], [10, 124]), { nowHours: 12 })!;
    expect(t.windows[0]!.estimated).toBeUndefined();
    expect(t.windows[0]!.change).toBe(4);
  });
});

describe("the extreme of a window", () => {
  it("lowering is judged on the lowest value reached, not the last: 160 → 149 → 152 is − 11", () => {
    const t = correctionTrend(pts([0, 160], [10, 149], [20, 152]))!;
    expect(t.windows[0]!.change).toBe(11);
    expect(t.findings[0]!.code).toBe("correction.tooFast");
  });
});

describe("the last value, the window's own clock, and the words of each direction", () => {
  it("a sodium of no direction is judged by its last value, not its second", () => {
    // Normal range 135–145 (REFERENCES §8): leaving it is a danger; coming back into it is not.
    expect(codes(pts([0, 140], [6, 140], [12, 150]))).toContain("correction.worsening");
    expect(codes(pts([0, 140], [6, 150], [12, 140]))).not.toContain("correction.worsening");
  });

  it("a worsening says which way it went", () => {
    const down = correctionTrend(pts([0, 120], [6, 117]))!.findings.find(
      (f) => f.code === "correction.worsening",
    )!;
    expect(down.text).toContain("has fallen from 120.0 to 117.0");
    expect(down.text).toContain("in a hyponatraemia");
    const up = correctionTrend(pts([0, 160], [6, 163]))!.findings.find(
      (f) => f.code === "correction.worsening",
    )!;
    expect(up.text).toContain("has risen from 160.0 to 163.0");
    expect(up.text).toContain("in a hypernatraemia");
  });

  it("the rate is the change over the time the values span, not over the time since", () => {
    // +6 in 6 h is 1 per hour, even when it is asked about at hour 8.
    const t = correctionTrend(pts([0, 120], [6, 126]), { nowHours: 8 })!;
    expect(t.projected).toEqual({ perHour: 1, atWindowEnd: 24 });
  });

  it("a window that has just begun projects nothing yet", () => {
    // Hour 24.5 is half an hour into the second window: too soon for a rate.
    const t = correctionTrend(pts([0, 120], [12, 124], [24.5, 125]))!;
    expect(t.projected).toBeUndefined();
  });

  it("lowering a hypernatraemia speaks of a fall, and of no high risk", () => {
    // −6 in 6 h projects to −24 over the day, above the 10 a day for lowering (REFERENCES §5 [M/P]).
    const t = correctionTrend(pts([0, 160], [6, 154]), { highRisk: true })!;
    const open = t.findings.find((f) => f.code === "correction.windowOpen")!;
    expect(open.text).toContain("the fall would reach 24");
    expect(t.findings.map((f) => f.text).join(" ")).not.toContain("at high risk");
  });
});

describe("a plan with no values over time yet", () => {
  it("lowering a hypernatraemia keeps its own limit, whatever the risk", () => {
    // About 10 a day for lowering (REFERENCES §5 [M/P]); the high-risk 8 is for raising (Verbalis 2013 [M]).
    expect(planFits(undefined, -9, true, 160)).toMatchObject({ limit: 10, fits: true });
    expect(planFits(undefined, 9, true, 118)).toMatchObject({ limit: 8, fits: false });
    expect(planFits(undefined, 9, false, 118)).toMatchObject({ limit: 10, fits: true });
  });
});
