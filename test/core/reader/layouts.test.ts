/**
 * Pasted reports, read as a resident pastes them: invented panels in several realistic layouts.
 * Each row says what must be read (canonical units) and which problem codes must come — a value is
 * used only when its name, specimen and unit are certain; otherwise the reader asks.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import type { LabInputs } from "../../../core/inputs.js";
import { readMessage } from "../../../core/reader/index.js";

const GLU_MG = 1 / 18.0156; // glucose mg/dL → mmol/L, REFERENCES.md §6 [D]
const ETOH_MG = 1 / 4.6069; // ethanol mg/dL → mmol/L, REFERENCES.md §6 [D]

type Case = [name: string, text: string, inputs: LabInputs, codes?: string[]];

const cases: Case[] = [
  // Flags in every position; ranges before and after the result; units after flag or range.
  ["range before the result", "Potassium (3.5 - 5.1 mmol/L): 2.9 L", { potassium: 2.9 }],
  ["flag between value and unit", "Glucose 9.4 H mmol/L", { glucose: 9.4 }],
  ["a word flag in brackets", "Urea 17 (critical) mmol/L", { urea: 17 }],
  ["flags stuck to numbers", "Na 124* K 3.1↓ Cl 95L", { sodium: 124, potassium: 3.1, chloride: 95 }],
  ["(H) after the unit", "Glucose 11.2 mmol/L (H)", { glucose: 11.2 }],
  ["HH and LL", "Na 118 LL\nK 6.9 HH", { sodium: 118, potassium: 6.9 }],
  ["capital A as abnormal", "Sodium 131 A mmol/L", { sodium: 131 }],
  [
    "Test: value unit (range)",
    "Sodium: 128 mmol/L (135-145)\nGlucose: 5.2 mmol/L (3.9-5.5)",
    { sodium: 128, glucose: 5.2 },
  ],
  ["square brackets, en dash", "Na 133 [135–145] L; Cl 99 [98–107]", { sodium: 133, chloride: 99 }],
  ["Ref prefix", "Na 133 Ref 135-145\nK 4.4 ref: 3.5 - 5.1", { sodium: 133, potassium: 4.4 }],
  ["unit after the range", "Glucose\t6.1\t3.9-5.5 mmol/L\tH", { glucose: 6.1 }],
  [
    "unit in the name",
    "Sodium (mmol/L) 131 (135-145)\nGlucose (mg/dL) 612",
    { sodium: 131, glucose: 612 * GLU_MG },
  ],
  ["upper-limit range", "Ethanol <10 mg/dL\nLactate 1.1 mmol/L (<2.0)", { ethanol: 0, lactate: 1.1 }],
  // Tab-separated and space-aligned tables with a header.
  [
    "tab-separated table",
    "Test\tResult\tUnits\tReference Range\tFlag\nSodium\t128\tmmol/L\t135-145\tL\nPotassium\t2.9\tmmol/L\t3.5-5.1\tL\nUrea\t14.2\tmmol/L\t2.5-7.8\tH\nGlucose\t9.4\tmmol/L\t3.9-5.5\tH\nOsmolality\t310\tmOsm/kg\t275-295\tH",
    { sodium: 128, potassium: 2.9, urea: 14.2, glucose: 9.4, measuredOsmolality: 310 },
  ],
  [
    "aligned columns with spaces",
    "Analyte        Result   Units     Range\nSodium         131      mmol/L    135 - 145\nChloride       101      mmol/L    98 - 107\nBicarbonate    12       mmol/L    22 - 29\nAlbumin        28       g/L       35 - 50",
    { sodium: 131, chloride: 101, bicarbonate: 12, albumin: 28 },
  ],
  // Names as results viewers print them.
  [
    "specimen and qualifier after a comma",
    "Ethanol, plasma 160 mg/dL\nSodium, plasma 138\nGlucose, fasting 5.2 mmol/L\nOsmolality, plasma 320",
    { ethanol: 160 * ETOH_MG, sodium: 138, glucose: 5.2, measuredOsmolality: 320 },
  ],
  ["S-/P- prefixes", "S-Na 127\nP-K 4.0\nP-Osm 268", { sodium: 127, potassium: 4, measuredOsmolality: 268 }],
  // Urine: never the serum values.
  ["urine words", "urine osm 480 urine Na 71", { urineOsmolality: 480, urineSodium: 71 }],
  [
    "glued urine names",
    "UNa 40, UK 35, Uosm 450",
    { urineSodium: 40, urinePotassium: 35, urineOsmolality: 450 },
  ],
  ["spot urine", "spot urine sodium 22 mmol/L", { urineSodium: 22 }],
  [
    "urine after the name",
    "Sodium, urine 55\nOsmolality (urine) 610",
    { urineSodium: 55, urineOsmolality: 610 },
  ],
  [
    "urine section under a header",
    "Serum\nNa 126\nOsm 262\nUrine\nNa 71\nK 40\nOsm 480",
    { sodium: 126, measuredOsmolality: 262, urineSodium: 71, urinePotassium: 40, urineOsmolality: 480 },
  ],
  [
    "urine line label",
    "Na 126 osm 262\nUrine: Na 71 K 40 osm 480",
    { sodium: 126, measuredOsmolality: 262, urineSodium: 71, urinePotassium: 40, urineOsmolality: 480 },
  ],
  [
    "a urine value before serum ones on one line is asked about",
    "urine osm 480 Na 128",
    { urineOsmolality: 480 },
    ["specimen.unclear"],
  ],
  ["urine glucose is not used", "Na 131\nurine glucose 3", { sodium: 131 }],
  // Blood gas printouts: c-prefix and charge signs; an anion gap that names K+ is a claim.
  [
    "blood-gas printout",
    "pH         7.12\npCO2       3.1 kPa\npO2        12.4 kPa\ncHCO3-     9.8 mmol/L\nBE         -18.2 mmol/L\ncNa+       131 mmol/L\ncK+        5.9 mmol/L\ncCl-       99 mmol/L\ncGlu       34.2 mmol/L\ncLac       2.1 mmol/L\nAnion Gap K+  28.1 mmol/L",
    { pH: 7.12, bicarbonate: 9.8, sodium: 131, potassium: 5.9, chloride: 99, glucose: 34.2, lactate: 2.1 },
  ],
  ["an anion gap with (K+)", "AG (K+) 16 mmol/L\nK 4.1", { potassium: 4.1 }],
  [
    "ketones and lactate",
    "Ketones 4.2 mmol/L\nβ-OHB 4.2 mmol/L\nlactate 3.1 mmol/L",
    { betaHydroxybutyrate: 4.2, lactate: 3.1 },
  ],
  [
    "standard bicarbonate is not the bicarbonate",
    "cHCO3-(P) 10.1 mmol/L\ncHCO3-(P,st) 12.0 mmol/L",
    { bicarbonate: 10.1 },
  ],
  // Punctuation and Unicode.
  ["curly quotes and full stops", "“Na” 133 mmol/L. ‘K’ 3.9.", { sodium: 133, potassium: 3.9 }],
  ["mg / dl with spaces", "glucose 612 mg / dl", { glucose: 612 * GLU_MG }],
  ["non-breaking and thin spaces", "Na\u00a0128\u2009mmol/L K\u202f4.1", { sodium: 128, potassium: 4.1 }],
  ["full-width digits", "Na １２８ K ３．１", { sodium: 128, potassium: 3.1 }],
  ["a minus sign", "osmolal gap −4 Na 140", { sodium: 140 }],
  [
    "slash-joined run",
    "Na133/K3.9/Cl101/HCO3 19",
    { sodium: 133, potassium: 3.9, chloride: 101, bicarbonate: 19 },
  ],
  [
    "fishbone-style with names",
    "Na 133 | Cl 101 | BUN 14\nK 3.9 | HCO3 19 | Cr 1.1",
    { sodium: 133, chloride: 101, urea: 14 / 2.8014, potassium: 3.9, bicarbonate: 19 },
  ],
  ["a numbered list", "1. Sodium 128\n2. Potassium 3.3", { sodium: 128, potassium: 3.3 }],
  ["the same result in two units counts once", "Glucose 9.4 mmol/L (169 mg/dL)", { glucose: 9.4 }],
  ["pH is never a phone number", "pH 7.12 pCO2 3.1", { pH: 7.12 }],
  // Columns: the latest only when the header makes the order certain.
  [
    "two columns with dates: the latest",
    "              01/12/2026 22:10   02/12/2026 04:30\nSodium        118                121\nGlucose       5.1                5.3 mmol/L",
    { sodium: 121, glucose: 5.3 },
    ["privacy.identifier"],
  ],
  ["two columns, newest first", "Test       Current   Previous\nSodium     124       119", { sodium: 124 }],
  [
    "two columns with times only: asked",
    "Test  22:10  04:30\nSodium  118  121\nGlucose 5.1 5.3 mmol/L",
    {},
    ["columns.ambiguous"],
  ],
  ["two results and no header: asked", "Na 118 121 126", {}, ["columns.ambiguous"]],
  [
    "a single-result row in a two-column table is not used",
    "Test   Current  Previous\nSodium  124  119\nGlucose 5.3 mmol/L",
    { sodium: 124 },
    ["columns.short"],
  ],
  // Specimens that disagree are reported by specimen, never chosen silently.
  ["lab and blood-gas sodium differ", "Na 124\nVBG Na 138", {}, ["value.specimenConflict"]],
  ["lab and blood-gas sodium agree", "Na 131\ncNa+ 131", { sodium: 131 }],
];

describe("pasted layouts", () => {
  it.each(cases)("%s", (_name, text, expected, codes = []) => {
    const r = readMessage(text);
    expect(Object.keys(r.inputs).sort()).toEqual(Object.keys(expected).sort());
    for (const [k, v] of Object.entries(expected)) expect(r.inputs[k as keyof LabInputs]).toBeCloseTo(v, 3);
    expect(r.problems.map((p) => p.code)).toEqual(codes);
  });

  it("an analyser's calculated fields are claims, never inputs", () => {
    const r = readMessage(
      "Osmolality, calculated 296 mOsm/kg\nOsmolality 310 mOsm/kg (275-295) H\nAnion Gap K+ 18.2",
    );
    expect(r.inputs).toEqual({ measuredOsmolality: 310 });
    expect(r.claims.map((c) => [c.kind, c.value, c.withPotassium ?? false])).toEqual([
      ["calculatedOsmolality", 296, false],
      ["anionGap", 18.2, true],
    ]);
    expect(r.values[0]!.labRange).toEqual({ low: 275, high: 295 });
    expect(r.echo).toMatch(/lab range 275–295/);
  });

  it("readAs names the specimen", () => {
    expect(readMessage("cNa+ 131\nurine Na 40").echo).toBe("Na 131 mmol/L (blood gas), urine Na 40 mmol/L");
  });

  it("names problems by analyte or line, groups repeats, never by word number, never quoting free text", () => {
    const r = readMessage("Sodium 128\nzorblax quux\nK 4\nfrobnicate\nglucose 9.4\nwibble");
    const text = JSON.stringify(r.problems);
    expect(text).toMatch(/3 lines \(2, 4 and 6\)/);
    expect(text).toMatch(/Glucose 9\.4: no unit/);
    expect(text).not.toMatch(/word \d|zorblax|frobnicate|wibble/);
  });

  it("suggests only a unit that would make the value plausible", () => {
    const m = readMessage("glucose 540").problems[0]!.message;
    expect(m).toMatch(/write mg\/dL \(the only plausible one\)/);
    expect(m).not.toMatch(/mmol\/L/);
  });

  it("tests that are not used are listed once, not called not understood", () => {
    const r = readMessage("Creatinine 88 umol/L\nHb 121 g/L\nCRP 4\nNa 128");
    expect(r.problems).toEqual([]);
    expect(r.notes.join()).toMatch(/Not used in these calculations: creatinine, haemoglobin and CRP/);
  });
});

describe("generated panels (property)", () => {
  const ANALYTES = [
    {
      key: "sodium",
      names: ["Sodium", "Na", "S-Na", "Sodium, plasma", "cNa+"],
      unit: "mmol/L",
      min: 110,
      max: 170,
    },
    { key: "potassium", names: ["Potassium", "K", "cK+"], unit: "mmol/L", min: 2, max: 7 },
    { key: "chloride", names: ["Chloride", "Cl", "cCl-"], unit: "mmol/L", min: 80, max: 125 },
    { key: "glucose", names: ["Glucose", "Glucose, fasting", "glu"], unit: "mmol/L", min: 2, max: 60 },
    { key: "urea", names: ["Urea", "urea"], unit: "mmol/L", min: 1, max: 60 },
    {
      key: "measuredOsmolality",
      names: ["Osmolality", "osm", "Osmolality, plasma"],
      unit: "mOsm/kg",
      min: 240,
      max: 360,
    },
    { key: "urineSodium", names: ["urine Na", "UNa", "Sodium, urine"], unit: "mmol/L", min: 5, max: 150 },
    {
      key: "urineOsmolality",
      names: ["urine osm", "Uosm", "Osmolality (urine)"],
      unit: "mOsm/kg",
      min: 60,
      max: 1100,
    },
  ] as const;
  const FLAGS = ["", "H", "L", "*", "↑", "↓", "(H)", "critical", "HH"];
  const row = fc
    .record({
      analyte: fc.constantFrom(...ANALYTES),
      nameIndex: fc.nat(),
      tenths: fc.nat({ max: 10_000 }),
      flag: fc.constantFrom(...FLAGS),
      layout: fc.constantFrom("tab", "colon", "rangeFirst", "flagBeforeUnit", "spaces"),
      withRange: fc.boolean(),
    })
    .map((r) => {
      const value =
        Math.round((r.analyte.min + ((r.analyte.max - r.analyte.min) * r.tenths) / 10_000) * 10) / 10;
      const name = r.analyte.names[r.nameIndex % r.analyte.names.length]!;
      const low = Math.round(r.analyte.min * 1.1);
      const high = Math.round(r.analyte.max * 0.9);
      const range = r.withRange ? `${low} - ${high}` : "";
      const u = r.analyte.unit;
      const f = r.flag;
      const text =
        r.layout === "tab"
          ? [name, value, u, range, f].join("\t")
          : r.layout === "colon"
            ? `${name}: ${value} ${u}${range ? ` (${range})` : ""} ${f}`
            : r.layout === "rangeFirst"
              ? `${name} (${range ? `${range} ` : ""}${u}): ${value} ${f}`
              : r.layout === "flagBeforeUnit"
                ? `${name} ${value} ${f} ${u}${range ? ` [${range}]` : ""}`
                : `${name}    ${value}    ${u}    ${range}    ${f}`;
      return { key: r.analyte.key, value, text, low, high };
    });

  it("reads exactly the generated values: never a range limit, never urine as serum", () => {
    fc.assert(
      fc.property(fc.uniqueArray(row, { selector: (r) => r.key, minLength: 1, maxLength: 8 }), (rows) => {
        const r = readMessage(rows.map((x) => x.text).join("\n"));
        const expected = Object.fromEntries(rows.map((x) => [x.key, x.value]));
        expect(r.inputs).toEqual(expected);
        expect(r.problems).toEqual([]);
      }),
      { numRuns: 400 },
    );
  });
});
