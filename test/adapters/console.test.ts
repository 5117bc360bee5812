import { describe, expect, it } from "vitest";
import type { JsonReply } from "../../bot/json.js";
import { CAUTIONS, SHORT_CAUTIONS } from "../../core/cautions.js";
import { cleanEnv, run, solute } from "../helpers/spawn.js";

describe("the one-shot command", { timeout: 60_000 }, () => {
  it("prints the JSON contract for the README's example", async () => {
    const r = await solute(["--json", "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310"]);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout) as JsonReply;
    expect(j.inputs).toEqual({
      sodium: { value: 128, unit: "mmol/L" },
      glucose: { value: expect.closeTo(29.974, 3), unit: "mmol/L" },
      urea: { value: 14, unit: "mmol/L" },
      measuredOsmolality: { value: 310, unit: "mOsm/kg" },
    });
    // Full precision, not rounded (REFERENCES.md §1 and §6 arithmetic [D]).
    expect(j.results.calculatedOsmolality!.value).toBeCloseTo(270 + 540 / 18.0156, 9);
    expect(j.results.calculatedOsmolality).toMatchObject({
      unit: "mOsm/kg",
      formula: "2·Na + glucose + urea",
    });
    expect(j.results.effectiveOsmolality!.value).toBeCloseTo(256 + 540 / 18.0156, 9);
    expect(j.results.osmolalGap!.value).toBeCloseTo(310 - 270 - 540 / 18.0156, 9);
    expect(j.results.correctedSodium!.katz).toMatchObject({
      value: expect.closeTo(135.04, 6),
      unit: "mmol/L",
    });
    expect(j.results.correctedSodium!.hillier).toMatchObject({
      value: expect.closeTo(138.56, 6),
      unit: "mmol/L",
    });
    expect(j.results.anionGap).toBeUndefined();
    expect(j.problems).toEqual([]);
    expect(j.cautions.at(-1)).toBe(CAUTIONS.general);
  });

  it("with ethanol, the calculated osmolality counts it and the gap is what is left", async () => {
    const r = await solute(["--json", "Na 140 glu 5 mmol/L urea 5 mmol/L EtOH 46.07 mg/dL osm 310"]);
    const j = JSON.parse(r.stdout) as JsonReply;
    expect(j.inputs.ethanol!.value).toBeCloseTo(10, 2);
    expect(j.results.calculatedOsmolality!.value).toBeCloseTo(300, 2);
    expect(j.results.osmolalGap!.value).toBeCloseTo(10, 2);
  });

  it("exits 2 when nothing can be computed, and says why", async () => {
    const r = await solute(["--json", "glucose 30"]);
    expect(r.code).toBe(2);
    expect((JSON.parse(r.stdout) as JsonReply).problems[0]!.code).toBe("unit.ambiguous");
  });

  it("--units resolves bare values", async () => {
    const r = await solute(["--json", "--units", "si", "Na 130 glucose 30 urea 10"]);
    expect(r.code).toBe(0);
    expect((JSON.parse(r.stdout) as JsonReply).inputs.glucose!.value).toBe(30);
    expect((await solute(["--units", "furlongs", "Na 130"])).code).toBe(1);
  });

  it("plain text without --json", async () => {
    const r = await solute(["Na 128 glu 540 mg/dL urea 14 mmol/L osm 310"]);
    // Verdict first: glucose 540 mg/dL is above 484 (Kost 1990 [C]); the gap 10.03 is ≥ 10 [P].
    expect(r.stdout).toMatch(/^Critical high glucose 540 mg\/dL; toxic alcohol possible/);
    expect(r.stdout.split("\n")[1]).toBe(
      "calculated 300.0 · effective 286.0 · gap 10.0 mOsm/kg · corrected Na 135.0–138.6",
    );
    expect(r.stdout).toContain(SHORT_CAUTIONS.general);
  });

  it("never echoes an identifier, on stdout or stderr", async () => {
    const r = await solute([
      "--json",
      "Mrs Fairweather MRN 8812044 DOB 1/2/1961 Na 128 glu 6 mmol/L urea 4 mmol/L",
    ]);
    expect(r.code).toBe(0);
    for (const secret of ["Fairweather", "8812044", "1961"]) {
      expect(r.stdout).not.toContain(secret);
      expect(r.stderr).not.toContain(secret);
    }
    expect((JSON.parse(r.stdout) as JsonReply).problems.map((p) => p.code)).toContain("privacy.identifier");
  });

  it("runs as the README says: npm run -s solute", async () => {
    const r = await run("npm", ["run", "-s", "solute", "--", "--json", "Na 140 glu 5 mmol/L urea 5 mmol/L"]);
    expect(r.code).toBe(0);
    expect((JSON.parse(r.stdout) as JsonReply).results.calculatedOsmolality!.value).toBe(290);
  });
});

describe("the one-shot command's findings, verdicts and exit codes", () => {
  it("prints findings with codes and severities, and a check's verdicts", async () => {
    const r = await solute(["--json", "check Na 131 glu 22 mmol/L urea 9 mmol/L 2*131 + 22 + 9 = 290"]);
    const j = JSON.parse(r.stdout) as JsonReply;
    expect(j.verdicts).toEqual([
      expect.objectContaining({ claim: "calculatedOsmolality", claimed: 290, computed: 293, holds: false }),
    ]);
    const f = JSON.parse(
      (await solute(["--json", "Na 118 glu 5 mmol/L urea 4 mmol/L osm 250"])).stdout,
    ) as JsonReply;
    expect(f.findings[0]).toMatchObject({ code: "critical.value", severity: "danger" });
    expect(f.findings.map((x) => x.code)).toContain("hyponatraemia.hypotonic");
  });

  it("exits 0 for a plan that computed its numbers", async () => {
    const r = await solute(["plan Na 118 70 kg woman adult 1 L 0.9% NaCl"]);
    expect(r.code).toBe(0);
  });
});

