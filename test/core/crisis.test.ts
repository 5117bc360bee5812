import { describe, expect, it } from "vitest";
import { ANALYTES, toCanonical } from "../../core/analytes.js";
import { assess } from "../../core/assess.js";

const codes = (a: ReturnType<typeof assess>) => a.findings.map((f) => f.code);

describe("DKA, HHS and mixed states (Umpierrez et al., Diabetes Care 2024 [C])", () => {
  const dka = {
    sodium: 132,
    chloride: 96,
    bicarbonate: 10,
    glucose: 25,
    urea: 6,
    betaHydroxybutyrate: 5.2,
    pH: 7.15,
  };

  it("DKA met, with its severity (ADA 2009 bands, from memory [M])", () => {
    const f = assess(dka).findings.find((x) => x.code === "dka.met")!;
    expect(f.severity).toBe("danger");
    expect(f.text).toMatch(/moderate/);
  });

  it("a high anion gap with high glucose and low bicarbonate names ketoacidosis first, not a late toxic alcohol", () => {
    const a = assess({ sodium: 130, chloride: 95, bicarbonate: 10, glucose: 45, urea: 7 });
    expect(codes(a)).toContain("dka.undecided");
    expect(a.findings.find((f) => f.code === "dka.undecided")!.text).toMatch(/ketones not given/);
    expect(codes(a)).not.toContain("pattern.lateAlcohol");
  });

  it.each([
    // β-hydroxybutyrate ≥ 3.0; pH < 7.3 and/or bicarbonate < 18; glucose ≥ 11.1 mmol/L (200 mg/dL).
    [{ ...dka, betaHydroxybutyrate: 3.0 }, "dka.met"],
    [{ ...dka, betaHydroxybutyrate: 2.9 }, "dka.notMet"],
    [{ ...dka, pH: 7.3, bicarbonate: 18 }, "dka.notMet"],
    [{ ...dka, pH: 7.29, bicarbonate: 18 }, "dka.met"],
    [{ ...dka, pH: 7.3, bicarbonate: 17.9 }, "dka.met"],
  ] as const)("DKA boundary %#", (inputs, code) => {
    expect(codes(assess(inputs))).toContain(code);
  });

  it("the DKA glucose edge is compared in the unit written", () => {
    const i = { sodium: 135, bicarbonate: 12, pH: 7.2 };
    const at = (value: number, unit: "mg/dL" | "mmol/L") =>
      codes(
        assess(
          { ...i, glucose: toCanonical(ANALYTES.glucose, value, unit) },
          { glucoseWritten: { value, unit } },
        ),
      );
    expect(at(200, "mg/dL")).toContain("dka.undecided");
    expect(at(199, "mg/dL")).not.toContain("dka.undecided");
    expect(at(11.1, "mmol/L")).toContain("dka.undecided");
    expect(at(11.0, "mmol/L")).not.toContain("dka.undecided");
  });

  const hhs = { sodium: 145, glucose: 40, urea: 12, betaHydroxybutyrate: 0.8, pH: 7.38, bicarbonate: 22 };
  it("HHS met: effective > 300 (2·145 + 40 = 330 [D])", () => {
    const f = assess(hhs).findings.find((x) => x.code === "hhs.met")!;
    expect(f.severity).toBe("danger");
    expect(f.text).toMatch(/ADA 2009 \(effective > 320\): met/);
  });

  it("33.3 mmol/L meets the 2024 glucose criterion in SI units, 599 mg/dL does not", () => {
    const i = { sodium: 140, urea: 10, betaHydroxybutyrate: 0.5, pH: 7.4, bicarbonate: 24 };
    const at = (value: number, unit: "mg/dL" | "mmol/L") =>
      codes(
        assess(
          { ...i, glucose: toCanonical(ANALYTES.glucose, value, unit) },
          { glucoseWritten: { value, unit } },
        ),
      );
    expect(at(33.3, "mmol/L")).toContain("hhs.met");
    expect(at(33.2, "mmol/L").join()).not.toMatch(/hhs/);
    expect(at(600, "mg/dL")).toContain("hhs.met");
    expect(at(599, "mg/dL").join()).not.toMatch(/hhs/);
  });

  it("HHS effective and total edges: > 300, > 320 (2024); ADA 2009 > 320; JBDS ≥ 320 without ethanol", () => {
    const i = { glucose: 35, urea: 0, betaHydroxybutyrate: 0.5, pH: 7.4, bicarbonate: 24 };
    // 2·Na + 35: Na 132.5 → 300 (not met), 132.6 → 300.2 (met) [D].
    expect(codes(assess({ ...i, sodium: 132.5 }))).toContain("hhs.notMet");
    expect(codes(assess({ ...i, sodium: 132.6 }))).toContain("hhs.met");
    // Total 320 vs 320.1 by the measured osmolality, effective below 300.
    const low = { ...i, sodium: 125, urea: 10 };
    expect(codes(assess({ ...low, measuredOsmolality: 320 }))).toContain("hhs.notMet");
    expect(codes(assess({ ...low, measuredOsmolality: 320.1 }))).toContain("hhs.met");
    // JBDS: 2·142.5 + 35 + 0 = 320 ≥ 320 → met; ethanol does not count in it.
    const jbds = assess({ ...i, sodium: 142.5, ethanol: 30 }).findings.find((f) => f.code === "hhs.met")!;
    expect(jbds.text).toMatch(/UK JBDS .*: met/);
    expect(assess({ ...i, sodium: 142.4 }).findings.find((f) => f.code === "hhs.met")!.text).toMatch(
      /UK JBDS .*: not met/,
    );
  });

  it("HHS met on a measured osmolality that an unexplained gap inflates: says so", () => {
    // Na 128, glucose 36, urea 10: calculated 302; measured 336, gap 34; effective 292 [D].
    const a = assess({
      sodium: 128,
      glucose: 36,
      urea: 10,
      measuredOsmolality: 336,
      betaHydroxybutyrate: 0.4,
      pH: 7.36,
      bicarbonate: 21,
    });
    expect(a.findings.find((f) => f.code === "hhs.met")!.text).toMatch(/unexplained osmolal gap of 34\.0/);
  });

  it("a mixed DKA and HHS state carries dkaHhs.mixed, never hhs.notMet", () => {
    const a = assess({ ...hhs, betaHydroxybutyrate: 4.5, pH: 7.2, bicarbonate: 12, glucose: 50 });
    expect(codes(a)).toEqual(expect.arrayContaining(["dka.met", "dkaHhs.mixed"]));
    expect(codes(a)).not.toContain("hhs.notMet");
  });

  it("HHS with ketones, pH or bicarbonate not given says DKA is not excluded", () => {
    const f = assess({ sodium: 145, glucose: 40, urea: 12 }).findings.find((x) => x.code === "hhs.met")!;
    expect(f.text).toMatch(/Not given: ketones, pH, bicarbonate/);
  });
});

