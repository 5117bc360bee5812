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
