/**
 * Charts on demand: bot/chart.ts (d3, resvg and the font) is imported the first time a chart is
 * drawn, so start-up and every other reply never pay for it.
 */
import type { ChartRequest } from "./reply.js";

export interface RenderedChart {
  png: Buffer;
  svg: string;
  alt: string;
  /** A file name with no identifier in it: sodium-<tag>.png. */
  name: string;
}

let loading: Promise<typeof import("./chart.js")> | undefined;

export async function drawChart(request: ChartRequest): Promise<RenderedChart> {
  loading ??= import("./chart.js");
  const { trendChart, toPng } = await loading;
  const { svg, alt } = trendChart(request.tag, request.trend);
  return { svg, alt, png: toPng(svg), name: `sodium-${request.tag.replace(/[^A-Za-z0-9-]+/g, "-")}.png` };
}
