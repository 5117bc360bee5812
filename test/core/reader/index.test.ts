import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { INPUT_KEYS, type LabInputs } from "../../../core/inputs.js";
import { checkTag, readMessage, renderInputs } from "../../../core/reader/index.js";

const GLU_MG = 1 / 18.0156; // glucose mg/dL → mmol/L, REFERENCES.md §6 [D]
const codes = (m: string, units?: "si" | "conventional") =>
  readMessage(m, units ? { unitSystem: units } : {}).problems.map((p) => p.code);

describe("reads the way people type", () => {
  // Invented messages; expected inputs in canonical units.
  const cases: [string, LabInputs][] = [
    [
      "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310",
      { sodium: 128, glucose: 540 * GLU_MG, urea: 14, measuredOsmolality: 310 },
    ],
    ["sodium: 152 mEq/L\nBUN 28", { sodium: 152, urea: 28 / 2.8014 }],
    ["NA=131; GLU=38,5 mmol/L", { sodium: 131, glucose: 38.5 }],
    ["na 118, K 3.1, serum osm 250", { sodium: 118, potassium: 3.1, measuredOsmolality: 250 }],
    ["Na+ 133 / K+ 4.4 / Cl 99 / HCO3 12", { sodium: 133, potassium: 4.4, chloride: 99, bicarbonate: 12 }],
    ["Na128 K3.1 glu30mmol/L", { sodium: 128, potassium: 3.1, glucose: 30 }],
    ["plasma sodium 126 mmol/l, measured osmolality 262 mOsm/kg", { sodium: 126, measuredOsmolality: 262 }],
    ["Glucose (mg/dL): 612  BUN: 44  Na: 149", { glucose: 612 * GLU_MG, urea: 44 / 2.8014, sodium: 149 }],
    [
      "na 139 glu 6.1 mmol/l urea 5.2 mmol/l osmo 318 EtOH 230 mg/dL",
      { sodium: 139, glucose: 6.1, urea: 5.2, measuredOsmolality: 318, ethanol: 230 / 4.6069 },
    ],
    [
      "Na 140 glucose 5.5 mM urea 4 mM osm 302 methanol 32 mg/dL",
      { sodium: 140, glucose: 5.5, urea: 4, measuredOsmolality: 302, methanol: 32 / 3.2042 },
    ],
    [
      "ethylene glycol 62 mg/dl isopropyl alcohol 60 mg/dl",
      { ethyleneGlycol: 62 / 6.2068, isopropanol: 60 / 6.0096 },
    ],
    ["alb 2.1 g/dL na 137 cl 101 bicarb 10", { albumin: 21, sodium: 137, chloride: 101, bicarbonate: 10 }],
    ["NA 141 MEQ/L GLU 1,5 G/L", { sodium: 141, glucose: 150 * GLU_MG }],
    ["Na 138 EtOH <10 mg/dL", { sodium: 138, ethanol: 0 }],
    ["mannitol 600 mg/dL osm 330 mOsm/L", { mannitol: 600 / 18.2172, measuredOsmolality: 330 }],
  ];
  it.each(cases)("%j", (message, expected) => {
    const r = readMessage(message);
    expect(Object.keys(r.inputs).sort()).toEqual(Object.keys(expected).sort());
    for (const [k, v] of Object.entries(expected)) expect(r.inputs[k as keyof LabInputs]).toBeCloseTo(v, 3);
    expect(r.problems.filter((p) => p.code !== "word.unknown")).toEqual([]);
  });

  it("echoes how it read the message", () => {
    expect(readMessage("Na 128 glu 540 mg/dL urea 14 mmol/L osm 310").echo).toBe(
      "Na 128 mmol/L, glucose 540 mg/dL = 29.97 mmol/L, urea 14 mmol/L, measured osm 310 mOsm/kg",
    );
    expect(readMessage("BUN 28").echo).toBe("BUN 28 mg/dL = 10 mmol/L urea");
  });

  it("reads claimed results for checking", () => {
    const r = readMessage("Na 140 glu 5 urea 5 osm 300 calc osm 291 gap 12 corrected Na 141 eff osm 285");
    expect(r.claims.map((c) => [c.kind, c.value])).toEqual([
      ["calculatedOsmolality", 291],
      ["osmolalGap", 12],
      ["correctedSodium", 141],
      ["effectiveOsmolality", 285],
    ]);
  });

  it("reads a case tag, and refuses one that could be a name or record number", () => {
    expect(readMessage("bed 12 Na 128").tag).toBe("bed 12");
    expect(readMessage("#4b Na 128").tag).toBe("4B");
    expect(readMessage("bay ICU-3 Na 128").tag).toBe("bay ICU-3");
    expect(codes("#smith Na 128")).toContain("tag.refused");
    expect(codes("bed 12345 Na 128")).toContain("tag.refused");
    expect(readMessage("bed 123456 Na 128").tag).toBeUndefined();
    expect(checkTag("4B")).toEqual({ ok: true, tag: "4B" });
    expect(checkTag("jones").ok).toBe(false);
  });
});

