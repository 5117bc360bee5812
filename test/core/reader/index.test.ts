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
