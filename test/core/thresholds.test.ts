// Every clinical threshold of the engine, tested just below, at and just above its edge, in both unit
// systems where the threshold meets a value that has two (glucose, urea/BUN, ethanol). Each table
// names its source (../shared/REFERENCES.md gives them in full); a value of common practice says so.
//
// Messages go through the reader and the engine, as a colleague's message would. Conventional values
// are written as exact multiples of the molar mass (glucose 18.0156 mg/dL per mmol/L, BUN 2.8014,
// ethanol 4.6069), so that "at the edge" is exactly the edge after conversion; the first test proves
// that it is (a value just beside an edge need not be exact).
import { describe, expect, it } from "vitest";
import { type AssessOptions, assess } from "../../core/assess.js";
import { correctionTrend, planFits, type SodiumPoint } from "../../core/correction.js";
import type { Finding } from "../../core/findings.js";
import { readMessage } from "../../core/reader/index.js";

/** A concentration in mmol/L written in mg/dL: mmol × molar mass ÷ 10, to four places. */
const mg = (mmol: number, perMmol: number) => Number((mmol * perMmol).toFixed(4));
const glucoseMg = (mmol: number) => mg(mmol, 18.0156);
const bunMg = (mmol: number) => mg(mmol, 2.8014);
const ethanolMg = (mmol: number) => mg(mmol, 4.6069);

function findings(message: string, options: AssessOptions = {}): Finding[] {
  const reading = readMessage(message, {});
  expect(reading.problems, message).toEqual([]);
  const glucose = reading.values.find((v) => v.key === "glucose");
  return assess(reading.inputs, {
    ...options,
    ...(glucose && { glucoseWritten: { value: glucose.written, unit: glucose.unit } }),
  }).findings;
}

const has = (code: string) => (f: Finding[]) => f.some((x) => x.code === code);
const says = (code: string, text: string) => (f: Finding[]) =>
  f.some((x) => x.code === code && x.text.includes(text));

interface Edge {
  /** What is compared, and how: "osmolal gap ≥ 10 is raised". */
  rule: string;
  source: string;
  /** The three values written into the message: just below, at, just above the edge. */
  values: [number, number, number];
  message: (x: number) => string;
  holds: (f: Finding[]) => boolean;
  /** Whether `holds` is true below, at and above the edge. */
  expected: [boolean, boolean, boolean];
}

function table(name: string, edges: Edge[]): void {
  describe(name, () => {
    it.each(edges.flatMap((e) => e.values.map((x, k) => ({ e, x, where: ["below", "at", "above"][k]!, k }))))(
      "$e.rule — $where ($x) [$e.source]",
      ({ e, x, k }) => {
        const msg = e.message(x);
        expect(e.holds(findings(msg)), msg).toBe(e.expected[k]);
      },
    );
  });
}

describe("conventional values written for these tables convert exactly", () => {
  it("glucose, BUN and ethanol in mg/dL read back to the intended mmol/L", () => {
    for (const mmol of [5, 20, 34]) {
      const r = readMessage(`glucose ${glucoseMg(mmol)} mg/dL`, {});
      expect(r.inputs.glucose).toBe(mmol);
    }
    for (const mmol of [5, 10, 20]) {
      expect(readMessage(`BUN ${bunMg(mmol)} mg/dL`, {}).inputs.urea).toBe(mmol);
    }
    for (const mmol of [1, 10]) {
      expect(readMessage(`ethanol ${ethanolMg(mmol)} mg/dL`, {}).inputs.ethanol).toBe(mmol);
    }
  });
});

// Normal calculated osmolality 2·140 + 5 + 5 = 290, in each unit system.
const SI = "Na 140 glu 5 mmol/L urea 5 mmol/L";
const CONV = `Na 140 glu ${glucoseMg(5)} mg/dL BUN ${bunMg(5)} mg/dL`;