// What the crisis findings say, beyond their codes: the mutation run found these unguarded [D].
describe("what the crisis findings say", () => {
  const find = (i: Parameters<typeof assess>[0], code: string) =>
    assess(i).findings.find((f) => f.code === code);

  it("DKA not met names what is missing: ketones below 3.0, or no acidosis with its values", () => {
    expect(
      find({ glucose: 20, pH: 7.35, bicarbonate: 22, betaHydroxybutyrate: 1 }, "dka.notMet")!.text,
    ).toContain("β-hydroxybutyrate 1 < 3.0; no acidosis (pH 7.35, bicarbonate 22)");
    expect(find({ glucose: 20, betaHydroxybutyrate: 1 }, "dka.notMet")!.text).toContain(
      "not met: β-hydroxybutyrate 1 < 3.0 (2024",
    );
  });

  it("ketones ≥ 3.0 without pH or bicarbonate leave DKA undecided, and say what is not given", () => {
    expect(find({ glucose: 20, betaHydroxybutyrate: 4 }, "dka.undecided")!.text).toContain(
      "pH and bicarbonate not given",
    );
    expect(find({ glucose: 10, betaHydroxybutyrate: 4 }, "dka.undecided")).toBeUndefined();
  });

  it("DKA met names its severity and its values", () => {
    const f = find({ glucose: 20, pH: 7.28, bicarbonate: 17, betaHydroxybutyrate: 4 }, "dka.met")!;
    expect(f.text).toContain(
      "(mild by pH and bicarbonate): β-hydroxybutyrate 4 ≥ 3.0, pH 7.28, bicarbonate 17",
    );
    expect(f.brief).toBe("DKA (mild): β-hydroxybutyrate 4, pH 7.28, bicarbonate 17 (2024 consensus).");
    // pH 7.2 alone, without a bicarbonate: moderate by pH (7.0 to below 7.25).
    expect(find({ glucose: 20, pH: 7.2, betaHydroxybutyrate: 4 }, "dka.met")!.text).toContain("(moderate");
  });

  it("HHS met says which of ketones, pH and bicarbonate are still to come", () => {
    const f = find({ sodium: 145, glucose: 40, urea: 5 }, "hhs.met")!;
    expect(f.text).toContain("effective 330.0 (> 300: yes), calculated total 335.0 (> 320: yes)");
    expect(f.text).toContain("Not given: ketones, pH, bicarbonate — DKA not excluded");
    expect(f.brief).toContain("Next: ketones, pH, bicarbonate.");
    const partly = find({ sodium: 145, glucose: 40, urea: 5, pH: 7.4 }, "hhs.met")!;
    expect(partly.text).toContain("Not given: ketones, bicarbonate");
    const all = find(
      { sodium: 145, glucose: 40, urea: 5, pH: 7.4, bicarbonate: 22, betaHydroxybutyrate: 0.5 },
      "hhs.met",
    )!;
    expect(all.text).not.toContain("Not given");
  });

  it("a measured total that meets the criterion only through an unexplained gap says so, in full and in brief", () => {
    // Effective 2·133 + 34 = 300 (not above); calculated 305; measured 340: gap 35.
    const f = find({ sodium: 133, glucose: 34, urea: 5, measuredOsmolality: 340 }, "hhs.met")!;
    expect(f.text).toContain("measured total 340.0 (> 320: yes)");
    expect(f.text).toContain("unexplained osmolal gap of 35.0: without it the total is 305.0");
    expect(f.brief).toContain("The total rests on an unexplained gap.");
    // With the effective criterion met, the gap does not decide it: no caveat.
    const g = find({ sodium: 135, glucose: 34, urea: 5, measuredOsmolality: 340 }, "hhs.met")!;
    expect(g.text).not.toContain("unexplained osmolal gap");
    expect(g.brief).not.toContain("unexplained gap");
  });

  it("the ethanol caveat appears only when counting ethanol decides the total, and never claims a gap", () => {
    // Effective 2·133 + 34 = 300; total 2·133 + 34 + 15 = 315 without ethanol, 325 with 10 mmol/L.
    const decided = find({ sodium: 133, glucose: 34, urea: 15, ethanol: 10 }, "hhs.met")!;
    expect(decided.text).toContain("With ethanol counted the calculated total is 325.0, without it 315.0");
    expect(decided.brief).not.toContain("unexplained gap");
    // The effective criterion is met either way: nothing to say about ethanol.
    const either = find({ sodium: 140, glucose: 34, urea: 5, ethanol: 10 }, "hhs.met")!;
    expect(either.text).not.toContain("With ethanol counted");
    expect(either.brief).not.toContain("unexplained gap");
  });

  it("HHS not met names why: ketones ≥ 3.0, or acidosis", () => {
    expect(
      find(
        { sodium: 145, glucose: 40, urea: 5, pH: 7.35, bicarbonate: 20, betaHydroxybutyrate: 4 },
        "hhs.notMet",
      )!.text,
    ).toContain("but HHS criteria are not met: β-hydroxybutyrate 4 ≥ 3.0.");
    expect(
      find(
        { sodium: 145, glucose: 40, urea: 5, pH: 7.2, bicarbonate: 20, betaHydroxybutyrate: 1 },
        "hhs.notMet",
      )!.text,
    ).toContain("but HHS criteria are not met: pH < 7.3 or bicarbonate < 15.");
    expect(find({ sodium: 125, glucose: 34, urea: 5 }, "hhs.notMet")!.text).toContain(
      "without the hyperosmolar criterion of HHS: effective 284.0 (> 300: no), calculated total 289.0 (> 320: no)",
    );
  });

  it("without a glucose there is no crisis reading", () => {
    const codes = assess({ sodium: 145, pH: 7.1, bicarbonate: 10, betaHydroxybutyrate: 5 }).findings.map(
      (f) => f.code,
    );
    expect(codes.filter((c) => /^(dka|hhs|dkaHhs)/.test(c))).toEqual([]);
  });
});

