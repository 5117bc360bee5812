import { describe, expect, it } from "vitest";
import { ANALYTE_IDS, ANALYTES, type AnalyteId, type Specimen } from "../../../core/analytes.js";
import { readMessage } from "../../../core/reader/index.js";
import {
  ANALYTE_ALIASES,
  BLOOD_GAS_ALIASES,
  CLAIM_ALIASES,
  type ClaimKind,
  CORRECTED_MARKERS,
  FILLER,
  OTHER_TESTS,
  SPECIMEN_WORDS,
  UNIT_SPELLINGS,
  WITH_POTASSIUM,
} from "../../../core/reader/vocabulary.js";

describe("the vocabulary", () => {
  it("every analyte has a name people type", () => {
    for (const id of ANALYTE_IDS) expect(ANALYTE_ALIASES[id]?.length, id).toBeGreaterThan(0);
  });

  it("no spelling names two analytes, and none is also a claim", () => {
    const owner = new Map<string, string>();
    for (const [id, aliases] of Object.entries(ANALYTE_ALIASES)) {
      for (const a of aliases) {
        expect(owner.get(a), `${a}: ${owner.get(a)} and ${id}`).toBeUndefined();
        owner.set(a, id);
      }
    }
    for (const aliases of Object.values(CLAIM_ALIASES))
      for (const a of aliases) expect(owner.has(a), `${a} is an analyte and a claim`).toBe(false);
  });

  it("spellings are lower case, trimmed", () => {
    const all = [
      ...Object.values(ANALYTE_ALIASES).flat(),
      ...Object.values(BLOOD_GAS_ALIASES).flat(),
      ...Object.values(CLAIM_ALIASES).flat(),
      ...Object.values(SPECIMEN_WORDS).flat(),
    ];
    for (const a of all) expect(a, a).toBe(a.toLowerCase().trim());
  });

  it("urine sodium is never spelt like the serum one", () => {
    expect(ANALYTE_ALIASES.sodium).not.toContain("una");
    expect(ANALYTE_ALIASES.urineSodium).toContain("una");
  });
});

describe("every spelling, read in a message", () => {
  // Each spelling of the vocabulary, written before a value in its analyte's canonical unit (the
  // middle of its typo guard), must read as that analyte and specimen: a spelling dropped from the
  // lists, or moved to another analyte, fails its own row. (This table found two spellings that
  // could never be read as names, "mosm" and "pg", because both are read as units; they are gone.)
  const message = (name: string, id: AnalyteId) => {
    const a = ANALYTES[id];
    const value = Math.round(((a.plausible.min + a.plausible.max) / 2) * 10) / 10;
    return id === "pH" ? `${name} ${value}` : `${name} ${value} ${a.canonicalUnit}`;
  };
  const rows = (aliases: Partial<Record<AnalyteId, readonly string[]>>) =>
    Object.entries(aliases).flatMap(([id, names]) => names!.map((n) => [n, id as AnalyteId] as const));

  it.each(rows(ANALYTE_ALIASES))("%s reads as %s", (name, id) => {
    const reading = readMessage(message(name, id));
    expect(reading.values.map((v) => v.analyte)).toEqual([id]);
    expect(reading.values[0]!.specimen).toBe(id.startsWith("urine") ? "urine" : "serum");
  });

  it.each(rows(BLOOD_GAS_ALIASES))("%s reads as %s on the blood gas", (name, id) => {
    const reading = readMessage(message(name, id));
    expect(reading.values.map((v) => [v.analyte, v.specimen])).toEqual([[id, "bloodGas"]]);
  });

  it.each(
    Object.entries(SPECIMEN_WORDS).flatMap(([s, words]) => words.map((w) => [w, s as Specimen] as const)),
  )("%s before a sodium reads as %s", (word, specimen) => {
    // 60 for urine, 140 for blood: each inside its own typo guard.
    const reading = readMessage(`${word} Na ${specimen === "urine" ? 60 : 140} mmol/L`);
    const key = specimen === "urine" ? "urineSodium" : "sodium";
    expect(reading.values.map((v) => [v.key, v.specimen])).toEqual([[key, specimen]]);
  });

  it.each(
    Object.entries(CLAIM_ALIASES).flatMap(([kind, names]) =>
      names.map((n) => [n, kind as ClaimKind] as const),
    ),
  )("%s is a claim of %s, never an input", (name, kind) => {
    const reading = readMessage(`Na 140 K 4 Cl 100 HCO3 24 glucose 5 mmol/L urea 5 mmol/L ${name} 12`);
    expect(reading.claims.map((c) => c.kind)).toEqual([kind]);
    expect(reading.values.map((v) => v.key).sort()).toEqual(
      ["bicarbonate", "chloride", "glucose", "potassium", "sodium", "urea"].sort(),
    );
  });
});

describe("every unit spelling, every other test, every marker and filler word, read in a message", () => {
  // A value each unit is written with, for an analyte that takes that unit (our own invented values).
  const withUnit: Record<string, string> = {
    "mmol/L": "Na 140",
    "mEq/L": "Na 140",
    "mg/dL": "glucose 90",
    "mg/L": "glucose 900",
    "g/L": "albumin 30",
    "g/dL": "albumin 3",
    "mOsm/kg": "osm 290",
    "mOsm/L": "osm 290",
  };
  it.each(UNIT_SPELLINGS.map(([spelling, unit]) => [spelling, unit] as const))(
    "%s is %s",
    (spelling, unit) => {
      const reading = readMessage(`${withUnit[unit]} ${spelling}`);
      expect(reading.problems).toEqual([]);
      expect(reading.values.map((v) => v.unit)).toEqual([unit]);
    },
  );

  it("mOsm/kg H2O, written apart, reads without a word not understood", () => {
    const reading = readMessage("osm 290 mOsm/kg H2O");
    expect(reading.problems).toEqual([]);
    expect(reading.values.map((v) => [v.key, v.canonical])).toEqual([["measuredOsmolality", 290]]);
  });

  it.each(Object.entries(OTHER_TESTS).flatMap(([group, names]) => names.map((n) => [n, group] as const)))(
    "%s is a test of ours not used (%s), never a word not understood",
    (name, group) => {
      const reading = readMessage(`Na 140 ${name} 5`);
      expect(reading.values.map((v) => v.key)).toEqual(["sodium"]);
      expect(reading.notUsed).toEqual([group]);
      expect(reading.problems.map((p) => p.code)).not.toContain("word.unknown");
    },
  );

  it.each([...CORRECTED_MARKERS])("sodium %s is a corrected sodium, checked, never the sodium", (marker) => {
    const reading = readMessage(`Na 128 glucose 30 mmol/L sodium ${marker} 135`);
    expect(reading.claims.map((c) => c.kind)).toEqual(["correctedSodium"]);
    expect(reading.inputs.sodium).toBe(128);
  });

  it.each([...WITH_POTASSIUM])("anion gap %s counts potassium", (words) => {
    const reading = readMessage(`Na 140 K 4 Cl 100 HCO3 24 anion gap ${words} 20`);
    expect(reading.claims.map((c) => [c.kind, c.withPotassium])).toEqual([["anionGap", true]]);
    expect(reading.inputs.potassium).toBe(4);
  });

  it.each([...FILLER])("%j between two values is read past", (word) => {
    const reading = readMessage(`Na 140 ${word} K 4`);
    expect(reading.values.map((v) => [v.key, v.canonical])).toEqual([
      ["sodium", 140],
      ["potassium", 4],
    ]);
    expect(reading.problems).toEqual([]);
  });
});
