import { describe, expect, it } from "vitest";
import { headerStamps, latestColumn, rangeColumns } from "../../../core/reader/columns.js";
import { lexLine } from "../../../core/reader/lexer.js";
import { isName } from "../../../core/reader/names.js";

// In a message, the privacy guard masks dates (they could be a date of birth); the lexer keeps a
// masked piece's text only so that columns can be ordered. Dates are masked here the same way.
const isDate = (text: string) => /\d+[/-]\d+/.test(text);
const stamps = (header: string) =>
  headerStamps(lexLine(header, 0, (start, end) => isDate(header.slice(start, end)), isName));

describe("result columns", () => {
  it("the latest column by ISO dates", () => {
    expect(latestColumn(stamps("Test 2026-12-01 2026-12-02"), 2)).toBe(1);
    expect(latestColumn(stamps("Test 2026-12-02 2026-12-01"), 2)).toBe(0);
  });

  it("by times on the same date", () => {
    expect(latestColumn(stamps("Test 02/12 06:00 02/12 14:00"), 2)).toBe(1);
    expect(latestColumn(stamps("Test 02/12/2026 14:00 02/12/2026 06:00"), 2)).toBe(0);
  });

  it("day-month and month-day must agree, or it asks", () => {
    // 01/02 and 02/01: January 2 or February 1 — the readings disagree on which is later.
    expect(latestColumn(stamps("Test 01/02 02/01"), 2)).toBeUndefined();
    // 25/11 and 30/11 can only be day-month.
    expect(latestColumn(stamps("Test 25/11 30/11"), 2)).toBe(1);
  });

  it("by the words current and previous", () => {
    expect(latestColumn(stamps("Test previous current"), 2)).toBe(1);
  });

  it("asks when the header does not stamp every column, or two are equal", () => {
    expect(latestColumn(stamps("Test Result Result"), 2)).toBeUndefined();
    expect(latestColumn(stamps("Test 2026-12-02 2026-12-02"), 2)).toBeUndefined();
    expect(latestColumn(stamps("Test 2026-12-02"), 2)).toBeUndefined();
  });
});

describe("a header that names the range's columns", () => {
  const header = (text: string) => lexLine(text, 0, () => false, isName);
  it("gives the position of the result and of each end", () => {
    expect(rangeColumns(header("Test Result Low High"))).toEqual({ result: 0, low: 1, high: 2 });
    expect(rangeColumns(header("Analyte Min Max Value Units"))).toEqual({ result: 2, low: 0, high: 1 });
    expect(rangeColumns(header("Test Value Lower Upper"))).toEqual({ result: 0, low: 1, high: 2 });
  });
  it("is no range header when an end is missing, repeated, or a time could be a column", () => {
    expect(rangeColumns(header("Test Result Low"))).toBeUndefined();
    expect(rangeColumns(header("Test Result Low High High"))).toBeUndefined();
    expect(rangeColumns(header("Test Result 08:00 Low High"))).toBeUndefined();
    expect(rangeColumns(header("Test Result Previous"))).toBeUndefined();
  });
});

describe("which column is latest, header by header", () => {
  // Our own rules (core/reader/columns.ts): every column stamped, one latest, both date readings
  // agreeing. Each row: the header, the number of result columns, the column used (or undefined: ask).
  it.each([
    // Dates in every written form.
    ["Test 2026-12-01 2026-12-02", 2, 1],
    ["Test 2026-1-9 2025-12-31", 2, 0],
    ["Test 02.12.2026 03.12.2026", 2, 1],
    ["Test 3-12-26 2-12-26", 2, 0],
    ["Test 2-Dec-2026 3-Dec-2026", 2, 1],
    ["Test 3-December-2026 2-December-2026", 2, 0],
    ["Test 30-Nov 1-Dec", 2, 1],
    ["Test 1Dec 30Nov", 2, 0],
    ["Test 2-Sept 2-Oct", 2, 1],
    ["Test 2-jan-26 2-feb-26 2-mar-26", 3, 2],
    ["Test 2-Apr 2-May 2-Jun 2-Jul 2-Aug", 5, 4],
    ["Test 2-Sep 2-Aug", 2, 0],
    ["Test 2-Nov 2-Oct", 2, 0],
    // Not a month: no stamp, so it asks.
    ["Test 2-Foo 3-Foo", 2, undefined],
    // The year decides before the month; two and four digits are the same year.
    ["Test 31/12/2025 01/01/2026", 2, 1],
    ["Test 01/01/26 31/12/2025", 2, 0],
    // A day or month out of range leaves one reading only.
    ["Test 13/11 12/11", 2, 0],
    ["Test 11/13 11/12", 2, 0],
    ["Test 12/31 12/30", 2, 0],
    ["Test 32/11 30/11", 2, undefined],
    ["Test 0/11 5/11", 2, undefined],
    // Both readings valid and agreeing, or disagreeing.
    ["Test 01/01 02/02", 2, 1],
    ["Test 01/02 02/01", 2, undefined],
    // Times after dates order the same day; a time on its own stamps nothing.
    ["Test 02/12 23:00 03/12 01:00", 2, 1],
    ["Test 03/12 01:00 02/12 23:00", 2, 0],
    ["Test 02/12 06:00 02/12 05:59", 2, 0],
    ["Test 06:00 14:00", 2, undefined],
    ["Test 02/12 06:00 14:00", 2, undefined],
    // Words.
    ["Test previous current", 2, 1],
    ["Test latest prior", 2, 0],
    ["Test earlier now", 2, 1],
    ["Test today yesterday", 2, 0],
    ["Test old new", 2, 1],
    ["Test last current", 2, 1],
    ["Test current current", 2, undefined],
    ["Test previous previous", 2, undefined],
    ["Test previous 02/12", 2, undefined],
    // The stamps must match the columns, and one column is no choice.
    ["Test 2026-12-01 2026-12-02", 3, undefined],
    ["Test 2026-12-01", 1, undefined],
  ] as [string, number, number | undefined][])("%s (%i columns) uses %s", (header, columns, expected) => {
    expect(latestColumn(stamps(header), columns)).toBe(expected);
  });

  it("a time is added to the date before it, under both readings", () => {
    const [s] = stamps("Test 2026-12-02 06:30");
    const [d] = stamps("Test 2026-12-02");
    expect(s!.dm! - d!.dm!).toBe(6 * 60 + 30);
    expect(s!.md! - d!.md!).toBe(6 * 60 + 30);
  });
});

