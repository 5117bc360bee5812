import { beforeEach, describe, expect, it } from "vitest";
import { MemoryStore } from "../../adapters/store/memory.js";
import { findExpression } from "../../bot/commands/check.js";
import { loadConfig } from "../../bot/config.js";
import { Conversation } from "../../bot/conversation.js";
import { evaluateExpression } from "../../bot/expression.js";
import type { Store } from "../../bot/store.js";
import { renderText } from "../../bot/text.js";
import { CAUTIONS } from "../../core/cautions.js";

const config = loadConfig({ SOLUTE_SECRET: "test-secret-0123456789" });
let bot: Conversation;
const ask = (text: string, channel = "C1") => bot.handle({ text, channel, platform: "console" });

beforeEach(() => {
  bot = new Conversation(new MemoryStore(), config);
});

describe("calculating", () => {
  it("answers the mission's example with every result, its working and the caution", async () => {
    // Invented scenario. Expected values [D] from REFERENCES.md §1, §3, §4 arithmetic.
    const r = await ask("Na 128 glu 540 mg/dL urea 14 mmol/L osm 310");
    expect(r.kind).toBe("result");
    expect(r.readAs).toBe(
      "Na 128 mmol/L, glucose 540 mg/dL = 29.97 mmol/L, urea 14 mmol/L, measured osm 310 mOsm/kg",
    );
    expect(r.facts.map((f) => [f.label, f.value])).toEqual([
      ["Calculated osmolality", "300.0 mOsm/kg"],
      ["Effective osmolality (tonicity)", "286.0 mOsm/kg"],
      ["Osmolal gap", "10.0 mOsm/kg"],
      ["Sodium corrected for glucose", "135.0 (Katz) · 138.6 (Hillier) mmol/L"],
    ]);
    expect(r.facts[0]!.formula).toBe("2·Na + glucose + urea");
    expect(r.working.join("\n")).toContain("2 × 128 + 29.97 + 14 = 300.0 mOsm/kg");
    expect(r.cautions.at(-1)).toBe(CAUTIONS.general);
    expect(r.shareable).toBe(true);
    expect(r.showWorking).toBe(false);
    const text = renderText(r);
    expect(text).toContain("Read: Na 128, glucose 540 mg/dL, urea 14, osm 310");
    expect(renderText(r, { working: true })).toContain("Read as:");
    expect(renderText(r, { working: true })).toContain(CAUTIONS.general);
  });

  it("shows the working when asked", async () => {
    const r = await ask("Na 128 glu 540 mg/dL urea 14 mmol/L osm 310 working");
    expect(r.showWorking).toBe(true);
    expect(r.problems).toEqual([]);
    expect(renderText(r)).toContain("Working:");
  });

  it("asks about an ambiguous unit instead of guessing", async () => {
    const r = await ask("Na 130 glucose 30");
    expect(r.problems.map((p) => p.code)).toContain("unit.ambiguous");
    expect(r.data!.assessment!.inputs.glucose).toBeUndefined();
  });

  it("refuses an implausible value with a clear message", async () => {
    const r = await ask("Na 1280 glu 5 mmol/L");
    expect(r.problems[0]!.code).toBe("value.implausible");
    expect(r.data!.assessment!.inputs.sodium).toBeUndefined();
  });

  it("says so when there are no lab values", async () => {
    const r = await ask("good evening");
    expect(r.kind).toBe("nothing");
    expect(r.problems.length).toBeGreaterThan(0);
    expect(r.shareable).toBe(false);
  });

  it("answers the numbers of a message with an identifier, warns, and never echoes it", async () => {
    const r = await ask("Mr Thistlewood DOB 02/02/1950 Na 128 glu 6 mmol/L urea 4 mmol/L osm 262");
    expect(r.facts.length).toBeGreaterThan(0);
    expect(r.problems.map((p) => p.code)).toContain("privacy.identifier");
    expect(r.shareable).toBe(false);
    const everything = JSON.stringify(r);
    expect(everything).not.toContain("Thistlewood");
    expect(everything).not.toContain("1950");
  });

  it("refuses a message that is too long", async () => {
    const r = await ask(`Na 128 ${"x".repeat(5000)}`);
    expect(r.problems[0]!.code).toBe("input.tooLong");
  });
});

