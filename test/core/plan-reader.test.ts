import { describe, expect, it } from "vitest";
import { readPlan } from "../../core/plan-reader.js";

describe("reading a plan", () => {
  it.each([
    [
      "Na 118 70 kg woman elderly 1 L 0.9% NaCl",
      { weightKg: 70, sex: "female", age: "elderly", litres: 1 },
      "saline-0.9",
    ],
    [
      "Na 118 154 lb man adult 500 mL Hartmann's + KCl 20",
      { weightKg: 154 * 0.45359237, sex: "male", age: "adult", litres: 0.5, addedPotassium: 20 },
      "hartmanns",
    ],
    ["Na 110 TBW 30 L 1 L hypertonic saline", { tbw: 30, litres: 1 }, "saline-3"],
    [
      "Na 160 62 kg girl D5W 250 ml",
      { weightKg: 62, sex: "female", age: "child", litres: 0.25 },
      "dextrose-5",
    ],
    [
      "Na 121 80 kg man age 70 1 L LR",
      { weightKg: 80, sex: "male", age: "elderly", litres: 1 },
      "lactated-ringers",
    ],
  ] as const)("%s", (text, expected, fluid) => {
    const r = readPlan(text);
    expect(r.problems).toEqual([]);
    expect(r.plan).toMatchObject(expected);
    expect(r.plan.infusate!.id).toBe(fluid);
    expect(r.rest.replace(/[+\s]+/g, " ").trim()).toMatch(/^Na \d+$/);
  });

  it("a fluid by its contents", () => {
    expect(readPlan("Na 121 fluid Na 77 K 20 1 L").plan.infusate).toMatchObject({
      sodium: 77,
      potassium: 20,
    });
  });
});