table("osmolal gap", [
  ...[SI, CONV].map(
    (base): Edge => ({
      rule: `gap ≥ 10 is raised (${base === SI ? "SI" : "conventional"})`,
      source: "common practice; REFERENCES §2",
      values: [299.9, 300, 300.1],
      message: (x) => `${base} osm ${x}`,
      holds: has("gap.raised"),
      expected: [false, true, true],
    }),
  ),
  ...[SI, CONV].map(
    (base): Edge => ({
      rule: `gap < −10 is called an entry or sample error (${base === SI ? "SI" : "conventional"})`,
      source: "common practice",
      values: [279.9, 280, 280.1],
      message: (x) => `${base} osm ${x}`,
      holds: has("gap.negative"),
      expected: [true, false, false],
    }),
  ),
  {
    rule: "a residual gap ≥ 10 after a measured methanol keeps a toxic alcohol possible",
    source: "common practice; REFERENCES §2",
    // Gap 20; the methanol (mmol/L ≈ mOsm/kg) leaves 20 − x.
    values: [9.9, 10, 10.1],
    message: (x) => `${SI} osm 310 methanol ${x} mmol/L`,
    holds: has("toxicAlcohol.possible"),
    expected: [true, true, false],
  },
  ...[
    ["SI", (x: number) => `ethanol ${x} mmol/L`],
    ["conventional", (x: number) => `ethanol ${ethanolMg(x)} mg/dL`],
  ].map(
    ([units, ethanol]): Edge => ({
      rule: `ethanol explains the gap when the gap after it falls below 10 (${units})`,
      source: "common practice; REFERENCES §2",
      // Measured 301: the gap without ethanol is 11; after ethanol x it is 11 − x.
      values: [0.9, 1, 1.1],
      message: (x) => `${SI} osm 301 ${(ethanol as (x: number) => string)(x)}`,
      holds: has("gap.explainedByEthanol"),
      expected: [false, false, true],
    }),
  ),
]);

table("sodium and tonicity", [
  {
    rule: "sodium < 135 is a hyponatraemia",
    source: "common practice",
    values: [134.9, 135, 135.1],
    message: (x) => `Na ${x} glu 5 mmol/L urea 5 mmol/L`,
    holds: (f) => f.some((x) => x.code.startsWith("hyponatraemia.")),
    expected: [true, false, false],
  },
  {
    rule: "sodium > 145 is a hypernatraemia",
    source: "common practice",
    values: [144.9, 145, 145.1],
    message: (x) => `Na ${x} glu 5 mmol/L urea 5 mmol/L`,
    holds: has("hypernatraemia"),
    expected: [false, false, true],
  },
  ...[
    ["SI", "glu 5 mmol/L urea 5 mmol/L"],
    ["conventional", `glu ${glucoseMg(5)} mg/dL BUN ${bunMg(5)} mg/dL`],
  ].map(
    ([units, rest]): Edge => ({
      rule: `measured osmolality below 275 (the default range's low end) makes it hypotonic (${units})`,
      source: "common practice: 275–295 mOsm/kg, the usual teaching range",
      values: [274.9, 275, 275.1],
      message: (x) => `Na 130 ${rest} osm ${x}`,
      holds: has("hyponatraemia.hypotonic"),
      expected: [true, false, false],
    }),
  ),
  {
    rule: "measured osmolality above 295 (the default range's high end) with a high glucose is hypertonic",
    source: "common practice: 275–295 mOsm/kg",
    values: [294.9, 295, 295.1],
    message: (x) => `Na 130 glu 30 mmol/L urea 5 mmol/L osm ${x}`,
    holds: has("hyponatraemia.hypertonic"),
    expected: [false, false, true],
  },
  {
    rule: "a gap up to 2 × the sodium's shortfall + 10 is read as pseudohyponatraemia",
    source: "common practice: water displaced by lipid or protein (REFERENCES §3)",
    // Na 130 (shortfall 10), calculated 264: pseudo while the gap is 10 to 30 (measured 274–294).
    values: [293.9, 294, 294.1],
    message: (x) => `Na 130 glu 2 mmol/L urea 2 mmol/L osm ${x}`,
    holds: has("pseudohyponatraemia.possible"),
    expected: [true, true, false],
  },
  {
    rule: "a gap below 10 is not read as pseudohyponatraemia",
    source: "common practice",
    // Na 130, calculated 267: the gap is 10 at a measured 277 (inside the normal range).
    values: [276.9, 277, 277.1],
    message: (x) => `Na 130 glu 5 mmol/L urea 2 mmol/L osm ${x}`,
    holds: has("pseudohyponatraemia.possible"),
    expected: [false, true, true],
  },
]);

