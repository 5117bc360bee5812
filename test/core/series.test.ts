/** A sodium series written in one message (core/series.ts): clock times or hours, in the order written. */
import { describe, expect, it } from "vitest";
import { readSeries } from "../../core/series.js";

describe("a series written in one message", () => {
  it("clock times roll over midnight in the order written", () => {
    const s = readSeries("Na 118 at 22:00, 121 at 04:00, 126 at 09:30");
    expect(s.points.map((p) => [p.hours, p.sodium])).toEqual([
      [0, 118],
      [6, 121],
      [11.5, 126],
    ]);
    expect(s.firstClock).toBe(22 * 60);
  });
  it("hours after each value, on one line", () => {
    expect(readSeries("Na 118 (0 h) 121 (6 h) 125 (12h)").points.map((p) => p.hours)).toEqual([0, 6, 12]);
  });
  it("pasted rows with a time first, and glucose beside the sodium", () => {
    const s = readSeries("22:10 Na 127 glucose 45 mmol/L\n08:10 Na 139 glucose 12 mmol/L");
    expect(s.points).toEqual([
      { hours: 0, sodium: 127, glucose: 45 },
      { hours: 10, sodium: 139, glucose: 12 },
    ]);
  });
  it("asks about an ambiguous time, a missing one, two at once, and mixed kinds", () => {
    expect(readSeries("Na 118 at 9, 121 at 14:00").problems.map((p) => p.code)).toContain(
      "series.timeAmbiguous",
    );
    expect(readSeries("Na 118 at 22:00, 121").problems.map((p) => p.code)).toContain("series.timeMissing");
    expect(readSeries("Na 118 at 22:00, 121 at 22:00").problems.map((p) => p.code)).toContain(
      "series.sameTime",
    );
    expect(readSeries("Na 118 at 22:00, 121 (6 h)").problems.map((p) => p.code)).toContain(
      "series.mixedTimes",
    );
  });
  it("12-hour times", () => {
    expect(readSeries("Na 118 at 10pm, 121 at 4am").points.map((p) => p.hours)).toEqual([0, 6]);
  });
});
