/**
 * The sodium course as a picture: measured sodium against hours from the first value, the
 * correction limits as a shaded band from the start of correction, the glucose-corrected sodium
 * as a second line when glucose was logged, and "now" with the room left. Built as SVG text with
 * d3-scale and d3-shape (no DOM), rasterised to PNG by resvg with an embedded open font
 * (DejaVu Sans), so the output is the same on every machine. Greyscale-readable: the lines
 * differ by dash and marker, not only by shade. Only the tag, hours and numbers appear.
 *
 * Loaded only when a chart is asked for (bot/charts.ts imports it lazily).
 */
import { createRequire } from "node:module";
import { Resvg } from "@resvg/resvg-js";
import { scaleLinear } from "d3-scale";
import { line } from "d3-shape";
import { PNG } from "pngjs";
import {
  type CorrectionTrend,
  RAISE_HIGH_RISK_TWO_DAYS,
  RAISE_TWO_DAYS,
  WINDOW_HOURS,
} from "../core/correction.js";
import { fmt, num } from "../core/format.js";

const WIDTH = 640;
const HEIGHT = 360;
const M = { left: 60, right: 20, top: 56, bottom: 52 };
const FONT = "DejaVu Sans";
const fontFile = (name: string) => createRequire(import.meta.url).resolve(`dejavu-fonts-ttf/ttf/${name}`);
const FONT_FILES = [fontFile("DejaVuSans.ttf"), fontFile("DejaVuSans-Bold.ttf")];

/** One window's band: where the judged measure may be, from the window's start. */
export interface Band {
  fromHours: number;
  toHours: number;
  low: number;
  high: number;
}

export interface Chart {
  svg: string;
  /** The same picture in words (Slack alt_text, Teams altText). */
  alt: string;
}

/** The bands of the limits the trend was judged by (empty when no correction is under way). */
export function bandsOf(t: CorrectionTrend): Band[] {
  if (t.direction === "none") return [];
  const sign = t.direction === "raising" ? 1 : -1;
  const twoDay = t.highRisk ? RAISE_HIGH_RISK_TWO_DAYS : RAISE_TWO_DAYS;
  return t.windows.map((w) => {
    let edge = w.start + sign * w.limit;
    // Raising: the second day's ceiling is also held under the 48 h total from the baseline.
    if (sign > 0 && w.fromHours >= WINDOW_HOURS && w.fromHours < 2 * WINDOW_HOURS)
      edge = Math.min(edge, t.baseline + twoDay);
    return {
      fromHours: w.fromHours,
      toHours: w.toHours,
      low: Math.min(w.start, edge),
      high: Math.max(w.start, edge),
    };
  });
}

/** The judged value of each point: the Katz-corrected sodium when the trend is judged on it. */
const judged = (t: CorrectionTrend, p: CorrectionTrend["points"][number]) =>
  t.measure === "correctedSodium" && p.corrected ? p.corrected.katz : p.sodium;

function outside(t: CorrectionTrend, bands: Band[], p: CorrectionTrend["points"][number]): boolean {
  const b = bands.find((x) => p.hours > x.fromHours && p.hours <= x.toHours);
  if (!b) return false;
  const v = judged(t, p);
  return v > b.high + 1e-9 || v < b.low - 1e-9;
}

const esc = (s: string) => s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;");