table("critical values", [
  {
    rule: "sodium < 120 is critical",
    source: "common practice (laboratory critical-value lists vary; set locally)",
    values: [119.9, 120, 120.1],
    message: (x) => `Na ${x}`,
    holds: says("critical.value", "sodium"),
    expected: [true, false, false],
  },
  {
    rule: "sodium > 160 is critical",
    source: "common practice",
    values: [159.9, 160, 160.1],
    message: (x) => `Na ${x}`,
    holds: says("critical.value", "sodium"),
    expected: [false, false, true],
  },
  {
    rule: "potassium < 2.5 is critical",
    source: "common practice",
    values: [2.4, 2.5, 2.6],
    message: (x) => `K ${x}`,
    holds: says("critical.value", "potassium"),
    expected: [true, false, false],
  },
  {
    rule: "potassium > 6.5 is critical",
    source: "common practice",
    values: [6.4, 6.5, 6.6],
    message: (x) => `K ${x}`,
    holds: says("critical.value", "potassium"),
    expected: [false, false, true],
  },
  {
    rule: "glucose > 484 mg/dL is critical (conventional)",
    source: "common practice",
    values: [483.9, 484, 484.1],
    message: (x) => `glucose ${x} mg/dL`,
    holds: says("critical.value", "glucose"),
    expected: [false, false, true],
  },
  {
    rule: "glucose > 26.87 mmol/L (484 mg/dL) is critical (SI)",
    source: "common practice",
    // 484 mg/dL is 26.8659… mmol/L, which cannot be written exactly: 26.865 is 483.99 mg/dL.
    values: [26.8, 26.865, 26.87],
    message: (x) => `glucose ${x} mmol/L`,
    holds: says("critical.value", "glucose"),
    expected: [false, false, true],
  },
  {
    rule: "glucose < 46 mg/dL is critical (conventional)",
    source: "common practice",
    values: [45.9, 46, 46.1],
    message: (x) => `glucose ${x} mg/dL`,
    holds: says("critical.value", "glucose"),
    expected: [true, false, false],
  },
]);