describe("units", () => {
  it("sets the channel's unit system, per channel", async () => {
    expect((await ask("units si")).headline).toMatch(/SI/);
    expect((await ask("glucose 30 Na 130")).data!.assessment!.inputs.glucose).toBe(30);
    expect((await ask("glucose 30 Na 130", "C2")).problems.map((p) => p.code)).toContain("unit.ambiguous");
    await ask("units conventional");
    expect((await ask("glucose 540 Na 130")).data!.assessment!.inputs.glucose).toBeCloseTo(540 / 18.0156, 6);
    await ask("units none");
    expect((await ask("glucose 540 Na 130")).problems.map((p) => p.code)).toContain("unit.ambiguous");
  });

  it("shows the current setting and refuses an unknown one", async () => {
    expect((await ask("units")).headline).toMatch(/asked about/);
    expect((await ask("units furlongs")).problems[0]!.code).toBe("units.unknown");
  });

  it("calculations still answer when the store fails", async () => {
    const broken = new MemoryStore();
    const fail = async () => {
      throw Object.assign(new Error("down"), { code: "ECONNREFUSED" });
    };
    (broken as unknown as Store).getSettings = fail;
    (broken as unknown as Store).setSettings = fail;
    const b = new Conversation(broken, config);
    const r = await b.handle({
      text: "Na 128 glu 6 mmol/L urea 4 mmol/L",
      channel: "C",
      platform: "console",
    });
    expect(r.facts.length).toBe(3);
    const u = await b.handle({ text: "units si", channel: "C", platform: "console" });
    expect(u.problems[0]!.code).toBe("store.unavailable");
  });
});

