import { beforeEach, describe, expect, it } from "vitest";
import { MemoryStore } from "../../adapters/store/memory.js";
import { loadConfig } from "../../bot/config.js";
import { Conversation } from "../../bot/conversation.js";
import { CAUTIONS } from "../../core/cautions.js";
import { readPlan } from "../../core/plan-reader.js";

let now = Date.UTC(2026, 11, 1, 22, 0);
let bot: Conversation;
const ask = (text: string) => bot.handle({ text, channel: "C-plan", platform: "console" });

beforeEach(() => {
  now = Date.UTC(2026, 11, 1, 22, 0);
  bot = new Conversation(
    new MemoryStore(() => now),
    loadConfig({ SOLUTE_SECRET: "solute-secret-0123456789" }),
    () => now,
  );
});

describe("the plan command", () => {
  it("names an unknown word by where it was written", async () => {
    const r = await ask("plan Na 120 70 kg man adult 1 L unicorn juice");
    expect(r.problems.find((p) => p.code === "word.unknown")!.message).toMatch(/after sodium 120/);
  });

  it("answers with TBW, the change per litre and for the volume, the expected sodium and the cautions", async () => {
    const r = await ask("plan Na 118 70 kg woman elderly 500 mL 0.9% NaCl");
    expect(r.kind).toBe("plan");
    expect(r.facts.map((f) => [f.label, f.value])).toEqual([
      ["Total body water", "31.5 L"],
      ["Per litre of 0.9% NaCl", "+1.1 mmol/L"],
      ["For 500 mL", "+0.6 mmol/L"],
      ["Expected sodium after", "about 118.6 mmol/L"],
    ]);
    expect(r.working.join("\n")).toContain("(154 + 0 − 118) ÷ (31.5 + 1) = 1.11 mmol/L");
    expect(r.cautions.join(" ")).toMatch(/exact only for one litre/);
    expect(r.cautions.join(" ")).toMatch(/urine output/);
    expect(r.cautions.at(-1)).toBe(CAUTIONS.general);
  });

  it("leads with the verdict when the plan would correct too fast", async () => {
    // REFERENCES.md §5 [C]: ≤ 10 mmol/L in the first 24 h (Spasovski 2014). Check value [D]: +13.0.
    const r = await ask("plan Na 110 TBW 30 L 1 L 3% NaCl");
    expect(r.headline).toMatch(/^Too fast: 1000 mL of 3% NaCl: \+13\.0 mmol\/L expected/);
    expect(r.interpretation[0]).toMatch(/^Too fast: \+13\.0 mmol\/L would exceed the limit of 10/);
    expect(r.interpretation.join(" ")).toMatch(/about 5 mmol\/L in the first hour/);
  });

  it("uses the high-risk limit when asked, or when Na ≤ 105", async () => {
    // REFERENCES.md §5: 8 mmol/L per 24 h at high risk (Verbalis 2013 — from memory [M]).
    const r = await ask("plan Na 118 TBW 30 L 1 L fluid Na 400 high risk");
    expect(r.interpretation[0]).toMatch(
      /Too fast: \+9\.1 mmol\/L would exceed the limit of 8 in this 24 h window \(high risk\)/,
    );
    const low = await ask("plan Na 104 TBW 30 L 1 L fluid Na 380");
    expect(low.interpretation[0]).toMatch(/high risk: Na ≤ 105/);
  });

  it("counts the correction already logged for the case in the current window", async () => {
    await ask("bed 12 Na 114");
    now += 6 * 3_600_000;
    await ask("bed 12 Na 119");
    const r = await ask("plan bed 12 Na 119 TBW 30 L 1 L 3% NaCl");
    expect(r.interpretation.join(" ")).toMatch(/Logged for bed 12: \+5\.0 mmol\/L so far in hours 0–24/);
    expect(r.interpretation[0]).toMatch(/\+17\.7 mmol\/L \(\+5\.0 already and \+12\.7 planned\)/);
    expect(r.data!.trend!.points.map((p) => p.sodium)).toEqual([114, 119]);
  });

  it("counts a series written in the message, its last sodium being the plan's own", async () => {
    // 110 → 118 in 12 h: +8 already; 500 mL of 0.9% NaCl with TBW 30 L adds about +0.6 [D], within 10.
    const r = await ask("plan Na 110 at 20:00, 118 at 08:00 TBW 30 L 500 mL 0.9% NaCl");
    expect(r.interpretation.join(" ")).toMatch(/In the series written: \+8\.0 mmol\/L so far in hours 0–24/);
    expect(r.data!.trend!.points.map((p) => p.sodium)).toEqual([110, 118]);
    const fast = await ask("plan Na 110 at 20:00, 119 at 08:00 TBW 30 L 1 L 3% NaCl");
    expect(fast.headline).toMatch(/^Too fast/);
  });

  it("counts its own sodium when it is newer than the log", async () => {
    await ask("bed 5 Na 114");
    now += 10 * 3_600_000;
    // No 122 was logged: the plan's own sodium is the latest point (+8 already).
    const r = await ask("plan bed 5 Na 122 TBW 30 L 500 mL 0.9% NaCl");
    expect(r.interpretation.join(" ")).toMatch(/\+8\.0 mmol\/L so far/);
  });

  it("reverse planning: the volume of 3% NaCl for +5, of 5% dextrose to bring it down 4", async () => {
    // REFERENCES.md §5 [D]: Na 110, TBW 30 L, 3% → +13.0 per litre, so +5 needs 0.385 L.
    const up = await ask("plan Na 110 TBW 30 L how much 3% NaCl for +5");
    expect(up.facts.find((f) => f.label === "Volume for +5.0 mmol/L")!.value).toBe("about 385 mL");
    // REFERENCES.md §5 [D]: Na 134, TBW 30 L, 5% dextrose −4.32 per litre, so −4 needs 0.925 L (0.93 rounded).
    const down = await ask("plan Na 134 TBW 30 L how much 5% dextrose to bring it down 4");
    expect(down.facts.find((f) => f.label === "Volume for −4.0 mmol/L")!.value).toBe("about 925 mL");
    const wrong = await ask("plan Na 110 TBW 30 L how much 5% dextrose for +5");
    expect(wrong.problems.map((p) => p.code)).toContain("plan.targetWrongWay");
  });

  it("added potassium in every usual spelling", () => {
    for (const text of [
      "plan Na 120 70 kg man adult 1 L 0.9% NaCl + 20 mmol KCl",
      "plan Na 120 70 kg man adult 1 L NS + 20 KCl",
      "plan Na 120 70 kg man adult 1 L 0.9% NaCl with 20 mmol/L KCl",
      "plan Na 120 70 kg man adult 1 L 0.9% NaCl + KCl 20",
      "plan Na 120 70 kg man adult 1 L 0.9% NaCl KCl 20 mmol",
      "plan Na 120 70 kg man adult 1 L 0.9% NaCl 20 mmol/L KCl added",
    ]) {
      expect(readPlan(text).plan.addedPotassium, text).toBe(20);
    }
  });

  it("gives the free water deficit in hypernatraemia", async () => {
    const r = await ask("plan Na 160 70 kg man adult free water");
    expect(r.headline).toBe("Free water deficit: 6.0 L (Na 160, TBW 42.0 L)");
    expect(r.interpretation.join(" ")).toMatch(/ongoing losses/);
  });

  it.each([
    ["plan Na 120 0.9% NaCl 1 L", "plan.weightMissing"],
    ["plan Na 120 weight 7000 kg man adult 1 L 0.9%", "plan.weightImplausible"],
    ["plan Na 120 weight 70 man adult 1 L 0.9%", "plan.weightUnit"],
    ["plan Na 120 70 kg man adult 1 L unicorn juice", "plan.fluidUnknown"],
    ["plan Na 120 70 kg adult 1 L 0.9%", "plan.sexMissing"],
    ["plan Na 120 70 kg man 1 L 0.9%", "plan.ageMissing"],
    ["plan 70 kg man adult 1 L 0.9%", "plan.sodiumMissing"],
    ["plan Na 1200 70 kg man adult 1 L 0.9%", "value.implausible"],
    ["plan Na 120 70 kg man adult 40 L 0.9%", "plan.volumeImplausible"],
  ])("refuses %s (%s)", async (text, code) => {
    const r = await ask(text);
    expect(r.problems.map((p) => p.code)).toContain(code);
    expect(r.facts).toEqual([]);
  });
});