// Hyperglycaemic crises, by the 2024 consensus (Umpierrez et al., Diabetes Care 2024;47:1257;
// REFERENCES §6b). Effective osmolality is 2·Na + glucose; the total is 2·Na + glucose + urea.
const hhsCodes = (f: Finding[]) => f.some((x) => x.code === "hhs.met" || x.code === "hhs.notMet");
table("HHS (2024 consensus)", [
  {
    rule: "glucose ≥ 600 mg/dL opens the HHS criteria (conventional, compared as written)",
    source: "Umpierrez 2024",
    values: [599.9, 600, 600.1],
    message: (x) => `Na 140 glucose ${x} mg/dL urea 5 mmol/L`,
    holds: hhsCodes,
    expected: [false, true, true],
  },
  {
    rule: "glucose ≥ 33.3 mmol/L opens the HHS criteria (SI, compared as written)",
    source: "Umpierrez 2024",
    values: [33.2, 33.3, 33.4],
    message: (x) => `Na 140 glucose ${x} mmol/L urea 5 mmol/L`,
    holds: hhsCodes,
    expected: [false, true, true],
  },
  ...[
    ["SI", `glucose 34 mmol/L urea 5 mmol/L`],
    ["conventional", `glucose ${glucoseMg(34)} mg/dL BUN ${bunMg(5)} mg/dL`],
  ].map(
    ([units, rest]): Edge => ({
      rule: `effective osmolality > 300 is hyperosmolar (${units})`,
      source: "Umpierrez 2024",
      // 2·Na + 34: 299.9, 300, 300.1; the total stays below 320.
      values: [132.95, 133, 133.05],
      message: (x) => `Na ${x} ${rest}`,
      holds: has("hhs.met"),
      expected: [false, false, true],
    }),
  ),
  ...[
    ["SI", (u: number) => `glucose 34 mmol/L urea ${u} mmol/L`],
    ["conventional", (u: number) => `glucose ${glucoseMg(34)} mg/dL BUN ${bunMg(u)} mg/dL`],
  ].map(
    ([units, rest]): Edge => ({
      rule: `total osmolality > 320 is hyperosmolar when the effective is not (${units})`,
      source: "Umpierrez 2024",
      // Na 133, glucose 34: effective 300 (not above); total 300 + urea.
      values: [19.9, 20, 20.1],
      message: (x) => `Na 133 ${(rest as (u: number) => string)(x)}`,
      holds: has("hhs.met"),
      expected: [false, false, true],
    }),
  ),
  {
    rule: "a measured total > 320 is hyperosmolar",
    source: "Umpierrez 2024",
    values: [319.9, 320, 320.1],
    message: (x) => `Na 133 glucose 34 mmol/L urea 5 mmol/L osm ${x}`,
    holds: has("hhs.met"),
    expected: [false, false, true],
  },
  {
    rule: "HHS needs pH ≥ 7.3",
    source: "Umpierrez 2024",
    values: [7.29, 7.3, 7.31],
    message: (x) => `Na 145 glucose 40 mmol/L urea 5 mmol/L pH ${x} HCO3 20 BHB 1 mmol/L`,
    holds: has("hhs.met"),
    expected: [false, true, true],
  },
  {
    rule: "HHS needs bicarbonate ≥ 15",
    source: "Umpierrez 2024",
    values: [14.9, 15, 15.1],
    message: (x) => `Na 145 glucose 40 mmol/L urea 5 mmol/L pH 7.35 HCO3 ${x} BHB 1 mmol/L`,
    holds: has("hhs.met"),
    expected: [false, true, true],
  },
  {
    rule: "HHS needs β-hydroxybutyrate below 3.0",
    source: "Umpierrez 2024",
    values: [2.9, 3, 3.1],
    message: (x) => `Na 145 glucose 40 mmol/L urea 5 mmol/L pH 7.35 HCO3 20 BHB ${x} mmol/L`,
    holds: has("hhs.met"),
    expected: [true, false, false],
  },
  {
    rule: "ADA 2009: effective osmolality > 320",
    source: "Kitabchi et al., Diabetes Care 2009 (REFERENCES §6b)",
    // 2·Na + 34: 319.9, 320, 320.1.
    values: [142.95, 143, 143.05],
    message: (x) => `Na ${x} glucose 34 mmol/L urea 5 mmol/L`,
    holds: (f) => f.some((x) => x.text.includes("ADA 2009 (effective > 320): met")),
    expected: [false, false, true],
  },
  ...[
    ["SI", (u: number) => `glucose 34 mmol/L urea ${u} mmol/L`],
    ["conventional", (u: number) => `glucose ${glucoseMg(34)} mg/dL BUN ${bunMg(u)} mg/dL`],
  ].map(
    ([units, rest]): Edge => ({
      rule: `UK JBDS: 2·Na + glucose + urea ≥ 320 (${units})`,
      source: "JBDS-IP 2023 (REFERENCES §6b)",
      values: [19.9, 20, 20.1],
      message: (x) => `Na 133 ${(rest as (u: number) => string)(x)}`,
      holds: (f) => f.some((x) => x.text.includes("no ethanol term): met")),
      expected: [false, true, true],
    }),
  ),
]);