describe("a range header, word by word", () => {
  const header = (text: string) => lexLine(text, 0, () => false, isName);
  it.each([
    ["Test Results Minimum Maximum", { result: 0, low: 1, high: 2 }],
    ["Test Low High Value", { result: 2, low: 0, high: 1 }],
    ["Test High Result Low", { result: 1, low: 2, high: 0 }],
    ["TEST RESULT LOW HIGH", { result: 0, low: 1, high: 2 }],
    ["Test Result Low High 2", undefined],
    ["Test Value Min", undefined],
    ["Test Min Max", undefined],
    ["Test Result Result Max", undefined],
    ["Test Result Min Min", undefined],
    ["Test Result Max Max", undefined],
  ] as [string, unknown][])("%s", (text, expected) => {
    expect(rangeColumns(header(text))).toEqual(expected);
  });

  it("a masked piece is no range header", () => {
    const text = "Test Result Low High 02/12";
    expect(rangeColumns(lexLine(text, 0, (s, e) => isDate(text.slice(s, e)), isName))).toBeUndefined();
  });
});

describe("month names in a header", () => {
  // Found by the table above: "December", "June" and "July" were not read as months (the pattern
  // took four letters of the name and looked them up), so such a header asked instead of choosing.
  it.each([
    ["Test 3-December-2026 2-December-2026", 0],
    ["Test 2-June 2-July", 1],
    ["Test 2-July 2-June", 0],
    ["Test 1-January 1-February 1-March", 2],
    ["Test 1-Sept 1-September", undefined],
    ["Test 1-Decoy 2-Decoy", undefined],
    ["Test 1-Ma 2-Ma", undefined],
  ] as [string, number | undefined][])("%s uses %s", (header, expected) => {
    expect(latestColumn(stamps(header), header.split(" ").length - 1)).toBe(expected);
  });
});

describe("header stamps, piece by piece", () => {
  it("a time on its own is a column of its own; a second time after a date is too", () => {
    expect(stamps("Test 06:00 14:00")).toHaveLength(2);
    expect(stamps("Test 02/12 06:00 14:00")).toHaveLength(2);
    expect(stamps("Test previous 06:00")).toHaveLength(2);
  });

  it("a time adds only to the readings a date has", () => {
    // 13/11 can only be day-month: the month-day reading stays missing after its time.
    expect(stamps("Test 13/11 06:00")[0]!.md).toBeUndefined();
  });

  it("plain numbers in a header are no dates", () => {
    expect(stamps("Test 2.12 3.12")).toEqual([]);
  });

  it("a two-digit year after a month name is the same year as four digits", () => {
    expect(latestColumn(stamps("Test 1-Jan-26 31-Dec-2025"), 2)).toBe(0);
    expect(latestColumn(stamps("Test 31-Dec-2025 1-Jan-26"), 2)).toBe(1);
  });

  it("one word among dates is not an order", () => {
    expect(latestColumn(stamps("Test current 02/12"), 2)).toBeUndefined();
    expect(latestColumn(stamps("Test 02/12 current"), 2)).toBeUndefined();
  });
});

describe("a range header with commas, or one end missing", () => {
  const header = (text: string) => lexLine(text, 0, () => false, isName);
  it.each([
    ["Test, Result, Low, High", { result: 0, low: 1, high: 2 }],
    ["Test | Value | Min | Max", { result: 0, low: 1, high: 2 }],
    ["Test Low High Max", undefined],
    ["Test Result High Max", undefined],
    ["Test Result Low Min", undefined],
  ] as [string, unknown][])("%s", (text, expected) => {
    expect(rangeColumns(header(text))).toEqual(expected);
  });
});