describe("units are never guessed", () => {
  it("asks about a bare glucose or urea when the channel has no unit system", () => {
    const r = readMessage("Na 130 glucose 30 urea 12");
    expect(r.inputs).toEqual({ sodium: 130 });
    expect(r.problems.filter((p) => p.code === "unit.ambiguous")).toHaveLength(2);
    expect(r.problems[0]!.message).toMatch(/mmol\/L or mg\/dL/);
  });

  it("REFERENCES.md §6 [P]: glucose 30 without a unit may be hyper- or hypoglycaemia", () => {
    expect(codes("glucose 30")).toEqual(["unit.ambiguous"]);
  });

  it("uses the channel's declared unit system", () => {
    expect(readMessage("glucose 30", { unitSystem: "si" }).inputs.glucose).toBe(30);
    expect(readMessage("glucose 30", { unitSystem: "conventional" }).inputs.glucose).toBeCloseTo(
      30 * GLU_MG,
      9,
    );
    expect(readMessage("glucose 30", { unitSystem: "si" }).echo).toMatch(/channel's setting/);
  });

  it("a bare urea under conventional units may be BUN or urea: asks", () => {
    expect(codes("urea 40", "conventional")).toEqual(["unit.ambiguous"]);
    expect(readMessage("urea 40", { unitSystem: "conventional" }).problems[0]!.message).toMatch(/BUN/);
  });

  it("urea in mg/dL is urea, not BUN, and says so", () => {
    // REFERENCES.md §6 [D]: urea mg/dL ÷ 6.006; BUN mg/dL ÷ 2.801.
    const r = readMessage("urea 40 mg/dL");
    expect(r.inputs.urea).toBeCloseTo(40 / 6.006, 3);
    expect(r.notes.join()).toMatch(/not BUN/);
  });

  it("Na, osmolality and BUN have unambiguous conventions", () => {
    const r = readMessage("Na 128 osm 270 BUN 14");
    expect(r.problems).toEqual([]);
    expect(r.inputs.sodium).toBe(128);
    expect(r.inputs.measuredOsmolality).toBe(270);
    // REFERENCES.md §6 [D]: BUN mg/dL ÷ 2.801 = urea mmol/L.
    expect(r.inputs.urea).toBeCloseTo(14 / 2.801, 2);
  });

  it("refuses a unit that does not fit the analyte, and an incomplete unit", () => {
    expect(codes("Na 128 mg/dL")).toEqual(["unit.notForAnalyte"]);
    expect(codes("glucose 540 mg")).toEqual(["unit.incomplete"]);
  });

  it("a comma that could be a thousands separator is asked about", () => {
    expect(codes("glucose 1,200 mg/dL")).toEqual(["value.ambiguousNumber"]);
  });

  it("values above the measuring range are not used", () => {
    expect(codes("glucose >600 mg/dL")).toEqual(["value.censored"]);
  });
});

describe("problems, never silent", () => {
  it("a message of only a numbered heading says its number was not used (found by npm run fuzz)", () => {
    for (const text of ["2 T", "5 t", "3 total"]) {
      const r = readMessage(text);
      expect(r.inputs, text).toEqual({});
      expect(
        r.problems.map((p) => p.code),
        text,
      ).toContain("number.orphan");
    }
    // A numbered heading above real rows stays a heading.
    expect(readMessage("1. Chemistry\nNa 140").problems).toEqual([]);
  });

  it("refuses implausible values with the range in the unit written", () => {
    // REFERENCES.md §6 [P]: typo guard Na 90–200.
    const r = readMessage("Na 1280 K 4");
    expect(r.inputs).toEqual({ potassium: 4 });
    expect(r.problems[0]).toMatchObject({ code: "value.implausible" });
    expect(r.problems[0]!.message).toMatch(/90–200 mmol\/L/);
  });

  it("asks when the channel's unit makes a bare value implausible and another unit would not", () => {
    const r = readMessage("glucose 540", { unitSystem: "si" });
    expect(r.problems[0]!.code).toBe("unit.ambiguous");
    expect(r.problems[0]!.message).toMatch(/in mg\/dL it would be/);
    // REFERENCES.md §6 [P]: ethanol above about 1,000 mg/dL (217 mmol/L) is beyond survivable levels.
    const e = readMessage("EtOH 230", { unitSystem: "si" });
    expect(e.inputs).toEqual({});
    expect(e.problems[0]!.code).toBe("unit.ambiguous");
    expect(readMessage("EtOH 1001 mg/dL").problems[0]!.code).toBe("value.implausible");
    expect(readMessage("EtOH 999 mg/dL").inputs.ethanol).toBeCloseTo(999 / 4.6069, 3);
  });

  it("an analyte given twice with different values is not used", () => {
    const r = readMessage("Na 128 K 4 Na 131");
    expect(r.inputs).toEqual({ potassium: 4 });
    expect(codes("Na 128 K 4 Na 131")).toEqual(["value.conflict"]);
    expect(readMessage("Na 128 Na 128").inputs).toEqual({ sodium: 128 });
    expect(codes("urea 10 mmol/L BUN 40")).toEqual(["value.conflict"]);
    expect(codes("urea 10 mmol/L BUN 28")).toEqual([]);
    // Close is not the same: 128 and 129 are two results, and neither is chosen silently.
    expect(readMessage("Na 128 Na 129").inputs).toEqual({});
    expect(codes("Na 128 Na 129")).toEqual(["value.conflict"]);
    expect(readMessage("Na 128 Na 128.0 mmol/L").inputs).toEqual({ sodium: 128 });
    // One value in two units is one value (540 mg/dL is 29.97 mmol/L, within a conversion's rounding).
    expect(readMessage("glu 540 mg/dL glucose 30 mmol/L").inputs.glucose).toBeCloseTo(540 / 18.0156, 6);
    expect(codes("glu 540 mg/dL glucose 31 mmol/L")).toEqual(["value.conflict"]);
  });

  it("reports unknown words, orphan numbers and names without numbers, never by word number", () => {
    expect(readMessage("Na 128 zorp glu 6 mmol/L").problems.at(-1)!.message).toMatch(/after sodium 128/);
    expect(JSON.stringify(readMessage("sodum 128 K 4 blorp").problems)).not.toMatch(/word \d/);
    expect(codes("sodum 128")).toEqual(["number.orphan", "word.unknown"]);
    expect(codes("Na K 4")).toEqual(["value.missing"]);
    expect(codes("")).toEqual([]);
  });
});

describe("properties", () => {
  it("never throws on any string", () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 300 }), (s) => {
        readMessage(s);
      }),
      { numRuns: 2000 },
    );
    fc.assert(
      fc.property(
        fc.array(
          fc.constantFrom(
            "Na",
            "glu",
            "1,200",
            "<",
            "12",
            "mg/dL",
            "#",
            "bed",
            "Mr",
            "@",
            ".",
            "/",
            "3.1",
            ",",
          ),
          { maxLength: 40 },
        ),
        (parts) => {
          readMessage(parts.join(" "));
          readMessage(parts.join(""));
        },
      ),
      { numRuns: 2000 },
    );
  });

  // Linear time is measured by npm run fuzz (its time budget); here, only that it finishes whole.
  it("reads adversarial input of 100,000 characters without failing", () => {
    const attacks = [
      "a".repeat(100_000),
      "1".repeat(100_000),
      "a@".repeat(50_000),
      "Na 1".repeat(25_000),
      "www.".repeat(25_000),
      "1.".repeat(50_000),
      "Mr ".repeat(33_333),
      " ".repeat(100_000),
      "9 ".repeat(50_000),
      "glu,".repeat(25_000),
    ];
    for (const attack of attacks) expect(readMessage(attack).inputs, attack.slice(0, 8)).toBeDefined();
  });

  const panel = fc.record(
    {
      sodium: fc.double({ min: 90, max: 200, noNaN: true }),
      potassium: fc.double({ min: 1, max: 12, noNaN: true }),
      glucose: fc.double({ min: 0.6, max: 160, noNaN: true }),
      urea: fc.double({ min: 0.4, max: 100, noNaN: true }),
      measuredOsmolality: fc.double({ min: 200, max: 450, noNaN: true }),
      // Nobody types a subnormal double: ethanol is 0 or at least 0.001 mmol/L here.
      ethanol: fc.oneof(fc.constant(0), fc.double({ min: 0.001, max: 200, noNaN: true })),
      albumin: fc.double({ min: 5, max: 70, noNaN: true }),
    },
    { requiredKeys: [] },
  );

  it("render typed inputs as text and read them back gives the same inputs", () => {
    fc.assert(
      fc.property(panel, (inputs) => {
        const back = readMessage(renderInputs(inputs as LabInputs));
        expect(back.inputs).toEqual(inputs);
        expect(back.problems).toEqual([]);
      }),
      { numRuns: 500 },
    );
  });

  const identifier = fc.oneof(
    fc.constantFrom(
      "Mr Quennell",
      "Dr Abernathy-Cole",
      "DOB 12/07/1939",
      "3 June 1944",
      "MRN 77410",
      "nhs 401 023 2137",
    ),
    fc.integer({ min: 100000, max: 99999999 }).map((n) => `ref ${n}`),
    fc.integer({ min: 1000, max: 9999 }).map((n) => `555-310-${n}`),
    fc.emailAddress(),
    fc
      .tuple(fc.integer({ min: 1, max: 255 }), fc.integer({ min: 0, max: 255 }))
      .map(([a, b]) => `${a}.${b}.17.${a}`),
    fc.integer({ min: 90, max: 109 }).map((n) => `${n} yo`),
  );

  it("for random panels with identifiers mixed in, no output contains the identifier", () => {
    fc.assert(
      fc.property(panel, identifier, fc.nat(), (inputs, id, where) => {
        const words = renderInputs(inputs as LabInputs).split(" ");
        const at = words.length === 0 ? 0 : (where % (words.length / 3 + 1)) * 3;
        words.splice(at, 0, id);
        const r = readMessage(words.join(" "));
        const out = JSON.stringify(r);
        expect(r.identifiers.length, id).toBeGreaterThan(0);
        for (const part of id.split(" ").filter((p) => p.length >= 4 && !/^(ref|nhs|june)$/i.test(p))) {
          // As a whole word: a digit run may occur inside an unrelated full-precision number.
          const escaped = part.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
          expect(out).not.toMatch(new RegExp(`(?<![\\w.])${escaped}(?![\\w])`));
        }
        expect(r.inputs).toEqual(inputs);
      }),
      { numRuns: 500 },
    );
  });

  it("every input key can be written and read", () => {
    const all = Object.fromEntries(
      INPUT_KEYS.map((k) => [
        k,
        { sodium: 140, measuredOsmolality: 290, albumin: 40, chloride: 100, pH: 7.3, urineOsmolality: 450 }[
          k as string
        ] ?? 5,
      ]),
    ) as LabInputs;
    expect(readMessage(renderInputs(all)).inputs).toEqual(all);
  });
});

