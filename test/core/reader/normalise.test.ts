import { describe, expect, it } from "vitest";
import { normalise } from "../../../core/reader/normalise.js";

describe("normalise", () => {
  it.each([
    ["Na\u00a0128", "Na 128", "a non-breaking space"],
    ["Na\u2009128", "Na 128", "a thin space"],
    ["135\u2013145", "135-145", "an en dash"],
    ["135\u2014145", "135-145", "an em dash"],
    ["\u2212 4", "- 4", "a minus sign"],
    ["\u201cNa\u201d 128", '"Na" 128', "curly double quotes"],
    ["\u2018Na\u2019", "'Na'", "curly single quotes"],
    ["\uff2e\uff41 \uff11\uff12\uff18", "Na 128", "full-width letters and digits"],
    ["Na\u200b128", "Na128", "a zero-width space"],
    ["creat 80 \u00b5mol/L", "creat 80 umol/L", "the micro sign"],
    ["glu 90 mg / dl", "glu 90 mg/dl", "a spaced unit"],
    ["Sodium..........128 mmol/L", "Sodium 128 mmol/L", "dot leaders"],
    ["Na 128… K 4", "Na 128  K 4", "an ellipsis"],
    ["glu 90 mg/ dl", "glu 90 mg/dl", "a space after the slash only"],
    ["glu 90 mg /dl", "glu 90 mg/dl", "a space before the slash only"],
    ["osm 290 mOsm /  kg", "osm 290 mOsm/kg", "more than one space"],
    ["Na 133 / K 3.9", "Na 133 / K 3.9", "a slash between values stays"],
    ["a\r\nb\rc", "a\nb\nc", "Windows and old Mac line ends"],
  ])("%j → %j (%s)", (input, output) => {
    expect(normalise(input)).toBe(output);
  });

  it("returns plain ASCII as it is", () => {
    const text = "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310";
    expect(normalise(text)).toBe(text);
  });

  it("leaves a slash that is not a spaced unit alone", () => {
    expect(normalise("Na 133 / K 3.9")).toBe("Na 133 / K 3.9");
  });
});

describe("normalise, character by character", () => {
  // Each character class in core/reader/normalise.ts, member by member (Unicode code charts; the
  // NFKC foldings are Unicode's own, UAX #15).
  it.each([
    ...[
      "\u2010",
      "\u2011",
      "\u2012",
      "\u2013",
      "\u2014",
      "\u2015",
      "\u2212",
      "\uFE58",
      "\uFE63",
      "\uFF0D",
    ].map((c) => [`135${c}145`, "135-145"] as const),
    ...["\u2018", "\u2019", "\u201A", "\u201B", "\u2032"].map((c) => [`${c}Na${c}`, "'Na'"] as const),
    ...["\u201C", "\u201D", "\u201E", "\u201F"].map((c) => [`${c}Na${c}`, '"Na"'] as const),
    ...["\u200B", "\u200C", "\u200D", "\u2060", "\uFEFF", "\u00AD"].map(
      (c) => [`Na${c}128`, "Na128"] as const,
    ),
    ...["\u00A0", "\u2000", "\u2005", "\u2009", "\u200A", "\u202F", "\u205F", "\u3000"].map(
      (c) => [`Na${c}128`, "Na 128"] as const,
    ),
    ["80 \u00b5mol/L", "80 umol/L"],
    ["80 \u03bcmol/L", "80 umol/L"],
    ["Na 128\u2028K 4", "Na 128\nK 4"],
    ["Na 128\u2029K 4", "Na 128\nK 4"],
    ["a\rb", "a\nb"],
  ] as [string, string][])("%j → %j", (input, output) => {
    expect(normalise(input)).toBe(output);
  });

  it.each([
    // Every unit that is closed up around its slash.
    ["5 g / dl", "5 g/dl"],
    ["90 mg / dL", "90 mg/dL"],
    ["7 mmol / L", "7 mmol/L"],
    ["80 umol / L", "80 umol/L"],
    ["140 mEq / L", "140 mEq/L"],
    ["290 mOsm / kg", "290 mOsm/kg"],
    ["290 mosmol / kg", "290 mosmol/kg"],
    ["9 ng / ml", "9 ng/ml"],
    ["9 pmol / L", "9 pmol/L"],
    ["9 nmol / L", "9 nmol/L"],
    ["90 MG / DL", "90 MG/DL"],
    // Not a unit, or a unit glued to other letters: left alone.
    ["90 xmg / dl", "90 xmg / dl"],
    ["90 mg / dlx", "90 mg / dlx"],
    ["Na 133 / K", "Na 133 / K"],
    ["glu / urea", "glu / urea"],
    // Two full stops are punctuation; three or more are a leader.
    ["Na..128", "Na..128"],
    ["Na...128", "Na 128"],
  ])("%j → %j", (input, output) => {
    expect(normalise(input)).toBe(output);
  });
});