describe("every part of a plan, and what is refused", () => {
  // Invented requests: [text, the plan read (a subset), the problem codes]. Fluid compositions are
  // checked in fluids.test.ts; here only which fluid was named.
  const cases: [string, Record<string, unknown>, string[]][] = [
    ["Na 120 1 L 0.45% saline", { infusate: { id: "saline-0.45" }, litres: 1 }, []],
    ["Na 120 1L half normal", { infusate: { id: "saline-0.45" }, litres: 1 }, []],
    ["Na 120 1 L 3% NaCl", { infusate: { id: "saline-3" } }, []],
    ["Na 120 100 mL 5% saline", { infusate: { id: "saline-5" }, litres: 0.1 }, []],
    ["Na 120 1 L ringer's lactate", { infusate: { id: "lactated-ringers" } }, []],
    ["Na 120 1 L balanced crystalloid", { infusate: { id: "balanced" } }, []],
    ["Na 120 1 L 5% dextrose", { infusate: { id: "dextrose-5" } }, []],
    ["Na 120 50 mL 8.4% bicarbonate", { infusate: { id: "bicarbonate-8.4" }, litres: 0.05 }, []],
    ["Na 120 1 L NS", { infusate: { id: "saline-0.9" } }, []],
    // A fluid by its contents, within plausible limits.
    ["Na 120 bag: Na 130 mmol/L, K 5 mmol/L 1 L", { infusate: { sodium: 130, potassium: 5 }, litres: 1 }, []],
    ["Na 120 infusate Na 154", { infusate: { sodium: 154, potassium: 0 } }, []],
    ["Na 120 fluid Na 2000", {}, ["plan.infusateImplausible"]],
    ["Na 120 fluid Na 77 K 300", {}, ["plan.infusateImplausible"]],
    // Added potassium in its usual spellings.
    ["Na 120 1 L NS + 40 KCl", { addedPotassium: 40 }, []],
    ["Na 120 1 L NS with 20 mmol/L KCl", { addedPotassium: 20 }, []],
    ["Na 120 1 L NS 20 mmol KCl added", { addedPotassium: 20 }, []],
    ["Na 120 1 L NS KCl 20 mmol", { addedPotassium: 20 }, []],
    ["Na 120 1 L NS add potassium 20", { addedPotassium: 20 }, []],
    ["Na 120 1 L NS + KCl 300", {}, ["plan.potassiumImplausible"]],
    // Body water, weight, volume: each refused outside its range (core/fluids.ts).
    ["Na 160 tbw: 34 litres free water deficit", { tbw: 34, freeWater: true }, []],
    ["Na 160 TBW 500", {}, ["plan.tbwImplausible"]],
    ["Na 120 wt 70 kg", { weightKg: 70 }, []],
    ["Na 120 weight 70", {}, ["plan.weightUnit"]],
    ["Na 120 1000 kg", {}, ["plan.weightImplausible"]],
    ["Na 120 0.4 kg", {}, ["plan.weightImplausible"]],
    ["Na 120 1,5 L", { litres: 1.5 }, []],
    ["Na 120 20 L", {}, ["plan.volumeImplausible"]],
    ["Na 120 5 mL", {}, ["plan.volumeImplausible"]],
    // Sex and age band; years at 18 and 65 are the bands' edges (common practice).
    ["Na 120 boy", { sex: "male", age: "child" }, []],
    ["Na 120 man child", { sex: "male", age: "child" }, []],
    ["Na 120 paediatric", { age: "child" }, []],
    ["Na 120 older adult", { age: "elderly" }, []],
    ["Na 120 age 17", { age: "child" }, []],
    ["Na 120 age 18", { age: "adult" }, []],
    ["Na 120 age 64", { age: "adult" }, []],
    ["Na 120 aged 65", { age: "elderly" }, []],
    ["Na 120 age 30 elderly", { age: "elderly" }, []],
    // The change wanted: its direction from the words or the sign, never a guess when they disagree.
    ["Na 120 how much 3% for +5", { target: 5, infusate: { id: "saline-3" } }, []],
    ["Na 120 to raise it by 6", { target: 6 }, []],
    ["Na 150 to bring it down 4", { target: -4 }, []],
    ["Na 150 to bring it up 4", { target: 4 }, []],
    ["Na 150 to lower it by 5", { target: -5 }, []],
    ["Na 150 to reduce it by 5", { target: -5 }, []],
    ["Na 150 to decrease it 3", { target: -3 }, []],
    ["Na 150 target -3", { target: -3 }, []],
    ["Na 150 target −3", { target: -3 }, []],
    ["Na 120 to lower it by +4", {}, ["plan.targetUnclear"]],
    ["Na 120 to raise it by -4", {}, ["plan.targetUnclear"]],
    ["Na 120 how much 3%", {}, ["plan.targetMissing"]],
    ["Na 120 target +25", {}, ["plan.targetImplausible"]],
    ["Na 120 target 0.2", {}, ["plan.targetImplausible"]],
    // Risk of osmotic demyelination: any of these words makes the limits the high-risk ones.
    ["Na 120 alcohol use malnourished", { highRisk: true }, []],
    ["Na 120 cirrhosis", { highRisk: true }, []],
    ["Na 120 hypokalemia", { highRisk: true }, []],
    ["Na 120 high-risk", { highRisk: true }, []],
    ["Na 120 liver disease", { highRisk: true }, []],
    ["Na 120 malnutrition", { highRisk: true }, []],
    ["Na 120 1 L NS", { highRisk: false, freeWater: false }, []],
  ];
  it.each(cases)("%j", (text, plan, problems) => {
    const r = readPlan(text);
    expect(r.plan).toMatchObject(plan);
    expect(r.problems.map((p) => p.code)).toEqual(problems);
    // Whatever the plan took is blanked; the sodium is left for the ordinary reader.
    expect(r.rest.replace(/[+\s]+/g, " ").trim()).toMatch(/^Na \d+$/);
  });

  it("a refused value is not kept, and the problem says the limits", () => {
    const r = readPlan("Na 120 1000 kg 20 L TBW 500 fluid Na 2000");
    expect(r.plan.weightKg).toBeUndefined();
    expect(r.plan.litres).toBeUndefined();
    expect(r.plan.tbw).toBeUndefined();
    expect(r.plan.infusate).toBeUndefined();
    expect(r.problems.map((p) => p.message)).toEqual([
      "That fluid's sodium or potassium is not plausible (Na up to 1000, K up to 200 mmol/L).",
      "Total body water 500 L is not plausible (0.3–250 L).",
      "A weight of 1000 kg is not plausible (0.5–350 kg): not used. Check for a typo.",
      "A volume of 20 L is outside 10 mL–10 L: not used.",
    ]);
    expect(readPlan("Na 120 fluid Na 77 1 L").plan.infusate!.name).toBe("a fluid with Na 77 mmol/L");
    expect(readPlan("Na 120 fluid Na 77 K 20").plan.infusate!.name).toBe(
      "a fluid with Na 77 and K 20 mmol/L",
    );
  });
});
