import { beforeEach, describe, expect, it } from "vitest";
import { MemoryStore } from "../../adapters/store/memory.js";
import { loadConfig } from "../../bot/config.js";
import { Conversation } from "../../bot/conversation.js";
import { ago, sodiumTrend } from "../../bot/shift.js";
import type { ShiftRecord, Store } from "../../bot/store.js";
import { CAUTIONS } from "../../core/cautions.js";

const HOUR = 3_600_000;
let now = Date.UTC(2026, 11, 1, 21, 0);
let store: MemoryStore;
let bot: Conversation;
const ask = (text: string, channel = "C-night") => bot.handle({ text, channel, platform: "console" });

beforeEach(() => {
  now = Date.UTC(2026, 11, 1, 21, 0);
  store = new MemoryStore(() => now);
  bot = new Conversation(
    store,
    loadConfig({ SOLUTE_SECRET: "solute-secret-0123456789", SOLUTE_SHIFT_HOURS: "16" }),
    () => now,
  );
});

describe("a night of tagged calculations", () => {
  it("logs tagged calculations only, and hands over per tag with flags and trends", async () => {
    // Invented night: bed 12 hyponatraemia corrected overnight, bay 4B a raised gap, untagged noise.
    expect((await ask("bed 12 Na 118 K 3.2 glu 6 mmol/L urea 3 mmol/L osm 248")).notes).toContain(
      "Logged for the handover under bed 12.",
    );
    now += 3 * HOUR;
    await ask("bay 4B Na 139 glu 6.1 mmol/L urea 5.2 mmol/L osm 318");
    await ask("Na 140 glu 5 mmol/L urea 5 mmol/L");
    now += 3 * HOUR;
    await ask("bed 12 Na 124");
    now += 2 * HOUR;
    await ask("bed 12 Na 127");

    const h = await ask("handover");
    expect(h.kind).toBe("handover");
    expect(h.shareable).toBe(true);
    expect(h.headline).toBe("Handover: 2 cases, 4 calculations in the last 16 h");
    expect(h.facts.map((f) => f.label)).toEqual([
      "bay 4B (1, latest 5 h ago)",
      "bed 12 (3, latest just now)",
    ]);
    expect(h.facts[0]!.value).toMatch(/gap 28\.7/);
    const text = h.interpretation.join("\n");
    expect(text).toMatch(/bay 4B: toxic alcohol possible; raised osmolal gap/);
    expect(text).toMatch(/bed 12: critical low sodium; hypotonic hyponatraemia/);
    expect(text).toMatch(/bed 12: Na 118 → 124 → 127 .*\+9\.0 mmol\/L over 8\.0 h/);
    // REFERENCES.md §5: high-risk limit 8 mmol/L per 24 h (Verbalis 2013, from memory [M]).
    expect(text).toMatch(/above the 8 mmol\/L limit for patients at high risk/);
    expect(h.cautions.at(-1)).toBe(CAUTIONS.general);
  });

  it("trend for one tag: the change, its rate, and the limits", async () => {
    await ask("bed 7 Na 112");
    now += 6 * HOUR;
    await ask("bed 7 Na 120");
    now += 4 * HOUR;
    await ask("bed 7 Na 124");
    const t = await ask("trend bed 7");
    expect(t.headline).toBe("Sodium trend for bed 7: +12.0 mmol/L over 10.0 h");
    expect(t.facts.map((f) => f.value)).toEqual(["Na 112 mmol/L", "Na 120 mmol/L", "Na 124 mmol/L"]);
    // REFERENCES.md §5 [C]: European guideline (Spasovski 2014) ≤ 10 mmol/L in the first 24 h.
    expect(t.interpretation.join(" ")).toMatch(/above the 10 mmol\/L limit for the first 24 h/);
    expect(t.cautions.at(-1)).toBe(CAUTIONS.general);
  });

  it("a rate that would exceed the limit by 24 h is flagged early", async () => {
    await ask("#3A Na 120");
    now += 2 * HOUR;
    await ask("#3A Na 122");
    const t = await ask("trend #3A");
    expect(t.interpretation.join(" ")).toMatch(
      /24 h would bring \+24\.0 mmol\/L: above the 8 mmol\/L high-risk limit and the 10 mmol\/L standard limit/,
    );
  });

  it("a slow correction is within the limits", async () => {
    await ask("bed 1 Na 121");
    now += 12 * HOUR;
    await ask("bed 1 Na 124");
    expect((await ask("trend bed 1")).interpretation.join(" ")).toMatch(/Within the correction limits/);
  });

  it("asks which tag, refuses one that could be a name, and says when there is too little", async () => {
    expect((await ask("trend")).problems[0]!.code).toBe("trend.noTag");
    expect((await ask("trend smith")).problems[0]!.message).toMatch(/could be a name/);
    await ask("bed 5 Na 130");
    expect((await ask("trend bed 5")).headline).toMatch(/fewer than two sodiums/);
  });

  it("forget clears the channel's log at once, and only that channel's", async () => {
    await ask("bed 12 Na 118");
    await ask("bed 3 Na 150", "C-other");
    expect((await ask("forget")).headline).toBe(
      "Shift log cleared: 1 record removed from this channel's log.",
    );
    expect((await ask("handover")).headline).toMatch(/nothing logged/);
    expect((await ask("handover", "C-other")).headline).toMatch(/1 case/);
  });

  it("records expire after the shift", async () => {
    await ask("bed 12 Na 118");
    now += 17 * HOUR;
    expect((await ask("handover")).headline).toMatch(/nothing logged/);
  });

  it("the handover says when the log is unavailable; calculations still answer", async () => {
    const fail = async () => {
      throw Object.assign(new Error("down"), { code: "ECONNREFUSED" });
    };
    for (const m of ["addRecord", "listRecords", "forget"] as const)
      (store as unknown as Record<keyof Store, unknown>)[m] = fail;
    const calc = await ask("bed 12 Na 118 glu 6 mmol/L urea 3 mmol/L");
    expect(calc.facts.length).toBeGreaterThan(0);
    expect(calc.notes.join()).toMatch(/not logged/);
    expect((await ask("handover")).problems[0]!.code).toBe("store.unavailable");
    expect((await ask("trend bed 12")).problems[0]!.code).toBe("store.unavailable");
    expect((await ask("forget")).problems[0]!.code).toBe("store.unavailable");
  });

  it("keeps only numbers, the tag and the time — no text, no identifiers", async () => {
    await ask("bed 12 Mr Featherstonehaugh MRN 5512345 Na 118 glu 6 mmol/L urea 3 mmol/L osm 250");
    const [r] = await store.listRecords(
      [...(store as unknown as { records: Map<string, unknown> }).records.keys()][0]!,
      now,
    );
    expect(Object.keys(r!).sort()).toEqual(["at", "channel", "flags", "inputs", "results", "tag"]);
    const all = JSON.stringify(r);
    for (const s of ["Featherstonehaugh", "5512345", "C-night", "Na 118"]) expect(all).not.toContain(s);
  });
});

