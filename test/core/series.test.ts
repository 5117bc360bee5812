/** A sodium series written in one message (core/series.ts): clock times or hours, in the order written. */
import { describe, expect, it } from "vitest";
import { clockAt, readSeries } from "../../core/series.js";

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

describe("every way of writing a time, and what is asked", () => {
  // Invented series: [text, [hours, sodium] per point, first clock time in minutes, problem codes].
  const cases: [string, [number, number][], number | undefined, string[]][] = [
    // 12-hour clock: 12 pm is noon, 12 am is midnight.
    [
      "Na 118 at 12pm, 121 at 12am",
      [
        [0, 118],
        [12, 121],
      ],
      720,
      [],
    ],
    [
      "Na 118 at 11:30pm, 121 at 12:15am",
      [
        [0, 118],
        [0.75, 121],
      ],
      1410,
      [],
    ],
    [
      "Na 118 at 12:00am, 121 at 6:00am",
      [
        [0, 118],
        [6, 121],
      ],
      0,
      [],
    ],
    [
      "Na 118 at 12:30pm 121 at 1:30pm",
      [
        [0, 118],
        [1, 121],
      ],
      750,
      [],
    ],
    [
      "Na 118 at 22:00, 121 at 4 pm",
      [
        [0, 118],
        [18, 121],
      ],
      1320,
      [],
    ],
    // Separators between hours and minutes, and the signs people put before a time.
    [
      "Na 118 at 22.00, 121 at 04.00",
      [
        [0, 118],
        [6, 121],
      ],
      1320,
      [],
    ],
    [
      "Na 118 at 22h00, 121 at 04h00",
      [
        [0, 118],
        [6, 121],
      ],
      1320,
      [],
    ],
    [
      "Na 118 @ 22:00, 121 @ 06:00",
      [
        [0, 118],
        [8, 121],
      ],
      1320,
      [],
    ],
    [
      "Na 118 (22:00) 121 (06:00)",
      [
        [0, 118],
        [8, 121],
      ],
      1320,
      [],
    ],
    [
      "22:00 Na 118; 04:00 Na 121",
      [
        [0, 118],
        [6, 121],
      ],
      1320,
      [],
    ],
    [
      "22:00 Na 118\n04:00 Na 121\n10:00 Na 126",
      [
        [0, 118],
        [6, 121],
        [12, 126],
      ],
      1320,
      [],
    ],
    // Written in order: a time earlier than the one before it is the next day.
    [
      "Na 118 at 22:00\nNa 121 at 22:30\nNa 119 at 21:00",
      [
        [0, 118],
        [0.5, 121],
        [23, 119],
      ],
      1320,
      [],
    ],
    [
      "Na 118 at 22:00, Na 121 at 23:00, Na 124 at 22:00",
      [
        [0, 118],
        [1, 121],
        [24, 124],
      ],
      1320,
      [],
    ],
    // Hours from the first value, counted from the first one written.
    [
      "Na 118 0h, 121 6h, 124 12.5h",
      [
        [0, 118],
        [6, 121],
        [12.5, 124],
      ],
      undefined,
      [],
    ],
    [
      "Na 118 +0 hrs, 121 +6 hrs",
      [
        [0, 118],
        [6, 121],
      ],
      undefined,
      [],
    ],
    [
      "Na 118 (0 h) 121 (6,5 h)",
      [
        [0, 118],
        [6.5, 121],
      ],
      undefined,
      [],
    ],
    [
      "Na 118 (2 h) 121 (8 h)",
      [
        [0, 118],
        [6, 121],
      ],
      undefined,
      [],
    ],
    ["Na 118 (0 h) 121 (0 h)", [], undefined, ["series.hoursOrder"]],
    ["Na 118 (6 h) 121 (0 h)", [], undefined, ["series.hoursOrder"]],
    // Not a time: an hour past 23 or minutes past 59 leave that sodium without one.
    ["Na 118 at 24:00, 121 at 04:00", [], undefined, ["series.timeMissing"]],
    ["Na 118 at 22:60, 121 at 04:00", [], undefined, ["series.timeMissing"]],
    // Every time ambiguous is named; a value the reader refused is left out and said.
    ["Na 118 at 9, 121 at 10", [], undefined, ["series.timeAmbiguous", "series.timeAmbiguous"]],
    ["Na 118 at 22:00, 1,21 at 04:00", [[0, 118]], 1320, ["value.implausible"]],
  ];
  it.each(cases)("%j", (text, points, firstClock, problems) => {
    const s = readSeries(text);
    expect(s.points.map((p) => [p.hours, p.sodium])).toEqual(points);
    expect(s.firstClock).toBe(firstClock);
    expect(s.problems.map((p) => p.code)).toEqual(problems);
  });

  it("a message without a time is no series", () => {
    expect(readSeries("Na 118")).toEqual({ points: [], problems: [], timed: false });
    expect(readSeries("Na 118 at 22:00, 121 at 04:00").timed).toBe(true);
  });

  it("the problems say what to write", () => {
    const said = (m: string) => readSeries(m).problems.map((p) => p.message);
    expect(said("Na 118 at 9, 121 at 14:00")).toEqual([
      '"at 9" could be morning or evening: write the time as 09:00 or 21:00.',
    ]);
    expect(said("Na 118 at 22:00, 121")).toEqual([
      "One sodium has no time (Na 121): give each value its time.",
    ]);
    expect(said("Na 118 at 22:00, 121, 124")).toEqual([
      "2 sodiums have no time (Na 121, 124): give each value its time.",
    ]);
    expect(said("Na 118 at 22:00, 121 at 22:00")).toEqual([
      "Two values have the same time: which one is it?",
    ]);
  });

  it("clock times of later hours wrap at midnight", () => {
    expect(clockAt(22 * 60, 6)).toBe("04:00");
    expect(clockAt(22 * 60, 30.5)).toBe("04:30");
    expect(clockAt(0, 0)).toBe("00:00");
    expect(clockAt(9 * 60 + 5, 0)).toBe("09:05");
  });
});

