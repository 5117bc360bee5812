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

describe("each kind of piece (one line, in the lexer's own words)", () => {
  // n: number (< below, > above, ? ambiguous comma, !flag), r: range low..high, u: unit, w: word,
  // s: separator, and flags, times and incomplete units by their text. Invented pieces.
  const d = (l: Lexeme): string => {
    switch (l.kind) {
      case "number":
        return `n:${l.value}${l.below ? "<" : ""}${l.above ? ">" : ""}${l.ambiguous ? "?" : ""}${l.flag ? `!${l.flag}` : ""}`;
      case "range":
        return `r:${l.low ?? ""}..${l.high ?? ""}`;
      case "unit":
        return `u:${l.unit ?? "foreign"}`;
      case "word":
        return `w:${l.lower}`;
      case "sep":
        return `s${l.char === " " ? "_" : l.char}`;
      case "flag":
      case "time":
      case "incomplete":
      case "masked":
        return `${l.kind}:${l.text}`;
      default:
        return l.kind;
    }
  };
  const cases: [string, string][] = [
    // Censored values, written together or apart: never a plain number.
    ["<5", "n:5<"],
    [">60", "n:60>"],
    ["≤5", "n:5<"],
    ["≥ 60", "n:60>"],
    ["< 10 mg/dL", "n:10< u:mg/dL"],
    ["> 33.3", "n:33.3>"],
    // Signs, decimals, decimal commas; a comma that could be thousands is marked.
    ["-3.2", "n:-3.2"],
    ["+2", "n:2"],
    [".5", "n:0.5"],
    ["1,5", "n:1.5"],
    ["1,200", "n:1.2?"],
    ["12,345", "n:12.345?"],
    ["1.200", "n:1.2"],
    // Flags stuck to a number, in every spelling.
    ["124*", "n:124!*"],
    ["124**", "n:124!**"],
    ["131↓", "n:131!↓"],
    ["131↑↑", "n:131!↑↑"],
    ["7!", "n:7!!"],
    ["9.4H", "n:9.4!H"],
    ["2.9L", "n:2.9!L"],
    ["150HH", "n:150!HH"],
    ["2.1ll", "n:2.1!LL"],
    // Flags on their own.
    ["H", "flag:H"],
    ["HH", "flag:HH"],
    ["A", "flag:A"],
    ["*", "flag:*"],
    ["critical", "flag:CRITICAL"],
    ["abn", "flag:ABN"],
    ["(L)", "open flag:L close"],
    // Ranges: joined, spaced, bracketed, one-sided, negative.
    ["135-145", "r:135..145"],
    ["135 - 145", "r:135..145"],
    ["[135-145]", "open r:135..145 close"],
    ["<135-145", "r:..145"],
    ["-5-5", "r:-5..5"],
    ["3.5-5.1", "r:3.5..5.1"],
    ["(135 to 145)", "open r:135..145 close"],
    ["135 to 145", "n:135 w:to n:145"],
    ["145 - 135", "n:145 dash n:135"],
    ["Ref: 135-145", "w:ref s: r:135..145"],
    // Times; an hour past 23 or minutes past 59 are not times.
    ["03:15", "time:03:15"],
    ["3h15", "time:3h15"],
    ["23:59:59", "time:23:59:59"],
    ["24:00", "w:24:00"],
    ["9:60", "w:9:60"],
    // Units in any case; units of no analyte of ours; a mass without a volume.
    ["mmol/L", "u:mmol/L"],
    ["mEq/L", "u:mEq/L"],
    ["mOsm/kg", "u:mOsm/kg"],
    ["mosm/l", "u:mOsm/L"],
    ["5.5mM", "n:5.5 u:mmol/L"],
    ["umol/L", "u:foreign"],
    ["kPa", "u:foreign"],
    ["%", "u:foreign"],
    ["mg", "incomplete:mg"],
    ["g", "incomplete:g"],
    // Names glued to numbers and units, and slash-joined runs.
    ["Na128", "w:na n:128"],
    ["glu30mmol/L", "w:glu n:30 u:mmol/L"],
    ["K3.1H", "w:k n:3.1!H"],
    ["128mmol/L", "n:128 u:mmol/L"],
    ["Na133/K3.9/Cl101/HCO3 19", "w:na n:133 s/ w:k n:3.9 s/ w:cl n:101 s/ w:hco3 n:19"],
    // A full stop after a value is punctuation; what is not a number stays a word.
    ["Na 140.", "w:na n:140"],
    ["140.0.", "n:140"],
    ["1.2.3", "w:1.2.3"],
    ["12a", "w:12a"],
    ["1e5", "w:1e5"],
    ["0x10", "w:0x10"],
    ["1234567", "w:1234567"],
  ];
  it.each(cases)("%j → %s", (line, pieces) => {
    expect(lex(line).map(d).join(" ")).toBe(pieces);
  });
});