describe("what the reader says (each problem's words, as a resident reads them)", () => {
  // Invented messages. Every text below was read and judged right before it was written here;
  // the conditions inside them (one line or several, one name or several) are what is tested.
  const said = (m: string, units?: "si" | "conventional") =>
    readMessage(m, units ? { unitSystem: units } : {}).problems.map(
      (p) => `${p.code}${p.line ? `@${p.line}` : ""}: ${p.message}`,
    );
  const cases: [string, string[], ("si" | "conventional")?][] = [
    [
      "128",
      ["number.orphan: A number with no name before it was not used. Write the name first, like Na 128."],
    ],
    [
      "Na 128\n140\nK 4\n99",
      [
        "number.orphan: 2 lines (2 and 4) have a number with no name before it, so it was not used. Write the name first, like Na 128.",
      ],
    ],
    [
      "Na 128\n140",
      [
        "number.orphan: Line 2 has a number with no name before it, so it was not used. Write the name first, like Na 128.",
      ],
    ],
    [
      "Na 120 blorp",
      [
        "word.unknown: Some words after sodium 120 were not understood and not used. Write values as name, number, unit — like Na 128, glucose 540 mg/dL.",
      ],
    ],
    [
      "blorp Na 120",
      [
        "word.unknown: Some words before the first value were not understood and not used. Write values as name, number, unit — like Na 128, glucose 540 mg/dL.",
      ],
    ],
    [
      "Na 120\nblorp\nK 4 zzz",
      [
        "word.unknown: 2 lines (2 and 3) were not understood (in part or whole) and not used. Write values as name, number, unit — like Na 128, glucose 540 mg/dL.",
      ],
    ],
    [
      "Na 120\nK 4 zzz",
      [
        "word.unknown: Line 2 was not understood (in part or whole) and not used. Write values as name, number, unit — like Na 128, glucose 540 mg/dL.",
      ],
    ],
    [
      "Na 128 131\nK 4.0 4.2",
      [
        "columns.ambiguous: Sodium and potassium have more than one result (sodium 128 and 131), so they were not used: which is the current one? Send one result per name, or paste the header with the collection dates.",
      ],
    ],
    [
      "Na 128 131\nK 4.0",
      [
        "columns.ambiguous: Sodium has more than one result (sodium 128 and 131), so it was not used: which is the current one? Send one result per name, or paste the header with the collection dates.",
        "columns.short: Potassium has one result where other rows have 2, so it is not clear which time it is from: not used.",
      ],
    ],
    [
      "Na (135-145)",
      ["value.onlyRange@1: Sodium: only a reference range was found, no result, so it was not used."],
    ],
    ["Na", ["value.missing@1: Sodium has no number after it, so it was not used."]],
    [
      "urine Na 40 serum",
      [
        "specimen.conflict@1: Sodium 40 is labelled with two specimens (serum/plasma and urine): not used. Say which.",
      ],
    ],
    [
      "Na 1,200",
      [
        "value.ambiguousNumber@1: Sodium 1,200: is the comma a decimal point or a thousands separator? Write it without the comma (e.g. 1200 or 1.2).",
      ],
    ],
    ["glucose 90 mg", ["unit.incomplete@1: Glucose 90: per what volume? Write mg/dL, mg/L or g/L."]],
    ["Na 140 mmol/L mg/dL", ["unit.conflict@1: Sodium 140 has two different units: write one."]],
    [
      "Na 140 mg/dL",
      ["unit.notForAnalyte@1: Sodium 140 mg/dL: sodium is not given in mg/dL. Use mmol/L or mEq/L."],
    ],
    [
      "glu >33.3 mmol/L",
      [
        "value.censored@1: Glucose >33.3 is above the measuring range: it cannot be calculated with. Ask the lab for the diluted value.",
      ],
    ],
    [
      "glu <1 mmol/L",
      ["value.censored@1: Glucose <1 is below the measuring range: it cannot be calculated with."],
    ],
    [
      "Na 400",
      [
        "value.implausible@1: Sodium 400 mmol/L is outside 90–200 mmol/L, so it was not used. Check for a typo.",
      ],
    ],
    [
      "glu 540",
      [
        "unit.ambiguous@1: Glucose 540: no unit — write mg/dL (the only plausible one), or set the channel's units.",
      ],
    ],
    [
      "urea 14",
      [
        "unit.ambiguous@1: Urea 14: no unit — write mmol/L, or mg/dL with urea or BUN named (BUN is urea nitrogen), or set the channel's units.",
      ],
    ],
    [
      "glu 540",
      [
        "unit.ambiguous@1: Glucose 540 has no unit: in mmol/L (this channel's units) it is not plausible, in mg/dL it would be. Write the unit: glucose 540 mg/dL or 540 mmol/L.",
      ],
      "si",
    ],
    [
      "glu 6",
      [
        "unit.ambiguous@1: Glucose 6 has no unit: in mg/dL (this channel's units) it is not plausible, in mmol/L it would be. Write the unit: glucose 6 mmol/L or 6 mg/dL.",
      ],
      "conventional",
    ],
    [
      "Na 128 Na 131",
      [
        "value.conflict: Sodium given more than once with different values (128 mmol/L, 131 mmol/L): none of them was used. Send the one to calculate with.",
      ],
    ],
    [
      // A lab sodium 5 below the blood gas's: the pseudohyponatraemia hint (4 or more apart).
      "Na 128 cNa 133",
      [
        "value.specimenConflict: Sodium given more than once with different values (lab 128 mmol/L, blood gas 133 mmol/L): none of them was used. Send the one to calculate with. A lab (indirect ISE) sodium well below the blood-gas (direct ISE) one can be pseudohyponatraemia from very high lipids or protein.",
      ],
    ],
    [
      "Na 128 cNa 131",
      [
        "value.specimenConflict: Sodium given more than once with different values (lab 128 mmol/L, blood gas 131 mmol/L): none of them was used. Send the one to calculate with.",
      ],
    ],
    ["bed 4 bed 5", ["tag.multiple@1: More than one case tag: one message, one case."]],
    ["calc osm", ["value.missing@1: The calculated osmolality has no number after it."]],
    ["calc osm >300", ["value.censored@1: A claimed calculated osmolality needs a plain number."]],
  ];
  it.each(cases)("%j", (message, expected, units) => {
    expect(said(message, units)).toEqual(expected);
  });

  it("says which column it used, and keeps pH and β-hydroxybutyrate as they are written", () => {
    const notes = (m: string) => readMessage(m).notes;
    expect(notes("Date 01/03 02/03\nNa 128 131\nK 4.0 4.2")).toEqual([
      "Rows with 2 results: the last column was used, the latest by the dates in the header.",
    ]);
    expect(notes("Date 03/03 02/03 01/03\nNa 128 131 135\nK 4.0 4.2 4.4")).toEqual([
      "Rows with 3 results: the first column was used, the latest by the dates in the header.",
    ]);
    expect(notes("Date 01/03 03/03 02/03\nNa 128 131 135\nK 4.0 4.2 4.4")).toEqual([
      "Rows with 3 results: the second column was used, the latest by the dates in the header.",
    ]);
    expect(said("pH 7.4 7.3")[0]).toMatch(
      /^columns\.ambiguous: pH has more than one result \(pH 7\.4 and 7\.3\)/,
    );
    expect(said("BHB 99")).toEqual([
      "unit.ambiguous@1: β-hydroxybutyrate 99: no unit — write mg/dL (the only plausible one), or set the channel's units.",
    ]);
    expect(said("bhb 9999")).toEqual([
      "unit.ambiguous@1: β-hydroxybutyrate 9999: no unit — no unit makes it plausible: check for a typo.",
    ]);
  });

  it("names the unit that would make a value plausible, and long lists of lines end with a count", () => {
    expect(said("BUN 0.5")).toEqual([
      "value.implausible@1: Blood urea nitrogen 0.5 mg/dL is outside 1–300 mg/dL, so it was not used. If it is in mmol/L, write the unit.",
    ]);
    expect(said("urea 10 mmol/L BUN 40")).toEqual([
      "value.conflict: Urea and BUN given more than once with different values (10 mmol/L, 40 mg/dL): none of them was used. Send the one to calculate with.",
    ]);
    expect(said("a1\nb1\nc1\nd1\ne1\nf1\ng1\nh1\ni1\nj1\nNa 140")).toEqual([
      "word.unknown: 10 lines (1, 2, 3, 4, 5, 6, 7, 8 and 2 more) were not understood (in part or whole) and not used. Write values as name, number, unit — like Na 128, glucose 540 mg/dL.",
    ]);
    expect(said("Na 1 Na 2 Na 3 Na 4 Na 5").at(-1)).toBe("value.implausible: …and 2 more like this.");
  });

  it("names specimens, the written unit's limits and pH without a unit", () => {
    expect(said("Urine:\nNa 40\n\nK 4")).toEqual([
      'specimen.unclear@4: Potassium 4 comes after the urine results, past a blank line or a heading: is it urine or blood? Start each part with "Urine:" or "Serum:". Not used.',
    ]);
    expect(said("UNa 40 serum")).toEqual([
      "specimen.conflict@1: Urine sodium 40 is labelled with two specimens (serum/plasma and urine): not used. Say which.",
    ]);
    expect(said("cNa 133 urine")).toEqual([
      "specimen.conflict@1: Sodium 133 is labelled with two specimens (urine and blood gas): not used. Say which.",
    ]);
    expect(said("glu 5000 mg/dL")).toEqual([
      "value.implausible@1: Glucose 5000 mg/dL is outside 10–3000 mg/dL, so it was not used. Check for a typo.",
    ]);
    expect(said("pH 9")).toEqual([
      "value.implausible@1: pH 9 is outside 6.5–8, so it was not used. Check for a typo.",
    ]);
    expect(said("calc osm 290 295")[0]).toMatch(
      /^columns\.ambiguous: Calculated osmolality has more than one result \(calculated osmolality 290 and 295\)/,
    );
    expect(readMessage("urine chloride 100").notUsed).toEqual(["urine chloride"]);
  });

  it("a note said twice is said once", () => {
    expect(readMessage("EtOH <10 mg/dL EtOH <10 mg/dL").notes).toEqual([
      "Ethanol written as below 10 mg/dL counted as 0.",
    ]);
    expect(readMessage("urea 30 mg/dL\nurea 30 mg/dL").notes).toHaveLength(1);
  });

  it("notes say how a value was taken", () => {
    expect(readMessage("urea 300 mg/L").notes).toEqual([
      "urea 300 mg/L read as urea itself, not BUN (urea nitrogen). If you meant BUN, write BUN 300.",
    ]);
    expect(readMessage("urea 0.3 g/L").notes).toEqual([
      "urea 0.3 g/L read as urea itself, not BUN (urea nitrogen). If you meant BUN, write BUN 0.3.",
    ]);
    expect(readMessage("urea 5 mmol/L").notes).toEqual([]);
    expect(readMessage("EtOH <10 mg/dL").notes).toEqual(["Ethanol written as below 10 mg/dL counted as 0."]);
    expect(readMessage("urea 30 mg/dL").notes).toEqual([
      "urea 30 mg/dL read as urea itself, not BUN (urea nitrogen). If you meant BUN, write BUN 30.",
    ]);
    expect(readMessage("osm 290 mOsm/L").notes).toEqual([
      "Osmolality written per litre is read as mOsm/kg, as osmometers report it.",
    ]);
  });

  it("the echo names the specimen, the lab's range for osmolality, conversions and where a unit came from", () => {
    expect(readMessage("osm 290 (275-295)").echo).toBe("measured osm 290 mOsm/kg (lab range 275–295)");
    // Only an osmolality's range, and only a range with both ends, is shown.
    expect(readMessage("osm 290 (<300)").echo).toBe("measured osm 290 mOsm/kg");
    expect(readMessage("Na 140 (135-145)").echo).toBe("Na 140 mmol/L");
    expect(readMessage("osm 290 mOsm/L (275-295)").echo).toBe(
      "measured osm 290 mOsm/L = 290 mOsm/kg (lab range 275–295)",
    );
    expect(readMessage("cNa 133 pH 7.1").echo).toBe("Na 133 mmol/L (blood gas), pH 7.1");
    expect(readMessage("EtOH <10 mg/dL").echo).toBe("EtOH <10 mg/dL = 0 mmol/L");
    expect(readMessage("osm 290 mOsm/L").echo).toBe("measured osm 290 mOsm/L = 290 mOsm/kg");
    expect(readMessage("glu 6", { unitSystem: "si" }).echo).toBe(
      "glucose 6 mmol/L (unit from the channel's setting)",
    );
  });
});

