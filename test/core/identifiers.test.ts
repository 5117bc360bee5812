import { describe, expect, it } from "vitest";
import { readMessage } from "../../core/reader/index.js";

const codes = (m: string, units?: "si" | "conventional") =>
  readMessage(m, units ? { unitSystem: units } : {}).problems.map((p) => p.code);

describe("the privacy guard", () => {
  // REFERENCES.md §8 [C]: HIPAA Safe Harbor identifiers, 45 CFR 164.514(b)(2).
  const messages: [string, string][] = [
    ["Mrs Okonkwo-Baptiste Na 128", "a name"],
    ["pt: Hedda Lindqvist Na 128", "a name"],
    ["DOB 04/11/1948 Na 128", "a date"],
    ["Na 128 taken 2026-11-30", "a date"],
    ["Na 128 on 3 March 1950", "a date"],
    ["MRN 5521 Na 128", "a record number"],
    ["Na 128 ref 88812345", "a record number"],
    ["Na 128 call 555-201-7788", "a phone number"],
    ["Na 128 ring 0161 496 0000", "a phone number"],
    ["Na 128 nhs 943 476 5919", "a national health number"],
    ["Na 128 943 476 5919", "a national health number"],
    ["Na 128 SSN 078-05-1120", "a social security number"],
    ["Na 128 j.doe@example.org", "an email address"],
    ["Na 128 https://intranet.example/p/7", "a web address"],
    ["Na 128 from 10.20.30.40", "an IP address"],
    ["Na 128 94 yo", "an age over 89"],
    ["Na 128 aged 91", "an age over 89"],
  ];
  it.each(messages)("%j → %s, never echoed", (message, label) => {
    const r = readMessage(message);
    expect(r.problems.find((p) => p.code === "privacy.identifier")!.message).toContain(label);
    expect(r.inputs.sodium).toBe(128);
    const out = JSON.stringify(r);
    for (const word of message
      .split(/\s+/)
      .filter((w) => !/^(na|128|on|from|taken|ring|call|ref|nhs|ssn|mrn|dob|pt:?|aged|yo|mrs)$/i.test(w))) {
      expect(out, word).not.toContain(word);
    }
  });

  it("NHS check digit: 943 476 5919 is valid", async () => {
    // REFERENCES.md §8 [D]: mod-11 check, weights 10..2.
    const { isValidNhsNumber } = await import("../../core/identifiers.js");
    expect(isValidNhsNumber("9434765919")).toBe(true);
    expect(isValidNhsNumber("9434765918")).toBe(false);
  });

  it("lab values, times and ratios are not identifiers", () => {
    for (const m of [
      "Na 128 K 4.1 glu 7.2 mmol/L at 03:15",
      "Na 128 130 131",
      "osm 295 BP 120/80",
      "Na 140 age 45",
    ]) {
      expect(codes(m)).not.toContain("privacy.identifier");
    }
  });
});