describe("a series' segments and the values each point keeps", () => {
  it("several times on one line starting with a time split before each time", () => {
    const s = readSeries("22:10 Na 127 04:30 Na 131 06:10 Na 133");
    expect(s.points.map((p) => [p.hours, p.sodium])).toEqual([
      [0, 127],
      [380 / 60, 131],
      [8, 133],
    ]);
    expect(s.problems).toEqual([]);
  });

  it("a glucose beside each sodium is kept with its point, in hours as in clock times", () => {
    expect(readSeries("Na 127 glucose 45 mmol/L (0 h)\nNa 133 glucose 20 mmol/L (6 h)").points).toEqual([
      { hours: 0, sodium: 127, glucose: 45 },
      { hours: 6, sodium: 133, glucose: 20 },
    ]);
    // Without a glucose, a point has no glucose key at all (the JSON contract stays small).
    expect(Object.keys(readSeries("Na 118 (0 h) 121 (6 h)").points[1]!)).toEqual(["hours", "sodium"]);
  });

  it("a time just after midnight written after one just before it is the next day", () => {
    expect(readSeries("Na 120 at 23:59, 122 at 00:01").points.map((p) => p.hours)).toEqual([0, 2 / 60]);
  });

  it("the channel's units reach each point's reader: a unitless glucose is read in them", () => {
    const si = readSeries("Na 127 glu 45 (0 h)\nNa 133 glu 20 (6 h)", { unitSystem: "si" });
    expect(si.points.map((p) => p.glucose)).toEqual([45, 20]);
    const none = readSeries("Na 127 glu 45 (0 h)\nNa 133 glu 20 (6 h)");
    expect(none.points.every((p) => p.glucose === undefined)).toBe(true);
  });

  it("an ambiguous time stops the series even when the other points are well written", () => {
    const s = readSeries("Na 118 at 22:00\nNa 120 at 9\nNa 124 at 06:00");
    expect(s.points).toEqual([]);
    expect(s.timed).toBe(true);
  });
});

describe("a series that asks keeps no points, and a bracketed time first", () => {
  it.each([
    ["Na 118 at 9, 121 at 14:00", "series.timeAmbiguous"],
    ["Na 118 at 22:00, 121", "series.timeMissing"],
    ["Na 118 at 22:00, 121 at 22:00", "series.sameTime"],
    ["Na 118 at 22:00, 121 (6 h)", "series.mixedTimes"],
  ])("%s gives no points (%s)", (text, code) => {
    const s = readSeries(text);
    expect(s.points).toEqual([]);
    expect(s.problems.map((p) => p.code)).toContain(code);
    expect(s.timed).toBe(true);
  });

  it("a time in brackets before each value belongs to the value after it", () => {
    // The time's bracket is the second character of the piece as padded: still time-first.
    expect(readSeries("(22:10) Na 127 (04:30) Na 131").points).toEqual([
      { hours: 0, sodium: 127 },
      { hours: 6 + 20 / 60, sodium: 131 },
    ]);
  });
});
