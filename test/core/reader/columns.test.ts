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
