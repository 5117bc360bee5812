import { describe, expect, it } from "vitest";
import { ANALYTE_IDS } from "../../core/analytes.js";
import { INPUT_KEYS, LabInputsSchema, validateInputs } from "../../core/inputs.js";
import { readMessage } from "../../core/reader/index.js";

describe("typed inputs", () => {
  it("keeps valid inputs as they are", () => {
    expect(validateInputs({ sodium: 140, glucose: 5.5, urea: 4 })).toEqual({
      inputs: { sodium: 140, glucose: 5.5, urea: 4 },
      issues: [],
    });
  });

  it("refuses an implausible value with one issue, and keeps the rest", () => {
    const { inputs, issues } = validateInputs({ sodium: 1400, urea: 4 });
    expect(inputs).toEqual({ urea: 4 });
    expect(issues.map((i) => i.key)).toEqual(["sodium"]);
  });

  it("refuses what is not a number", () => {
    const { inputs, issues } = validateInputs({ sodium: "140" as unknown as number });
    expect(inputs).toEqual({});
    expect(issues).toHaveLength(1);
  });

  it("an unknown key is a programming error, not a user's", () => {
    expect(() => validateInputs({ sodum: 140 })).toThrow();
  });

  it("every input key is an analyte of the catalogue (BUN feeds urea)", () => {
    for (const key of INPUT_KEYS) expect(ANALYTE_IDS as readonly string[], key).toContain(key);
  });
});

describe("what the reader takes, the schema takes back", () => {
  it("a value at a limit written in another unit passes both (methanol 1000 mg/dL)", () => {
    const r = readMessage("methanol 1000 mg/dL propylene glycol 1000 mg/dL");
    expect(Object.keys(r.inputs).sort()).toEqual(["methanol", "propyleneGlycol"]);
    expect(LabInputsSchema.safeParse(r.inputs).success).toBe(true);
    expect(LabInputsSchema.safeParse({ methanol: 312.2 }).success).toBe(false);
  });
});
