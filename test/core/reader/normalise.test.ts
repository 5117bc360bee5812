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