describe("how a paste's parts are read (rows, sections, labels, brackets, tags)", () => {
  // Invented messages: [message, inputs read (canonical units), problem codes].
  const cases: [string, LabInputs, string[]][] = [
    // Case tags: read as the tag, never as values; a bad one is refused, the values still read.
    ["# Na 140", { sodium: 140 }, ["word.unknown"]],
    ["bed 12 Na 140 bed 12", { sodium: 140 }, []],
    ["bed 12!! Na 140", { sodium: 140 }, ["tag.refused"]],
    ["bay abc Na 140", { sodium: 140 }, ["tag.refused"]],
    // What touches an identifier without a space is masked with it: no potassium out of an address.
    ["Na 140 bob@x.org;K5", { sodium: 140 }, ["privacy.identifier"]],
    ["Na 140\nK 4 bob@x.org", { sodium: 140, potassium: 4 }, ["privacy.identifier"]],
    // Sections: a specimen heading holds until the next heading; two specimens in one heading end it.
    ["Urine\nNa 40\nK 35", { urineSodium: 40, urinePotassium: 35 }, []],
    ["Urine\nNa 40\nSerum\nNa 140", { urineSodium: 40, sodium: 140 }, []],
    ["Urine\nNa 40\nSerum Urine\nNa 140", { urineSodium: 40, sodium: 140 }, []],
    // A numbered heading is not a value; a bare number on its own line is an orphan.
    ["1. Electrolytes\nNa 140", { sodium: 140 }, []],
    ["140\nNa 138", { sodium: 138 }, ["number.orphan"]],
    // A list number before the first name is read past; a larger number there is an orphan.
    ["5 Na 140", { sodium: 140 }, []],
    ["150 Na 140", { sodium: 140 }, ["number.orphan"]],
    ["zork Na 140", { sodium: 140 }, ["word.unknown"]],
    // A line label covers the line; an inline "urine" covers its own name only, and asks after it.
    ["Urine: Na 40 K 35", { urineSodium: 40, urinePotassium: 35 }, []],
    ["Urine Na 40 K 35", { urineSodium: 40 }, ["specimen.unclear"]],
    ["UNa 40 K 4", { urineSodium: 40 }, ["specimen.unclear"]],
    ["Na 140 urine Na 40", { sodium: 140, urineSodium: 40 }, []],
    ["urine Na 40 serum Na 140", { sodium: 140, urineSodium: 40 }, []],
    ["spot urine Na 40", { urineSodium: 40 }, []],
    // Bracket groups, nested or not, and "to" in a range.
    ["Na 140 (135 to 145)", { sodium: 140 }, []],
    ["Na 140 ((135-145))", { sodium: 140 }, []],
    ["Na 140 (ref (135-145))", { sodium: 140 }, []],
    ["Na (135-145) 124", { sodium: 124 }, []],
    // A unit after a flag, in brackets after a result, a second unit in brackets for the same value.
    ["glu 9.4 H mmol/L", { glucose: 9.4 }, []],
    ["glu 9.4 (H) mmol/L", { glucose: 9.4 }, []],
    ["glu 9.4 mmol/L (169 mg/dL)", { glucose: 9.4 }, []],
    ["glu 9.4 mmol/L (3.9-5.5 mmol/L)", { glucose: 9.4 }, []],
    ["glu 5 g", {}, ["unit.incomplete"]],
    // Derived values are claims or not used, never inputs.
    ["HCO3 std 24", {}, []],
    ["HCO3 (std) 24 HCO3 22", { bicarbonate: 22 }, []],
    ["urine glucose 5 mmol/L", {}, []],
    // A label later in a line covers what follows it; a specimen word after a name qualifies it.
    ["Na 140 Urine: K 30", { sodium: 140, urinePotassium: 30 }, []],
    ["Na 140 K 4 Urine: Na 40 K 30", { sodium: 140, potassium: 4, urineSodium: 40, urinePotassium: 30 }, []],
    ["Urine: Na 40 Serum: Na 140", { urineSodium: 40, sodium: 140 }, []],
    ["Sodium, urine: 40", { urineSodium: 40 }, []],
    ["Sodium (urine): 40", { urineSodium: 40 }, []],
    ["Na 140 urine", { urineSodium: 140 }, []],
    ["glu 5 mmol/L\nurine", { glucose: 5 }, []],
    // Lines of headings only: units, flags, brackets, two specimens, a numbered title.
    ["mmol/L\nNa 140", { sodium: 140 }, []],
    ["H\nNa 140", { sodium: 140 }, []],
    ["(\nNa 140", { sodium: 140 }, []],
    ["Urine Serum\nNa 140", { sodium: 140 }, []],
    ["100 Electrolytes\nNa 140", { sodium: 140 }, ["number.orphan"]],
    ["Electrolytes blorp\nNa 140", { sodium: 140 }, ["word.unknown"]],
    ["140 150\nNa 138", { sodium: 138 }, ["number.orphan"]],
    ["2 T", {}, ["number.orphan"]],
    ["Na 140 K 4 Cl", { sodium: 140, potassium: 4 }, ["value.missing"]],
    // One value in two units is one result; two values, or one value twice, are two.
    ["Na 140 mmol/L (140 mEq/L)", { sodium: 140 }, []],
    ["glu 9.4 mmol/L (200 mg/dL)", {}, ["columns.ambiguous"]],
    ["glu 9.4 (169)", {}, ["columns.ambiguous"]],
    ["glu 9.4 mmol/L (9.4 mmol/L)", {}, ["columns.ambiguous"]],
    // Columns: a table ends at a blank line; a row before it or after it is its own.
    ["Na 128 131\nK 4.0 4.2\n\nCl 100", { chloride: 100 }, ["columns.ambiguous"]],
    ["Cl 100\nNa 128 131\nK 4.0 4.2", { chloride: 100 }, ["columns.ambiguous"]],
    ["Na 128 131\nK 4.0 4.2 4.4", {}, ["columns.ambiguous"]],
    [
      "Date 01/03 02/03\nNa 128 131\nK 4.0 4.2\n\nCl 100",
      { sodium: 131, potassium: 4.2, chloride: 100 },
      ["privacy.identifier"],
    ],
    ["Date 02/03 01/03\nNa 128 131\nK 4.0 4.2", { sodium: 128, potassium: 4 }, ["privacy.identifier"]],
    [
      "Date 01/03 03/03 02/03\nNa 128 131 135\nK 4.0 4.2 4.4",
      { sodium: 131, potassium: 4.2 },
      ["privacy.identifier"],
    ],
    // A qualifier belongs to its own analyte: "calc" after a sodium is not understood, not a claim.
    ["Na 140 calc", { sodium: 140 }, ["word.unknown"]],
    ["glu 5 mmol/L corrected", { glucose: 5 }, ["word.unknown"]],
    ["K 4 std", { potassium: 4 }, ["word.unknown"]],
    ["Na 140 incl", { sodium: 140 }, ["word.unknown"]],
    ["Sodium, spot urine 40", { urineSodium: 40 }, []],
    ["eGFR 50 (>60)", {}, []],
    ["calc osm 290 295", {}, ["columns.ambiguous"]],
    ["urine chloride 100", {}, []],
    ["UNa 40 serum", {}, ["specimen.conflict"]],
    ["cNa 133 urine", {}, ["specimen.conflict"]],
    ["Na 140 mmol/L (mmol/L)", { sodium: 140 }, []],
    ["glu 9.4 (mmol/L)", { glucose: 9.4 }, []],
    ["K 4 ((3.5-5.1)", { potassium: 4 }, []],
    // A comparator written apart from its number is still a censored value, never the plain number.
    ["EtOH < 10 mg/dL", { ethanol: 0 }, []],
    ["EtOH ≤ 10 mg/dL", { ethanol: 0 }, []],
    ["glu > 33.3 mmol/L", {}, ["value.censored"]],
    ["Na < 100", {}, ["value.censored"]],
    ["Na 128 (> 135)", { sodium: 128 }, []],
    ["Na 128 Ref > 135", { sodium: 128 }, []],
    // A heading that starts with a specimen opens its section, whatever else it says.
    [
      "Urine Studies:\nNa 71\nOsm 480\nK 35",
      { urineSodium: 71, urineOsmolality: 480, urinePotassium: 35 },
      [],
    ],
    ["Urine blorp:\nNa 130\nK 4", { urineSodium: 130, urinePotassium: 4 }, ["word.unknown"]],
    ["URINE - spot\nNa 40", { urineSodium: 40 }, []],
    ["urine and serum\nNa 130", { sodium: 130 }, []],
    // A urine section ends at a blank line or a heading of no specimen after its values: what
    // follows without a specimen of its own could be either, and is asked about.
    ["Urine:\nNa 40\n\nNa 130 K 4", { urineSodium: 40 }, ["specimen.unclear", "specimen.unclear"]],
    ["Urine:\nNa 40\nChemistry\nNa 130", { urineSodium: 40 }, ["specimen.unclear"]],
    ["Urine:\nNa 40\n\nBloods:\nNa 130", { urineSodium: 40, sodium: 130 }, []],
    ["Urine:\nNa 40\nSerum chemistry\nNa 130", { urineSodium: 40, sodium: 130 }, []],
    ["Urine:\n\nNa 40\nK 35", { urineSodium: 40, urinePotassium: 35 }, []],
    ["Serum:\nNa 130\n\nK 4", { sodium: 130, potassium: 4 }, []],
    // "(U)" in a row is urine; "(P)" and "(B)" only say plasma or blood.
    ["Na (U) 130", { urineSodium: 130 }, []],
    ["Na (P) 130", { sodium: 130 }, []],
    // Columns named Low and High (or Min and Max) are each row's reference range, in any order;
    // a low above the high, or a header that names no range, is asked about.
    [
      "Test\tResult\tLow\tHigh\nSodium\t128\t135\t145\nPotassium\t2.9\t3.5\t5.1",
      { sodium: 128, potassium: 2.9 },
      [],
    ],
    ["Test Low High Result\nNa 135 145 128", { sodium: 128 }, []],
    [
      "Analyte Value Min Max Units\nGlucose 9.4 3.9 5.5 mmol/L\nOsm 310 275 295 mOsm/kg",
      { glucose: 9.4, measuredOsmolality: 310 },
      [],
    ],
    ["Test Result Low High\nNa 128 145 135", {}, ["columns.ambiguous"]],
    ["Test Result Previous\nNa 128 131", {}, ["columns.ambiguous"]],
    ["K 2.9 (N: 3.5-5.1)", { potassium: 2.9 }, []],
    // A name with its own alias in brackets is one name.
    ["Ketones (BHB) 4.1 mmol/L", { betaHydroxybutyrate: 4.1 }, []],
    ["Sodium (Na+) 128 mmol/L (135-145)", { sodium: 128 }, []],
    ["Na (K) 4", { potassium: 4 }, ["value.missing"]],
    // "(BG)" after another name is the blood gas; alone or after glucose it is a blood glucose.
    ["Na+ (BG) 131 Na 128", {}, ["value.specimenConflict"]],
    ["K+ (BG) 5.1", { potassium: 5.1 }, []],
    ["glucose (BG) 8.1 mmol/L", { glucose: 8.1 }, []],
    ["BG 8.1 mmol/L", { glucose: 8.1 }, []],
    // Dot leaders of a printed report.
    ["Sodium..........128 mmol/L\nPotassium.......4.1", { sodium: 128, potassium: 4.1 }, []],
    // A unit with a space on one side of its slash.
    ["glucose 90 mg/ dl", { glucose: 90 / 18.0156 }, []],
    ["glucose 90 mg /dl", { glucose: 90 / 18.0156 }, []],
    // The same value from the lab and the blood gas is one value, the lab's.
    ["cNa 133 Na 133", { sodium: 133 }, []],
    // Repeated problems are capped at three of a kind, then counted.
    [
      "Na 1 Na 2 Na 3 Na 4 Na 5",
      {},
      ["value.implausible", "value.implausible", "value.implausible", "value.implausible"],
    ],
  ];
  it.each(cases)("%j", (message, inputs, problems) => {
    const r = readMessage(message);
    expect(Object.keys(r.inputs).sort()).toEqual(Object.keys(inputs).sort());
    for (const [k, v] of Object.entries(inputs)) expect(r.inputs[k as keyof LabInputs]).toBeCloseTo(v, 6);
    expect(r.problems.map((p) => p.code)).toEqual(problems);
  });

  it("tags: the first one kept, the same one twice is one tag", () => {
    expect(readMessage("bed 12 Na 140 bed 12").tag).toBe("bed 12");
    expect(readMessage("#ICU3 Na 140").tag).toBe("ICU3");
    expect(readMessage("bed 12!! Na 140").tag).toBeUndefined();
    expect(checkTag("a-1")).toEqual({ ok: true, tag: "A-1" });
    expect(checkTag("-1").ok).toBe(false);
    expect(checkTag("12345678901").ok).toBe(false);
    expect(checkTag("x12").ok).toBe(true);
  });

  it("an anion gap that names potassium keeps it in its name; a potassium after a gap's value is a potassium", () => {
    const claim = (m: string) =>
      readMessage(m).claims.map((c) => [c.kind, c.value, c.withPotassium === true]);
    expect(claim("AG (K+) 18")).toEqual([["anionGap", 18, true]]);
    expect(claim("Anion gap incl K 20")).toEqual([["anionGap", 20, true]]);
    expect(claim("AnGap,K+ 16")).toEqual([["anionGap", 16, true]]);
    expect(claim("anion gap with K 18")).toEqual([["anionGap", 18, true]]);
    const after = readMessage("anion gap 12 K 4.0");
    expect(after.claims.map((c) => [c.kind, c.value, c.withPotassium === true])).toEqual([
      ["anionGap", 12, false],
    ]);
    expect(after.inputs).toEqual({ potassium: 4 });
    expect(claim("osm calc 290")).toEqual([["calculatedOsmolality", 290, false]]);
    expect(claim("osmolality, calculated 290")).toEqual([["calculatedOsmolality", 290, false]]);
    expect(claim("Na corrected 141")).toEqual([["correctedSodium", 141, false]]);
  });

  it("each value keeps its flag, its lab range, its specimen and where it sits", () => {
    const one = (m: string) => readMessage(m).values[0]!;
    expect(one("Na 124*").flag).toBe("*");
    expect(one("glu 9.4 (H) mmol/L").flag).toBe("H");
    expect(one("EtOH 5 mg/dL (<10)").labRange).toEqual({ high: 10 });
    expect(one("Na 140 ref 135-145").labRange).toEqual({ low: 135, high: 145 });
    expect(one("K 4 ((3.5-5.1)").labRange).toEqual({ low: 3.5, high: 5.1 });
    expect(one("Test Low High Result\nNa 135 145 128")).toMatchObject({
      written: 128,
      labRange: { low: 135, high: 145 },
    });
    expect(readMessage("Test Result Low High\nNa 128 135 145").notes).toEqual([
      "The low and high columns were read as each row's reference range.",
    ]);
    expect(one("Na 124 H (135-145)")).toMatchObject({ flag: "H", labRange: { low: 135, high: 145 } });
    expect(one("EtOH 5 ref <10 mg/dL").labRange).toEqual({ high: 10 });
    expect(one("Na 140").flag).toBeUndefined();
    expect(one("Na (BG) 131").specimen).toBe("bloodGas");
    expect(one("Na 140").labRange).toBeUndefined();
    expect(one("Na 140").below).toBeUndefined();
    expect(one("EtOH <10 mg/dL").below).toBe(true);
    // Offsets on later lines count the lines before them.
    const text = "Na 140\n\nK 4\nglu 5 mmol/L";
    expect(readMessage(text).values.map((v) => text.slice(v.start, v.end))).toEqual([
      "Na 140",
      "K 4",
      "glu 5 mmol/L",
    ]);
    expect(readMessage("Urine\nNa 40\nSerum\nNa 140").values.map((v) => [v.key, v.specimen])).toEqual([
      ["sodium", "serum"],
      ["urineSodium", "urine"],
    ]);
    // In the order of the inputs, whatever the order written.
    expect(readMessage("K 4 Na 140 Cl 100").values.map((v) => v.key)).toEqual([
      "sodium",
      "potassium",
      "chloride",
    ]);
  });

  it("lists what it read but does not use, once", () => {
    expect(readMessage("HCO3 std 24").notUsed).toEqual(["standard bicarbonate"]);
    expect(readMessage("HCO3 std 24").notes).toEqual([
      "Not used in these calculations: standard bicarbonate.",
    ]);
    expect(readMessage("Na 140").notUsed).toEqual([]);
    expect(readMessage("Na 140").notes).toEqual([]);
  });

  it("writes inputs back as a message it reads to the same inputs", () => {
    const inputs: LabInputs = { sodium: 140, urineSodium: 40, urineOsmolality: 500, ethanol: 1e-7 };
    const text = renderInputs(inputs);
    expect(text).toBe("na 140 mmol/L etoh 0.0000001 mmol/L urine osm 500 mOsm/kg urine na 40 mmol/L");
    expect(readMessage(text).inputs).toEqual(inputs);
  });
});