describe("checking a colleague's result", () => {
  // Invented panel: Na 128, glucose 540 mg/dL (29.97 mmol/L), urea 14 mmol/L, osm 310.
  const panel = "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310";

  it("a correct claim holds, allowing for rounding", async () => {
    const r = await ask(`check ${panel} calc osm 300`);
    expect(r.kind).toBe("check");
    expect(r.headline).toBe("Check: the calculated osmolality 300 holds");
    expect(r.cautions.at(-1)).toBe(CAUTIONS.general);
  });

  it.each([
    ["calc osm 810", /glucose in mg\/dL added without dividing by 18/],
    ["calc osm 172", /sodium not doubled/],
    ["calc osm 286", /urea left out/],
    ["gap -10", /subtraction reversed/],
    ["eff osm 300", /urea included/],
    ["corrected Na 121", /subtracted instead of added/],
  ])("names the slip behind %s", async (claim, slip) => {
    const r = await ask(`check ${panel} ${claim}`);
    expect(r.headline).toMatch(/^Check: the .* does not hold — /);
    expect(r.interpretation[0]).toMatch(slip);
    expect(r.data!.verdicts![0]!.holds).toBe(false);
  });

  // Published methods Solute itself shows are never "does not hold" (REFERENCES §1, §4).
  it.each([
    ["calc osm 291", /Dorwart–Chalmers/], // 1.86·128 + 29.97 + 14 + 9 = 291.05 [D]
    ["gap 19", /Dorwart–Chalmers/],
    ["corrected Na 138.6", /Hillier/], // 128 + 2.4 × 4.4 = 138.56 [D]
  ])("a published alternative matches: %s", async (claim, method) => {
    const r = await ask(`check ${panel} ${claim}`);
    expect(r.headline).toMatch(/matches/);
    expect(r.interpretation[0]).toMatch(method);
    expect(r.interpretation[0]).toMatch(/Solute's default/);
    expect(r.data!.verdicts![0]).toMatchObject({ holds: true, status: "matchesAlternative" });
  });

  it("BUN vs urea slips", async () => {
    // BUN 28 mg/dL = 10.0 mmol/L urea (REFERENCES.md §6 [D]); adding 28 is the slip.
    const r = await ask("check Na 140 glu 5.5 mmol/L BUN 28 calc osm 313.5");
    expect(r.interpretation[0]).toMatch(/BUN in mg\/dL added without dividing by 2.8/);
    const u = await ask("check Na 140 glu 5.5 mmol/L urea 10 mmol/L calc osm 289");
    expect(u.interpretation[0]).toMatch(/divided by 2.8 as if it were BUN/);
  });

  it("ethanol left out, counted twice, or counted the other published way", async () => {
    // Ethanol 184.3 mg/dL = 40 mmol/L (÷ 4.607, REFERENCES.md §6 [D]).
    const base = "check Na 140 glu 5 mmol/L urea 5 mmol/L EtOH 184.3 mg/dL osm 345";
    expect((await ask(`${base} calc osm 290`)).interpretation[0]).toMatch(/ethanol left out/);
    expect((await ask(`${base} calc osm 330`)).headline).toBe("Check: the calculated osmolality 330 holds");
    expect((await ask(`${base} calc osm 370`)).interpretation[0]).toMatch(/ethanol counted twice/);
    const purssell = await ask(`${base} calc osm 340`);
    expect(purssell.interpretation[0]).toMatch(/matches ethanol counted as mg\/dL ÷ 3\.7/);
  });

  it("potassium counted: the published 2·(Na + K) form matches", async () => {
    const r = await ask("check Na 140 K 4 glu 5 mmol/L urea 5 mmol/L calc osm 298");
    expect(r.interpretation[0]).toMatch(/matches the formula with potassium/);
  });

  it("anion-gap claims are checked without a glucose; K added and a corrected sodium are slips", async () => {
    const k = await ask("check Na 140 Cl 100 HCO3 20 K 4 AG 24");
    expect(k.interpretation[0]).toMatch(/potassium added/);
    const labelled = await ask("check Na 140 Cl 100 HCO3 20 K 4 anion gap K+ 24");
    expect(labelled.headline).toBe("Check: the anion gap 24 holds");
    // Na 128, glucose 540 mg/dL: Katz-corrected 135.04; AG with it 135.04 − 100 − 10 = 25.0 [D].
    const corrected = await ask("check Na 128 glu 540 mg/dL Cl 100 HCO3 10 AG 25");
    expect(corrected.interpretation[0]).toMatch(/glucose-corrected sodium used/);
  });

  it("never 'does not hold' and 'cannot check' for the same claim", async () => {
    const r = await ask("check Na 140 calc osm 290");
    expect(r.headline).toBe("Check: cannot be checked with these values");
    expect(r.interpretation.join()).not.toMatch(/does not hold/);
    expect(r.data!.verdicts![0]!.status).toBe("cannotCheck");
  });

  it("no single slip: says so", async () => {
    const r = await ask(`check ${panel} calc osm 350`);
    expect(r.interpretation[0]).toMatch(/No single common slip/);
  });

  it("checks the colleague's own arithmetic; a wrong written total leads the headline", async () => {
    const r = await ask(`check ${panel} 2*128 + 540 + 14`);
    expect(r.notes[0]).toBe("Arithmetic: 2*128 + 540 + 14 = 810.0.");
    expect(r.interpretation[0]).toMatch(/glucose in mg\/dL added without dividing by 18/);
    const wrong = await ask("check Na 131 glu 22 mmol/L urea 9 mmol/L 2*131 + 22 + 9 = 290");
    // 2 × 131 + 22 + 9 = 293 [D]: the formula is right, the sum is not.
    expect(wrong.headline).toBe("Check: the written total is wrong — 2×131 + 22 + 9 is 293.0, not 290");
    expect(wrong.interpretation[0]).toMatch(/the formula was right, the adding up was not/);
    expect(wrong.data!.verdicts![0]).toMatchObject({ claimed: 290, ours: 293, holds: false });
    const labelled = await ask(`check ${panel} gap 310 - (2×128 + 540÷18 + 14) = 12`);
    expect(labelled.notes[0]).toMatch(/is 10\.0, not 12\.0/);
    expect(labelled.headline).toMatch(/written total is wrong/);
  });

  it("refuses an expression that is not plain arithmetic", async () => {
    const r = await ask(`check ${panel} calc osm 2^1000 + 1`);
    expect(r.problems.map((p) => p.code)).toContain("expression.refused");
  });

  it("says what is missing to check a claim", async () => {
    const r = await ask("check Na 128 calc osm 290");
    expect(r.interpretation[0]).toMatch(/needs Na, glucose and urea/);
    expect((await ask("check Na 128")).problems.map((p) => p.code)).toContain("check.noClaim");
  });

  it("finds the arithmetic in a message", () => {
    expect(findExpression("Na 128 glu 540 mg/dL urea 14 2*128 + 540/18 + 14")?.text).toBe(
      "2*128 + 540/18 + 14",
    );
    expect(findExpression("Na 128 glu 540 mg/dL")).toBeUndefined();
    expect(findExpression("x 1+2 = 3")).toMatchObject({ text: "1+2", claimed: 3 });
  });
});

describe("the expression sandbox", () => {
  it("evaluates plain arithmetic with mathjs", async () => {
    expect(await evaluateExpression("2*128 + 540/18 + 14")).toMatchObject({ ok: true, value: 300 });
    expect(await evaluateExpression("2 × (128 + 4) − 3")).toMatchObject({ ok: true, value: 261 });
  });
  it.each([
    "import({})",
    "createUnit('x')",
    "evaluate('1+1')",
    "parse('1')",
    "f(x) = x",
    "a = 1",
    "2^10000",
    "[1, 2, 3]",
    "ones(1000, 1000)",
    "cos(1)",
    "1e400",
    "9999999 + 1",
    "1/0",
    `${"(".repeat(30)}1${")".repeat(30)}`,
    `${"1+".repeat(150)}1`,
    "'a'",
    "2(128)",
    "(1)(2)",
  ])("refuses %s", async (expr) => {
    expect((await evaluateExpression(expr)).ok).toBe(false);
  });
});

describe("help", () => {
  it("lists the commands with invented examples, privately", async () => {
    const r = await ask("help");
    expect(r.kind).toBe("help");
    expect(r.shareable).toBe(false);
    expect(r.interpretation.join("\n")).toMatch(/check .*units si/s);
  });
});

describe("logs", () => {
  it("carry event kinds and timings, never message text or identifiers", async () => {
    const { setLogSink } = await import("../../bot/log.js");
    const lines: string[] = [];
    setLogSink((l) => lines.push(l));
    try {
      await ask("Mr Quigley MRN 4410923 Na 128 glu 6 mmol/L urea 4 mmol/L", "C-SECRET-CHANNEL");
      await ask("check Na 128 calc osm 1+1");
      await ask("help");
    } finally {
      setLogSink(() => {});
    }
    expect(lines.length).toBe(3);
    // The time and the duration may hold any digits (a timestamp ending in .128Z once failed this
    // test): they are checked for their shape, and the secrets are looked for in the rest.
    const rest = lines.map((line) => {
      const { t, ms, ...other } = JSON.parse(line) as Record<string, unknown>;
      expect(typeof ms).toBe("number");
      expect(t).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z$/);
      return JSON.stringify(other);
    });
    const all = rest.join("\n");
    for (const secret of ["Quigley", "4410923", "128", "C-SECRET-CHANNEL", "glu", "calc"])
      expect(all).not.toContain(secret);
    for (const line of lines)
      expect(Object.keys(JSON.parse(line)).sort()).toEqual([
        "code",
        "count",
        "event",
        "level",
        "ms",
        "platform",
        "t",
      ]);
  });

  it("drops anything that is not a short code", async () => {
    const { log, setLogSink } = await import("../../bot/log.js");
    const lines: string[] = [];
    setLogSink((l) => lines.push(l));
    log("warn", "x", { code: "Na 128 from Mr Quigley" });
    setLogSink(() => {});
    expect(lines[0]).not.toContain("Quigley");
    expect(JSON.parse(lines[0]!).code).toBe("unprintable");
  });
});