describe("rate limits", () => {
  it("limits messages per channel per minute, through the store", async () => {
    const limited = new Conversation(
      store,
      loadConfig({ SOLUTE_SECRET: "solute-secret-0123456789", SOLUTE_RATE_LIMIT: "3" }),
      () => now,
    );
    const codes: string[] = [];
    for (let i = 0; i < 4; i++)
      codes.push(
        (await limited.handle({ text: "Na 140", channel: "C", platform: "console" })).problems[0]?.code ??
          "ok",
      );
    expect(codes.at(-1)).toBe("rate.limited");
    expect(
      (await limited.handle({ text: "Na 140", channel: "C2", platform: "console" })).problems[0]?.code,
    ).not.toBe("rate.limited");
  });
});

describe("helpers", () => {
  it("relative times", () => {
    expect(ago(0)).toBe("just now");
    expect(ago(5 * 60_000)).toBe("5 min ago");
    expect(ago(3 * HOUR + 20 * 60_000)).toBe("3 h 20 min ago");
  });
  it("no rate from two sodiums minutes apart", () => {
    const r = (min: number, na: number): ShiftRecord => ({
      channel: "c",
      tag: "t",
      at: min * 60_000,
      inputs: { sodium: na },
      results: {},
      flags: [],
    });
    const t = sodiumTrend([r(0, 118), r(5, 124)])!;
    expect(t.perHour).toBeUndefined();
    expect(t.warnings).toEqual([]);
  });
  it("the trend baseline is the last value at least 24 h before the latest", () => {
    const r = (h: number, na: number): ShiftRecord => ({
      channel: "c",
      tag: "t",
      at: h * HOUR,
      inputs: { sodium: na },
      results: {},
      flags: [],
    });
    const t = sodiumTrend([r(0, 110), r(2, 114), r(27, 121)])!;
    expect(t.change).toBe(7);
    expect(t.spanMs).toBe(25 * HOUR);
  });
});