describe("the crisis criteria at their edges, as the texts say them", () => {
  // Invented panels in canonical units. 2024 consensus (Umpierrez et al., Diabetes Care 2024).
  it.each([
    // [urea, gap caveat?]: Na 130, glucose 35: effective 295 (not > 300); measured 321 > 320.
    [16, true], // calculated 311, gap 10: the total rests on the gap
    [16.1, false], // calculated 311.1, gap 9.9
  ] as const)("urea %s: the total rests on an unexplained gap is %s", (urea, caveat) => {
    const a = assess({ sodium: 130, glucose: 35, urea, measuredOsmolality: 321 });
    const hhs = a.findings.find((f) => f.code === "hhs.met")!;
    expect(hhs.text.includes("unexplained osmolal gap")).toBe(caveat);
  });

  it.each([
    // [urea, ethanol, caveat?] with no measured osmolality: total with ethanol against without.
    [10, 15, false], // 305 and 320: neither above 320
    [10, 15.1, true], // 305 and 320.1: ethanol decides
    [25, 5, true], // 320 and 325: ethanol decides
    [25.1, 5, false], // 320.1 and 325.1: both above
  ] as const)("urea %s, ethanol %s: the ethanol caveat is %s", (urea, ethanol, caveat) => {
    const a = assess({ sodium: 130, glucose: 35, urea, ethanol });
    const text = a.findings
      .filter((f) => f.code.startsWith("hhs"))
      .map((f) => f.text)
      .join(" ");
    expect(text.includes("whether the 2024 total counts ethanol is not settled")).toBe(caveat);
  });

  it("HHS met: the short line names what is still to come, and nothing when all are given", () => {
    const none = assess({ sodium: 150, glucose: 40, urea: 5 }).findings.find((f) => f.code === "hhs.met")!;
    expect(none.brief).toContain("Next: ketones, pH, bicarbonate.");
    const all = assess({
      sodium: 150,
      glucose: 40,
      urea: 5,
      betaHydroxybutyrate: 1,
      pH: 7.35,
      bicarbonate: 20,
    });
    const met = all.findings.find((f) => f.code === "hhs.met")!;
    expect(met.brief).not.toContain("Next:");
  });

  it("β-hydroxybutyrate exactly 3.0 is ketosis for DKA", () => {
    // Without pH and bicarbonate: undecided; with no acidosis: not met, and not called below 3.0.
    const alone = assess({ sodium: 140, glucose: 15, urea: 5, betaHydroxybutyrate: 3.0 });
    expect(codes(alone)).toContain("dka.undecided");
    const noAcid = assess({
      sodium: 140,
      glucose: 15,
      urea: 5,
      betaHydroxybutyrate: 3.0,
      pH: 7.4,
      bicarbonate: 24,
    });
    const notMet = noAcid.findings.find((f) => f.code === "dka.notMet")!;
    expect(notMet.text).not.toContain("< 3.0");
    expect(notMet.text).toContain("no acidosis (pH 7.4, bicarbonate 24)");
  });
});