describe("configuration", () => {
  it("names the setting that is wrong", () => {
    expect(() => loadConfig({ SOLUTE_LOG_LEVEL: "loud" })).toThrow(/SOLUTE_LOG_LEVEL/);
    expect(() => loadConfig({ SOLUTE_OSMOLALITY_RANGE: "295-275" })).toThrow(/SOLUTE_OSMOLALITY_RANGE/);
    expect(() => loadConfig({ REDIS_URL: "redis://127.0.0.1:6379" })).toThrow(/SOLUTE_SECRET/);
    expect(() => loadConfig({ NODE_ENV: "production" })).toThrow(/SOLUTE_SECRET/);
    expect(loadConfig({ SOLUTE_OSMOLALITY_RANGE: "280-300" }).osmolalityRange).toEqual({
      low: 280,
      high: 300,
    });
  });
});

describe("numbers in the units they were written in", () => {
  it("a critical glucose is headlined in the unit the message used, when the channel sets none", async () => {
    // Invented values; 45 mmol/L × 18.0156 = 811 mg/dL (REFERENCES.md §6 [D]).
    expect((await ask("glu 45 mmol/L Na 128")).headline).toMatch(/^Critical high glucose 45 mmol\/L/);
    expect((await ask("glu 811 mg/dL Na 128")).headline).toMatch(/^Critical high glucose 811 mg\/dL/);
    expect((await ask("urea 12 mmol/L glu 45 mmol/L Na 128")).interpretation.join(" ")).toContain(
      "45 mmol/L (811 mg/dL)",
    );
  });
});
