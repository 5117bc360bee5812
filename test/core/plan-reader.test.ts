import { describe, expect, it } from "vitest";
import { readPlan } from "../../core/plan-reader.js";

/** Checks the plan read (a subset) and the problem codes of one request. */
function expectPlan(text: string, plan: Record<string, unknown>, problems: string[]) {
  const r = readPlan(text);
  expect(r.plan).toMatchObject(plan);
  expect(r.problems.map((p) => p.code)).toEqual(problems);
  // Whatever the plan took is blanked; the sodium is left for the ordinary reader.
  expect(r.rest.replace(/[+\s]+/g, " ").trim()).toMatch(/^Na \d+$/);
}

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
  it.each(cases)("%j", expectPlan);

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

describe("a plan's limits at their edges, and the spellings of each fluid", () => {
  // Every limit accepted at its edge and refused just past it (core/fluids.ts ranges; the infusate,
  // potassium and target limits are our own plausibility bounds).
  const edges: [string, Record<string, unknown>, string[]][] = [
    ["Na 120 fluid Na 1000", { infusate: { sodium: 1000 } }, []],
    ["Na 120 fluid Na 1000.5", {}, ["plan.infusateImplausible"]],
    ["Na 120 fluid Na 77 K 200", { infusate: { potassium: 200 } }, []],
    ["Na 120 fluid Na 77 K 200.5", {}, ["plan.infusateImplausible"]],
    ["Na 120 1 L NS + KCl 200", { addedPotassium: 200 }, []],
    ["Na 120 1 L NS + KCl 200.5", {}, ["plan.potassiumImplausible"]],
    ["Na 160 TBW 0.3", { tbw: 0.3 }, []],
    ["Na 160 TBW 0.29", {}, ["plan.tbwImplausible"]],
    ["Na 160 TBW 250", { tbw: 250 }, []],
    ["Na 160 TBW 250.1", {}, ["plan.tbwImplausible"]],
    ["Na 120 0.5 kg", { weightKg: 0.5 }, []],
    ["Na 120 0.49 kg", {}, ["plan.weightImplausible"]],
    ["Na 120 350 kg", { weightKg: 350 }, []],
    ["Na 120 350.1 kg", {}, ["plan.weightImplausible"]],
    ["Na 120 10 mL", { litres: 0.01 }, []],
    ["Na 120 9 mL", {}, ["plan.volumeImplausible"]],
    ["Na 120 10 L", { litres: 10 }, []],
    ["Na 120 10.1 L", {}, ["plan.volumeImplausible"]],
    ["Na 120 target 0.5", { target: 0.5 }, []],
    ["Na 120 target 0.4", {}, ["plan.targetImplausible"]],
    ["Na 120 target 20", { target: 20 }, []],
    ["Na 120 target 20.5", {}, ["plan.targetImplausible"]],
    // Units whose name starts like another: "lb" and "lbs" are pounds, "l" and "litres" litres.
    ["Na 120 100 lbs", { weightKg: 100 * 0.45359237 }, []],
    ["Na 120 100 kgs", { weightKg: 100 }, []],
    ["Na 120 2 litres", { litres: 2 }, []],
    ["Na 120 500 ML", { litres: 0.5 }, []],
    // Sex and age words: only the whole word decides.
    ["Na 120 female", { sex: "female" }, []],
    ["Na 120 woman", { sex: "female" }, []],
    ["Na 120 male adult", { sex: "male", age: "adult" }, []],
    ["Na 120 girl", { sex: "female", age: "child" }, []],
    ["Na 120 man", { sex: "male" }, []],
    ["Na 120 pediatric", { age: "child" }, []],
    ["Na 120 older", { age: "elderly" }, []],
    ["Na 120 elderly", { age: "elderly" }, []],
    ["Na 120 age: 40", { age: "adult" }, []],
    ["Na 120 age40", { age: "adult" }, []],
    ["Na 120 aged  70", { age: "elderly" }, []],
    // The change wanted, in its longer spellings.
    ["Na 120 3% how  much do I need for +5", { target: 5 }, []],
    ["Na 120 how much 3% to raise  it  by  5", { target: 5 }, []],
    ["Na 120 to  raise 4", { target: 4 }, []],
    ["Na 150 to take it  down by 3", { target: -3 }, []],
    ["Na 150 to bring  it down 3 mmol/L", { target: -3 }, []],
    ["Na 150 to bring down 3", { target: -3 }, []],
    ["Na 120 target + 5", { target: 5 }, []],
    ["Na 120 by 5mmol", { target: 5 }, []],
    ["Na 120 how   much", {}, ["plan.targetMissing"]],
    ["Na 160 freewater", { freeWater: true }, []],
    ["Na 160 free water deficit", { freeWater: true }, []],
    ["Na 160 free waterdeficit", { freeWater: true }, []],
    ["Na 120 high risk", { highRisk: true }, []],
    ["Na 120 highrisk", { highRisk: true }, []],
    ["Na 120 alcohol", { highRisk: true }, []],
    ["Na 120 alcoholuse", { highRisk: true }, []],
    ["Na 120 alcohol  use", { highRisk: true }, []],
    ["Na 120 hypokalaemia", { highRisk: true }, []],
  ];
  it.each(edges)("%j", expectPlan);

  const fluids: [string, string][] = [
    ["0.9%NaCl", "saline-0.9"],
    ["0,9 % saline", "saline-0.9"],
    ["normal saline", "saline-0.9"],
    ["0.9% sodium chloride", "saline-0.9"],
    ["0.45%saline", "saline-0.45"],
    ["0.45 % NaCl", "saline-0.45"],
    // Once read as normal saline (the 0.9 % pattern holds "normal saline").
    ["half-normal saline", "saline-0.45"],
    ["half normal saline", "saline-0.45"],
    ["3 % NaCl", "saline-3"],
    ["3%", "saline-3"],
    ["5 % NaCl", "saline-5"],
    ["5%saline", "saline-5"],
    ["lactated ringer", "lactated-ringers"],
    ["lactated ringers", "lactated-ringers"],
    ["lactated ringer's", "lactated-ringers"],
    ["ringers lactate", "lactated-ringers"],
    ["ringer lactate", "lactated-ringers"],
    ["RL", "lactated-ringers"],
    ["hartmann", "hartmanns"],
    ["hartmanns", "hartmanns"],
    ["balanced", "balanced"],
    ["balanced multielectrolyte solution", "balanced"],
    ["balanced multi-electrolyte", "balanced"],
    ["5 % dextrose", "dextrose-5"],
    ["5%glucose", "dextrose-5"],
    ["dextrose 5%", "dextrose-5"],
    ["dextrose 5 %", "dextrose-5"],
    ["8.4 % bicarb", "bicarbonate-8.4"],
    ["8.4%sodium bicarbonate", "bicarbonate-8.4"],
    ["8,4% NaHCO3", "bicarbonate-8.4"],
  ];
  it.each(fluids)("1 L %s is %s, and every word of it is taken", (fluid, id) => {
    const r = readPlan(`Na 120 1 L ${fluid}`);
    expect(r.plan.infusate?.id).toBe(id);
    expect(r.rest.replace(/[+\s]+/g, " ").trim()).toBe("Na 120");
  });

  it("a word taken becomes a + and spaces of the same length, so the words keep their places", () => {
    const text = "Na 120 70 kg woman 1 L Hartmann's";
    const r = readPlan(text);
    expect(r.rest).toHaveLength(text.length);
    expect(r.rest).toBe("Na 120 +  +  +     + + +         ");
  });

  it("a custom fluid is not overridden by a named fluid later in the message", () => {
    expect(readPlan("Na 120 fluid Na 77 1 L NS").plan.infusate).toMatchObject({ sodium: 77, potassium: 0 });
  });
});
