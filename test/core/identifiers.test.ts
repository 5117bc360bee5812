import { describe, expect, it } from "vitest";
import { findIdentifiers, type IdentifierKind, isValidNhsNumber } from "../../core/identifiers.js";
import { readMessage } from "../../core/reader/index.js";
import { tokenize } from "../../core/tokens.js";

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

describe("what the detector finds, and the tokens it covers", () => {
  // Invented identifiers (HIPAA Safe Harbor kinds, REFERENCES.md §8 [C]). Each row: the text, and
  // every hit as [kind, the tokens it covers]. Lab words stand in for the reader's vocabulary.
  const known = new Set(["na", "glucose", "k", "urea", "osm"]);
  const found = (text: string) => {
    const tokens = tokenize(text);
    return findIdentifiers(tokens, (w) => known.has(w)).map((h) => [
      h.kind,
      tokens
        .slice(h.first, h.last + 1)
        .map((t) => t.text)
        .join(" "),
    ]);
  };
  const cases: [string, [IdentifierKind, string][]][] = [
    // Single tokens.
    ["a@b.c", [["email", "a@b.c"]]],
    ["@b.com", [["email", "@b.com"]]],
    ["a@b", []],
    ["intranet.nhs.uk", [["url", "intranet.nhs.uk"]]],
    ["www.example", [["url", "www.example"]]],
    ["example.com/x", [["url", "example.com/x"]]],
    ["foo.bar", []],
    ["1.2.3.4", [["ip-address", "1.2.3.4"]]],
    ["256.1.1.1", []],
    ["1.2.3", []],
    ["123-45-6789", [["social-security-number", "123-45-6789"]]],
    ["12/03", [["date", "12/03"]]],
    ["12/03/2020", [["date", "12/03/2020"]]],
    ["2020/12/01", [["date", "2020/12/01"]]],
    ["2020-12-01T10:00", [["date", "2020-12-01T10:00"]]],
    ["3-4", []],
    ["13/13", []],
    ["32/01/2020", []],
    ["0/1", []],
    ["+44-161-496-0000", [["phone-number", "+44-161-496-0000"]]],
    ["(0161)-496-0000", [["phone-number", "0161 -496-0000"]]],
    ["+447700900123", [["phone-number", "+447700900123"]]],
    ["95yo", [["age-over-89", "95yo"]]],
    ["92y/o", [["age-over-89", "92y/o"]]],
    ["89yo", []],
    ["9434765919", [["national-health-number", "9434765919"]]],
    ["94347659", [["record-number", "94347659"]]],
    ["123456", [["record-number", "123456"]]],
    ["12345", []],
    ["7.123456", []],
    // Runs of digit groups.
    ["943 476 5919", [["national-health-number", "943 476 5919"]]],
    ["07700 900123", [["phone-number", "07700 900123"]]],
    ["555 123 4567", [["phone-number", "555 123 4567"]]],
    ["12 345 678", []],
    ["1 234 5678", []],
    // Months beside a day or a year.
    ["12 March", [["date", "12 March"]]],
    ["March 12, 1950", [["date", "March 12 1950"]]],
    ["Jan 1950", [["date", "Jan 1950"]]],
    ["jan. 3", [["date", "jan. 3"]]],
    ["12th March 1950", [["date", "12th March 1950"]]],
    ["March", []],
    ["may", []],
    ["Mar 12345", []],
    // Names after an honorific (any word) or a label (capitalised words), up to three.
    ["Mr Smith", [["name", "Mr Smith"]]],
    ["Mrs O'Neil", [["name", "Mrs O'Neil"]]],
    ["mr", []],
    ["Dr Na", []],
    ["pt: John Smith", [["name", "pt John Smith"]]],
    ["pt: john", []],
    ["name: Alice Bo-Peep Smith Jones Extra", [["name", "name Alice Bo-Peep Smith"]]],
    // Labels that introduce a number; "ph" only before a long run of digits.
    ["MRN 4471", [["record-number", "MRN 4471"]]],
    ["DOB 3/4/51", [["date", "DOB 3/4/51"]]],
    ["born 1950", [["date", "born 1950"]]],
    ["NHS 943 476 5919", [["national-health-number", "NHS 943 476 5919"]]],
    ["chi 1234567890", [["national-health-number", "chi 1234567890"]]],
    ["tel 0161 496 0000", [["phone-number", "tel 0161 496 0000"]]],
    ["ph 0161 496", [["phone-number", "ph 0161 496"]]],
    ["pH 7.12", []],
    ["ph 12", []],
    ["ssn 123", [["social-security-number", "ssn 123"]]],
    ["id# 77", [["record-number", "id# 77"]]],
    ["bleep 4432", [["record-number", "bleep 4432"]]],
    ["mrn 1 2 3 4 5 6", [["record-number", "mrn 1 2 3 4"]]],
    // Ages over 89, from 90 to 129, with an age word before or after.
    ["92 yo", [["age-over-89", "92 yo"]]],
    ["aged 93", [["age-over-89", "aged 93"]]],
    ["age 95", [["age-over-89", "age 95"]]],
    ["94 years old", [["age-over-89", "94 years"]]],
    ["89 yo", []],
    ["130 yo", []],
    ["95", []],
    ["95 mmol", []],
    // Lab ranges and values are none of these.
    ["Na 128 (135-145) K 3.5-5.1 glucose 13.55-15.10", []],
  ];
  it.each(cases)("%j", (text, hits) => {
    expect(found(text)).toEqual(hits);
  });

  it("an overlong token is checked only for the plain signs", () => {
    expect(found(`${"x".repeat(300)}@y.com`).map(([k]) => k)).toEqual(["email"]);
    expect(found(`https://${"a".repeat(300)}`).map(([k]) => k)).toEqual(["url"]);
    expect(found(`www.${"a".repeat(300)}`).map(([k]) => k)).toEqual(["url"]);
    expect(found("1".repeat(300)).map(([k]) => k)).toEqual(["record-number"]);
    expect(found("w".repeat(300))).toEqual([]);
  });

  it("NHS check digit: valid and invalid numbers", () => {
    // REFERENCES.md §8 [D]: mod-11 check, weights 10..2; a remainder giving 10 is never valid.
    expect(isValidNhsNumber("4010232137")).toBe(true);
    expect(isValidNhsNumber("0000000000")).toBe(true); // check digit 11 → 0
    expect(isValidNhsNumber("401023213")).toBe(false); // nine digits
    expect(isValidNhsNumber("1000000001")).toBe(true); // 1 × 10 = 10, 11 − 10 = 1
    expect(isValidNhsNumber("1000000010")).toBe(false); // 10 + 2 = 12, 11 − 1 = 10: never valid
    expect(isValidNhsNumber("4010232138")).toBe(false); // wrong check digit
  });
});