table("DKA (2024 consensus)", [
  {
    rule: "DKA needs β-hydroxybutyrate ≥ 3.0",
    source: "Umpierrez 2024",
    values: [2.9, 3, 3.1],
    message: (x) => `glucose 20 mmol/L pH 7.1 BHB ${x} mmol/L`,
    holds: has("dka.met"),
    expected: [false, true, true],
  },
  {
    rule: "DKA's acidosis: pH < 7.3",
    source: "Umpierrez 2024",
    values: [7.29, 7.3, 7.31],
    message: (x) => `glucose 20 mmol/L pH ${x} BHB 4 mmol/L`,
    holds: has("dka.met"),
    expected: [true, false, false],
  },
  {
    rule: "DKA's acidosis: bicarbonate < 18",
    source: "Umpierrez 2024",
    values: [17.9, 18, 18.1],
    message: (x) => `glucose 20 mmol/L HCO3 ${x} BHB 4 mmol/L`,
    holds: has("dka.met"),
    expected: [true, false, false],
  },
  {
    rule: "glucose ≥ 11.1 mmol/L with acidosis and no ketones leaves DKA undecided (SI)",
    source: "Umpierrez 2024",
    values: [11, 11.1, 11.2],
    message: (x) => `glucose ${x} mmol/L pH 7.1`,
    holds: has("dka.undecided"),
    expected: [false, true, true],
  },
  {
    rule: "glucose ≥ 200 mg/dL with acidosis and no ketones leaves DKA undecided (conventional)",
    source: "Umpierrez 2024",
    values: [199.9, 200, 200.1],
    message: (x) => `glucose ${x} mg/dL pH 7.1`,
    holds: has("dka.undecided"),
    expected: [false, true, true],
  },
  {
    rule: "severe DKA: pH < 7.0",
    source: "ADA 2009 severity bands, kept in 2024 (from memory [M])",
    values: [6.99, 7, 7.01],
    message: (x) => `glucose 20 mmol/L pH ${x} BHB 5 mmol/L`,
    holds: says("dka.met", "(severe"),
    expected: [true, false, false],
  },
  {
    rule: "moderate DKA: pH < 7.25",
    source: "ADA 2009 severity bands (from memory [M])",
    values: [7.24, 7.25, 7.26],
    message: (x) => `glucose 20 mmol/L pH ${x} BHB 5 mmol/L`,
    holds: says("dka.met", "(moderate"),
    expected: [true, false, false],
  },
  {
    rule: "severe DKA: bicarbonate < 10",
    source: "ADA 2009 severity bands (from memory [M])",
    values: [9.9, 10, 10.1],
    message: (x) => `glucose 20 mmol/L HCO3 ${x} BHB 5 mmol/L`,
    holds: says("dka.met", "(severe"),
    expected: [true, false, false],
  },
  {
    rule: "moderate DKA: bicarbonate < 15",
    source: "ADA 2009 severity bands (from memory [M])",
    values: [14.9, 15, 15.1],
    message: (x) => `glucose 20 mmol/L HCO3 ${x} BHB 5 mmol/L`,
    holds: says("dka.met", "(moderate"),
    expected: [true, false, false],
  },
]);

table("anion gap and the urine work-up", [
  {
    rule: "anion gap above the lab's high end (11 by default) is raised",
    source: "Kraut & Madias, CJASN 2007 (from memory [M]); analyser-specific",
    // 140 − (100 + x): 11.1, 11, 10.9.
    values: [28.9, 29, 29.1],
    message: (x) => `Na 140 Cl 100 HCO3 ${x}`,
    holds: has("anionGap.raised"),
    expected: [true, false, false],
  },
  {
    rule: "urine osmolality ≤ 100 is maximally dilute",
    source: "Spasovski 2014 (European guideline; REFERENCES §7)",
    values: [99.9, 100, 100.1],
    message: (x) => `Na 128 glu 5 mmol/L urea 5 mmol/L osm 265 urine osm ${x}`,
    holds: has("urine.dilute"),
    expected: [true, true, false],
  },
  {
    rule: "urine sodium ≤ 30 is low",
    source: "Spasovski 2014 (REFERENCES §7)",
    values: [29.9, 30, 30.1],
    message: (x) => `Na 128 glu 5 mmol/L urea 5 mmol/L osm 265 urine osm 400 urine Na ${x}`,
    holds: has("urine.lowSodium"),
    expected: [true, true, false],
  },
]);

// The correction model (core/correction.ts): windows of 24 h from the first sodium (hour 0).
// Spasovski 2014 (European guideline) for raising: ≤ 10 in the first 24 h, ≤ 8 in each 24 h after;
// 8 at high risk (sodium ≤ 105 among others). Lowering a chronic hypernatraemia: about 10 per day.
/** The verdict: too fast, worsening or within the limits (an open window's note is not a verdict). */
const trendCode = (points: SodiumPoint[], highRisk = false) =>
  correctionTrend(points, { highRisk })!.findings.find((f) => f.code !== "correction.windowOpen")!.code;

