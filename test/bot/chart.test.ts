import { PNG } from "pngjs";
import { describe, expect, it } from "vitest";
import { altText, bandsOf, toPng, trendChart } from "../../bot/chart.js";
import { drawChart } from "../../bot/charts.js";
import { correctionTrend, type SodiumPoint } from "../../core/correction.js";

const trend = (points: SodiumPoint[], options: Parameters<typeof correctionTrend>[1] = {}) =>
  correctionTrend(points, options)!;
const count = (svg: string, cls: string) => (svg.match(new RegExp(`class="${cls}[" ]`, "g")) ?? []).length;
const bandsIn = (svg: string) =>
  [...svg.matchAll(/class="band" data-low="([\d.]+)" data-high="([\d.]+)"/g)].map((m) => [
    Number(m[1]),
    Number(m[2]),
  ]);

describe("the sodium chart", () => {
  it("one point per measurement, and the band's edge at the first day's limit", () => {
    const t = trend(
      [
        { hours: 0, sodium: 110 },
        { hours: 6, sodium: 114 },
        { hours: 12, sodium: 118 },
      ],
      { nowHours: 13 },
    );
    const { svg } = trendChart("bed 12", t);
    expect(count(svg, "point")).toBe(3);
    // Raising: at most +10 mmol/L in the first 24 h (European guideline, Spasovski 2014; REFERENCES §5).
    expect(bandsIn(svg)).toEqual([[110, 120]]);
    expect(count(svg, "point outside")).toBe(0);
  });

  it("a value above the limit is marked as outside the band, in the picture and in words", () => {
    const t = trend(
      [
        { hours: 0, sodium: 110 },
        { hours: 12, sodium: 122 },
        { hours: 20, sodium: 119 },
      ],
      { nowHours: 21 },
    );
    const { svg, alt } = trendChart("bed 12", t);
    expect(svg.match(/class="point outside" data-hours="12"/g)).toHaveLength(1);
    expect(svg).toContain("over the limit");
    expect(alt).toContain("110 at hour 0, 122 at hour 12, 119 at hour 20");
    expect(alt).toContain("up to 120.0 in hours 0–24");
    expect(alt).toContain("Outside the band: hour 12.");
  });

  it("high risk: 8 in the first day; the second day's ceiling is held under the 48 h total", () => {
    // High risk of osmotic demyelination: ≤ 8 mmol/L in any 24 h, ≤ 16 over 48 h (Spasovski 2014).
    const risky = trend(
      [
        { hours: 0, sodium: 104 },
        { hours: 10, sodium: 108 },
      ],
      { nowHours: 11 },
    );
    expect(bandsOf(risky)[0]).toMatchObject({ low: 104, high: 112 });
    // Not high risk: +10 on day one, +8 on day two, but no more than +18 over 48 h from 110.
    const two = trend(
      [
        { hours: 0, sodium: 110 },
        { hours: 24, sodium: 120 },
        { hours: 30, sodium: 124 },
      ],
      { nowHours: 31 },
    );
    const bands = bandsOf(two);
    expect(bands.map((b) => [b.low, b.high])).toEqual([
      [110, 120],
      [120, 128],
    ]);
  });

  it("lowering a high sodium: the band sits below the start, 10 in 24 h", () => {
    // Chronic hypernatraemia: lower by about 10 mmol/L in 24 h at most (REFERENCES §5).
    const t = trend(
      [
        { hours: 0, sodium: 160 },
        { hours: 8, sodium: 156 },
      ],
      { nowHours: 9 },
    );
    expect(bandsIn(trendChart("bay 4B", t).svg)).toEqual([[150, 160]]);
    expect(altText("bay 4B", t)).toContain("down to 150.0 in hours 0–24");
  });

  it("with glucose logged, the corrected sodium is a second, labelled line", () => {
    const t = trend(
      [
        { hours: 0, sodium: 121, glucose: 40 },
        { hours: 8, sodium: 126, glucose: 25 },
        { hours: 16, sodium: 130, glucose: 14 },
      ],
      { nowHours: 18 },
    );
    const { svg, alt } = trendChart("bay 4B", t);
    expect(count(svg, "corrected-point")).toBe(3);
    expect(svg).toContain("corrected Na (Katz)");
    expect(alt).toContain("Glucose-corrected (Katz)");
    expect(svg).toContain("8.5 mmol/L more allowed until hour 24");
  });

  it("names nothing but the tag: every word in the picture comes from a fixed vocabulary", () => {
    const t = trend(
      [
        { hours: 0, sodium: 118, glucose: 20 },
        { hours: 5, sodium: 121, glucose: 12 },
      ],
      { nowHours: 6 },
    );
    const { svg } = trendChart("bed 7", t);
    const words = [...svg.matchAll(/<text[^>]*>([^<]*)<\/text>/g)].flatMap((m) => m[1]!.split(/[\s:·(),]+/));
    const allowed =
      /^(|bed|7|sodium|over|time|hours|from|the|first|by|for|limits|\(?mmol\/L\)?|measured|Na|corrected|Katz|allowed|high|risk|limit|now|more|until|hour|[\d.−-]+)$/;
    expect(words.filter((w) => !allowed.test(w))).toEqual([]);
  });

  it("is a PNG of the stated size, greyscale, drawn with the embedded font", async () => {
    const t = trend(
      [
        { hours: 0, sodium: 110 },
        { hours: 12, sodium: 117 },
      ],
      { nowHours: 14 },
    );
    const chart = await drawChart({ tag: "bed 12", trend: t });
    const png = PNG.sync.read(chart.png);
    expect([png.width, png.height]).toEqual([640, 360]);
    expect(chart.png.length).toBeLessThan(16_000); // bytes: small enough for a Teams card's data URI
    expect(chart.name).toBe("sodium-bed-12.png");
    // Text was drawn (the font loaded): the title row has dark pixels.
    const dark = (y: number) => {
      let n = 0;
      for (let x = 60; x < 300; x++) if (png.data[(y * png.width + x) * 4]! < 100) n++;
      return n;
    };
    expect(Math.max(dark(14), dark(16), dark(18))).toBeGreaterThan(10);
    expect(toPng(chart.svg).equals(chart.png)).toBe(true); // the same picture every time
  });
});