describe("the terminal chat", { timeout: 60_000 }, () => {
  it("answers lines typed on stdin, shows the working, and quits", async () => {
    const r = await run(process.execPath, ["--import", "tsx", "bot/main.ts"], {
      input:
        "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310\nworking\nunits si\nglucose 30 Na 140 urea 5\nquit\n",
      env: cleanEnv(),
    });
    expect(r.code).toBe(0);
    expect(r.stdout).toContain("calculated 300.0 · effective 286.0 · gap 10.0 mOsm/kg");
    expect(r.stdout).toContain("Working:");
    expect(r.stdout).toContain("2 × 128 + 29.97 + 14 = 300.0 mOsm/kg");
    expect(r.stdout).toContain("Units for this channel set to SI");
    expect(r.stdout).toContain("calculated 315.0 · effective 310.0 mOsm/kg");
    expect(r.stderr).toBe("");
  });
});

describe("a pasted block is one message", () => {
  it("splits a burst at empty lines, control words and command words only", async () => {
    const { messagesOf } = await import("../../adapters/console/app.js");
    const isCommand = (w: string) => ["units", "check", "plan", "help"].includes(w.toLowerCase());
    expect(
      messagesOf(
        [
          "Sodium 128 mmol/L",
          "Glucose 9.4 mmol/L",
          "",
          "Na 131",
          "working",
          "units si",
          "glucose 30",
          "quit",
        ],
        isCommand,
      ),
    ).toEqual([
      "Sodium 128 mmol/L\nGlucose 9.4 mmol/L",
      "Na 131",
      "working",
      "units si",
      "glucose 30",
      "quit",
    ]);
    expect(messagesOf(["check", "Na 131", "calc osm 300"], isCommand)).toEqual([
      "check\nNa 131\ncalc osm 300",
    ]);
  });

  it("answers a pasted ten-line report once, reading every line", async () => {
    const { PassThrough } = await import("node:stream");
    const { startConsole } = await import("../../adapters/console/app.js");
    const { Conversation } = await import("../../bot/conversation.js");
    const { MemoryStore } = await import("../../adapters/store/memory.js");
    const bot = new Conversation(new MemoryStore(), {
      secret: "test-secret-0123456789",
      shiftMs: 16 * 3_600_000,
      osmolalityRange: { low: 275, high: 295 },
    });
    const input = new PassThrough();
    const output = new PassThrough();
    let out = "";
    output.on("data", (d) => {
      out += d;
    });
    const done = startConsole(bot, input, output, { pasteMs: 5 });
    input.end(
      "Test\tResult\tUnits\tRange\nSodium\t128\tmmol/L\t135-145\tL\nGlucose\t30.0\tmmol/L\t3.9-5.5\tH\nUrea\t14\tmmol/L\t2.5-7.8\tH\nOsmolality\t320\tmOsm/kg\t275-295\tH\n",
    );
    await done;
    expect(out.match(/Read: /g)).toHaveLength(1);
    expect(out).toContain("Read: Na 128, glucose 30, urea 14, osm 320");
  });
});

describe("charts in the terminal", { timeout: 60_000 }, () => {
  const TREND = "trend Na 110 (0 h) 114 (6 h) 118 (12 h)";

  it("the one-shot command writes the trend's chart with --chart FILE", async () => {
    const { mkdtempSync, readFileSync } = await import("node:fs");
    const { tmpdir } = await import("node:os");
    const { join } = await import("node:path");
    const { PNG } = await import("pngjs");
    const file = join(mkdtempSync(join(tmpdir(), "solute-chart-")), "course.png");
    const r = await solute(["--chart", file, TREND]);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain(`Chart written to ${file}: Chart of the sodium for this series`);
    const png = PNG.sync.read(readFileSync(file));
    expect([png.width, png.height]).toEqual([640, 360]);
    // An answer without a chart says so, on stderr.
    const none = await solute(["--chart", file, "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310"]);
    expect(none.stderr).toContain("this answer has no chart");
  });

  it("the terminal chat writes the chart and says where", async () => {
    const { mkdtempSync, existsSync } = await import("node:fs");
    const { tmpdir } = await import("node:os");
    const { join } = await import("node:path");
    const { PassThrough } = await import("node:stream");
    const { startConsole } = await import("../../adapters/console/app.js");
    const { Conversation } = await import("../../bot/conversation.js");
    const { MemoryStore } = await import("../../adapters/store/memory.js");
    const bot = new Conversation(new MemoryStore(), {
      secret: "test-secret-0123456789",
      shiftMs: 16 * 3_600_000,
      osmolalityRange: { low: 275, high: 295 },
    });
    const dir = mkdtempSync(join(tmpdir(), "solute-chat-"));
    const input = new PassThrough();
    const output = new PassThrough();
    let out = "";
    output.on("data", (d) => {
      out += d;
    });
    const done = startConsole(bot, input, output, { pasteMs: 5, chartDir: dir });
    input.end(`trend bed 9 Na 110 (0 h) 114 (6 h) 118 (12 h)\n`);
    await done;
    const path = join(dir, "sodium-bed-9.png");
    expect(out).toContain(`Chart written to ${path}`);
    expect(existsSync(path)).toBe(true);
  });
});