/** The chart of one case's episode. `tag` is the case tag (bed 12); nothing else names it. */
export function trendChart(tag: string, t: CorrectionTrend): Chart {
  const bands = bandsOf(t);
  const now = t.nowHours;
  const xMax = Math.max(
    12,
    Math.ceil((Math.max(now, ...bands.map((b) => Math.min(b.toHours, now + 6))) + 1) / 6) * 6,
  );
  const values = t.points.flatMap((p) => [p.sodium, ...(p.corrected ? [p.corrected.katz] : [])]);
  const edges = bands.flatMap((b) => [b.low, b.high]);
  const yMin = Math.floor(Math.min(...values, ...edges) - 2);
  const yMax = Math.ceil(Math.max(...values, ...edges) + 2);
  const x = scaleLinear()
    .domain([0, xMax])
    .range([M.left, WIDTH - M.right]);
  const y = scaleLinear()
    .domain([yMin, yMax])
    .range([HEIGHT - M.bottom, M.top])
    .nice();
  const px = (v: number) => x(v).toFixed(1);
  const py = (v: number) => y(v).toFixed(1);
  const out: string[] = [];
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" width="${WIDTH}" height="${HEIGHT}" viewBox="0 0 ${WIDTH} ${HEIGHT}" font-family="${FONT}" font-size="13">`,
    `<rect width="${WIDTH}" height="${HEIGHT}" fill="#ffffff"/>`,
    `<text x="${M.left}" y="22" font-size="15" font-weight="bold">${esc(`${tag}: sodium over time`)}</text>`,
  );
  // The band: light grey, its limit edge dashed and labelled.
  for (const b of bands) {
    const to = Math.min(b.toHours, xMax);
    if (to <= b.fromHours) continue;
    const edge = t.direction === "raising" ? b.high : b.low;
    out.push(
      `<rect class="band" data-low="${num(b.low, 2)}" data-high="${num(b.high, 2)}" x="${px(b.fromHours)}" y="${py(b.high)}" width="${(x(to) - x(b.fromHours)).toFixed(1)}" height="${(y(b.low) - y(b.high)).toFixed(1)}" fill="#e3e3e3"/>`,
      `<line class="limit" x1="${px(b.fromHours)}" x2="${px(to)}" y1="${py(edge)}" y2="${py(edge)}" stroke="#555555" stroke-width="1.5" stroke-dasharray="6 4"/>`,
      `<text x="${(x(b.fromHours) + 4).toFixed(1)}" y="${(y(edge) + (t.direction === "raising" ? -5 : 15)).toFixed(1)}" font-size="11" fill="#333333">limit ${fmt(edge)}</text>`,
    );
  }
  // Axes, with units.
  for (const tick of y.ticks(6)) {
    out.push(
      `<line x1="${M.left}" x2="${WIDTH - M.right}" y1="${py(tick)}" y2="${py(tick)}" stroke="#f0f0f0"/>`,
      `<text x="${M.left - 8}" y="${(y(tick) + 4).toFixed(1)}" text-anchor="end" font-size="11">${tick}</text>`,
    );
  }
  for (let h = 0; h <= xMax; h += xMax > 36 ? 12 : 6)
    out.push(
      `<text x="${px(h)}" y="${HEIGHT - M.bottom + 18}" text-anchor="middle" font-size="11">${h}</text>`,
    );
  out.push(
    `<line x1="${M.left}" x2="${WIDTH - M.right}" y1="${HEIGHT - M.bottom}" y2="${HEIGHT - M.bottom}" stroke="#000000"/>`,
    `<line x1="${M.left}" x2="${M.left}" y1="${M.top}" y2="${HEIGHT - M.bottom}" stroke="#000000"/>`,
    `<text x="${(M.left + WIDTH - M.right) / 2}" y="${HEIGHT - 12}" text-anchor="middle">hours from the first sodium</text>`,
    `<text transform="translate(16 ${(M.top + HEIGHT - M.bottom) / 2}) rotate(-90)" text-anchor="middle">sodium (mmol/L)</text>`,
  );
  // Now, and the room left.
  const room = t.roomLeft
    ? ` · ${fmt(t.roomLeft.mmol)} mmol/L more allowed until hour ${num(t.roomLeft.untilHours)}`
    : "";
  out.push(
    `<line class="now" x1="${px(now)}" x2="${px(now)}" y1="${M.top}" y2="${HEIGHT - M.bottom}" stroke="#000000" stroke-dasharray="2 3"/>`,
    `<text x="${Math.min(x(now) + 4, WIDTH - M.right - 4).toFixed(1)}" y="${M.top + 12}" font-size="11" text-anchor="${x(now) > WIDTH * 0.6 ? "end" : "start"}">${esc(`now${room}`)}</text>`,
  );
  // The corrected sodium: dark grey, dashed, hollow markers.
  const corrected = t.points.filter((p) => p.corrected);
  if (corrected.length > 0) {
    const path = line<(typeof corrected)[number]>()
      .x((p) => x(p.hours))
      .y((p) => y(p.corrected!.katz))(corrected);
    out.push(
      `<path class="corrected" d="${path}" fill="none" stroke="#555555" stroke-width="2" stroke-dasharray="8 4"/>`,
    );
    for (const p of corrected)
      out.push(
        `<circle class="corrected-point" cx="${px(p.hours)}" cy="${py(p.corrected!.katz)}" r="4" fill="#ffffff" stroke="#555555" stroke-width="2"/>`,
      );
  }
  // The measured sodium: black, solid, filled markers; a point outside the band gets a ring.
  const path = line<(typeof t.points)[number]>()
    .x((p) => x(p.hours))
    .y((p) => y(p.sodium))(t.points);
  out.push(`<path class="measured" d="${path}" fill="none" stroke="#000000" stroke-width="2.5"/>`);
  for (const p of t.points) {
    const off = outside(t, bands, p);
    out.push(
      `<circle class="point${off ? " outside" : ""}" data-hours="${num(p.hours, 2)}" data-sodium="${num(p.sodium, 2)}" cx="${px(p.hours)}" cy="${py(p.sodium)}" r="4.5" fill="#000000"/>`,
    );
    if (off) {
      const at = corrected.length > 0 && p.corrected ? p.corrected.katz : p.sodium;
      out.push(
        `<circle cx="${px(p.hours)}" cy="${py(at)}" r="9" fill="none" stroke="#000000" stroke-width="2"/>`,
        `<text x="${(x(p.hours) + 11).toFixed(1)}" y="${(y(at) - 8).toFixed(1)}" font-size="11" font-weight="bold">over the limit</text>`,
      );
    }
  }
  // Legend.
  const legend = [
    `<line x1="${M.left}" x2="${M.left + 24}" y1="40" y2="40" stroke="#000000" stroke-width="2.5"/><circle cx="${M.left + 12}" cy="40" r="4" fill="#000000"/><text x="${M.left + 30}" y="44" font-size="12">measured Na</text>`,
  ];
  if (corrected.length > 0)
    legend.push(
      `<line x1="${M.left + 130}" x2="${M.left + 154}" y1="40" y2="40" stroke="#555555" stroke-width="2" stroke-dasharray="8 4"/><text x="${M.left + 160}" y="44" font-size="12">corrected Na (Katz)</text>`,
    );
  if (bands.length > 0)
    legend.push(
      `<rect x="${M.left + 290}" y="34" width="24" height="12" fill="#e3e3e3"/><text x="${M.left + 320}" y="44" font-size="12">${t.measure === "correctedSodium" ? "allowed for corrected Na" : "allowed by the limits"}${t.highRisk ? ", high risk" : ""}</text>`,
    );
  out.push(...legend, "</svg>");
  return { svg: out.join("\n"), alt: altText(tag, t, bands, now) };
}

