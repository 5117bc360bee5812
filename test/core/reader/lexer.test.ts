import { describe, expect, it } from "vitest";
import { type Lexeme, lexLine, unitOf } from "../../../core/reader/lexer.js";
import { isName } from "../../../core/reader/names.js";

const lex = (line: string) => lexLine(line, 0, () => false, isName);
const kinds = (line: string) => lex(line).map((l) => l.kind);
const numbers = (line: string) =>
  lex(line)
    .filter((l): l is Extract<Lexeme, { kind: "number" }> => l.kind === "number")
    .map((l) => [l.value, l.flag]);

describe("the lexer", () => {
  it("types the pieces of a row: name, number, unit, flag, range", () => {
    // The brackets stay pieces of their own: the reader uses them to tell a range from a result.
    expect(kinds("Potassium 2.9 L mmol/L (3.5 - 5.1)")).toEqual([
      "word",
      "number",
      "flag",
      "unit",
      "open",
      "range",
      "close",
    ]);
  });

  it("keeps a flag stuck to a number with the number", () => {
    expect(numbers("Na 124*")).toEqual([[124, "*"]]);
    expect(numbers("Na 131↓")).toEqual([[131, "↓"]]);
  });

  it("reads a range bare, in square brackets and in round ones", () => {
    for (const line of ["135-145", "[135-145]", "(135 - 145)"]) {
      const range = lex(line).find((l) => l.kind === "range");
      expect(range, line).toMatchObject({ low: 135, high: 145 });
    }
  });

  it("splits a name run into its number (Na128)", () => {
    expect(kinds("Na128")).toEqual(["word", "number"]);
  });

  it("marks a comma that could be a thousands separator as ambiguous", () => {
    const n = lex("glu 1,200").find((l) => l.kind === "number") as Extract<Lexeme, { kind: "number" }>;
    expect(n.ambiguous).toBe(true);
  });

  it("reads a clock time as a time, not a number", () => {
    expect(kinds("at 03:15")).toEqual(["word", "time"]);
  });

  it("places every piece inside the line, offset by its base", () => {
    const line = "Na 128 mmol/L";
    for (const l of lexLine(line, 100, () => false, isName)) {
      expect(l.start).toBeGreaterThanOrEqual(100);
      expect(l.end).toBeLessThanOrEqual(100 + line.length);
    }
  });

  it("names units in any case and spacing, and knows the ones of no analyte of ours", () => {
    expect(unitOf("mmol/L")).toBe("mmol/L");
    expect(unitOf("MG/DL")).toBe("mg/dL");
    expect(unitOf("kPa")).toBe("foreign");
    expect(unitOf("banana")).toBeUndefined();
  });
});