describe("correction limits (Spasovski 2014; REFERENCES §8)", () => {
  it.each([
    [129.9, "correction.withinLimits"],
    [130, "correction.withinLimits"],
    [130.1, "correction.tooFast"],
  ])("raising: + 10 in the first 24 h is the limit (120 → %s at hour 24)", (last, code) => {
    expect(
      trendCode([
        { hours: 0, sodium: 120 },
        { hours: 24, sodium: last },
      ]),
    ).toBe(code);
  });

  it.each([
    [23.9, "correction.tooFast"],
    [24, "correction.tooFast"],
    // After hour 24 the first window is judged at its end, on the line between the two values:
    // + 11 × 24 / 26.3 = + 10.04 (too fast); + 11 × 24 / 26.5 = + 9.96 (within) [D].
    [26.3, "correction.tooFast"],
    [26.5, "correction.withinLimits"],
  ])("120 → 131 at hour %s: the first 24 h, measured or read off the line at hour 24", (hours, code) => {
    expect(
      trendCode([
        { hours: 0, sodium: 120 },
        { hours, sodium: 131 },
      ]),
    ).toBe(code);
  });

  it.each([
    [137.9, "correction.withinLimits"],
    [138, "correction.withinLimits"],
    [138.1, "correction.tooFast"],
  ])("raising: + 8 in the second 24 h (130 at hour 24 → %s at 48)", (last, code) => {
    const points = [
      { hours: 0, sodium: 120 },
      { hours: 24, sodium: 130 },
      { hours: 48, sodium: last },
    ];
    expect(trendCode(points)).toBe(code);
  });

  it.each([
    [104.9, "correction.tooFast"],
    [105, "correction.tooFast"],
    [105.1, "correction.withinLimits"],
  ])("a start ≤ 105 is high risk: + 9 in 24 h from %s is too fast", (start, code) => {
    expect(
      trendCode([
        { hours: 0, sodium: start },
        { hours: 24, sodium: start + 9 },
      ]),
    ).toBe(code);
  });

  it.each([
    [7.9, "correction.withinLimits"],
    [8, "correction.withinLimits"],
    [8.1, "correction.tooFast"],
  ])("high risk (said by the caller): + %s in 24 h against a limit of 8", (rise, code) => {
    expect(
      trendCode(
        [
          { hours: 0, sodium: 120 },
          { hours: 24, sodium: 120 + rise },
        ],
        true,
      ),
    ).toBe(code);
  });

  it.each([
    [150.1, "correction.withinLimits"],
    [150, "correction.withinLimits"],
    [149.9, "correction.tooFast"],
  ])("lowering: − 10 in 24 h is the limit (160 → %s)", (last, code) => {
    expect(
      trendCode([
        { hours: 0, sodium: 160 },
        { hours: 24, sodium: last },
      ]),
    ).toBe(code);
  });

  it.each([
    [134.9, "raising"],
    [135, "none"],
    [145, "none"],
    [145.1, "lowering"],
  ])("the direction is set by the first sodium (%s: %s)", (start, direction) => {
    const trend = correctionTrend([
      { hours: 0, sodium: start },
      { hours: 6, sodium: start },
    ])!;
    expect(trend.direction).toBe(direction);
  });

  it.each([
    [11, "sodium"],
    [11.1, "correctedSodium"],
    [11.2, "correctedSodium"],
  ])("a glucose ≥ 11.1 mmol/L (200 mg/dL) judges the corrected sodium (%s: %s)", (glucose, measure) => {
    const trend = correctionTrend([
      { hours: 0, sodium: 125, glucose },
      { hours: 6, sodium: 127, glucose: 8 },
    ])!;
    expect(trend.measure).toBe(measure);
  });

  it.each([
    [9.9, true],
    [10, true],
    [10.1, false],
  ])("a plan fits while the window's change stays ≤ its limit (+ %s planned)", (planned, fits) => {
    expect(planFits(undefined, planned, false, 120).fits).toBe(fits);
  });

  it.each([
    [5.9, true],
    [6, true],
    [6.1, false],
  ])("a plan counts what the window has already changed (+ 4 so far, + %s planned)", (planned, fits) => {
    const trend = correctionTrend([
      { hours: 0, sodium: 120 },
      { hours: 6, sodium: 124 },
    ]);
    expect(planFits(trend, planned, false, 120).fits).toBe(fits);
  });

  it.each([
    [7.9, true],
    [8, true],
    [8.1, false],
  ])("a plan at high risk fits up to + 8 (+ %s planned)", (planned, fits) => {
    expect(planFits(undefined, planned, true, 120).fits).toBe(fits);
  });

  it.each([
    [9.9, true],
    [10, true],
    [10.1, false],
  ])("a plan lowering a hypernatraemia fits up to − 10 (− %s planned)", (planned, fits) => {
    expect(planFits(undefined, -planned, false, 160).fits).toBe(fits);
  });
});