/** The chart in words, for screen readers and for when the picture does not load. */
export function altText(tag: string, t: CorrectionTrend, bands = bandsOf(t), now = t.nowHours): string {
  const points = t.points.map((p) => `${num(p.sodium)} at hour ${num(p.hours, 1)}`).join(", ");
  const parts = [`Chart of the sodium for ${tag}, in mmol/L against hours from the first value: ${points}.`];
  if (t.points.some((p) => p.corrected))
    parts.push(
      `Glucose-corrected (Katz): ${t.points
        .filter((p) => p.corrected)
        .map((p) => `${fmt(p.corrected!.katz)} at hour ${num(p.hours, 1)}`)
        .join(", ")}.`,
    );
  if (bands.length > 0) {
    const edge = (b: Band) => fmt(t.direction === "raising" ? b.high : b.low);
    parts.push(
      `Shaded: where the limits allow the ${t.measure === "correctedSodium" ? "corrected sodium" : "sodium"} to be — ${bands
        .map(
          (b) =>
            `${t.direction === "raising" ? "up to" : "down to"} ${edge(b)} in hours ${num(b.fromHours)}–${num(b.toHours)}`,
        )
        .join("; ")}.`,
    );
    const off = t.points.filter((p) => outside(t, bands, p));
    parts.push(
      off.length === 0
        ? "No value is outside the shaded band."
        : `Outside the band: ${off.map((p) => `hour ${num(p.hours, 1)}`).join(", ")}.`,
    );
  }
  parts.push(
    `Now: hour ${num(now, 1)}${t.roomLeft ? `, ${fmt(t.roomLeft.mmol)} mmol/L more allowed until hour ${num(t.roomLeft.untilHours)}` : ""}.`,
  );
  return parts.join(" ");
}

/**
 * The chart as PNG, with the embedded font and no system fonts (the same on every machine). The
 * picture is grey by design, so it is stored as 8-bit greyscale (pngjs): about 10 KB instead of
 * 21 KB in colour, which keeps a Teams card with the image as a data URI under its size limit.
 */
export function toPng(svg: string): Buffer {
  const image = new Resvg(svg, {
    background: "#ffffff",
    fitTo: { mode: "width", value: WIDTH },
    font: { fontFiles: FONT_FILES, loadSystemFonts: false, defaultFontFamily: FONT },
  }).render();
  const png = new PNG({ width: image.width, height: image.height });
  png.data = Buffer.from(image.pixels);
  return PNG.sync.write(png, { colorType: 0, inputColorType: 6, inputHasAlpha: true, deflateLevel: 9 });
}
