/** The chart's render time: an invented two-day course drawn to SVG and PNG, first and warm. */
import { drawChart } from "../bot/charts.js";
import { correctionTrend } from "../core/correction.js";

const trend = correctionTrend(
  [
    { hours: 0, sodium: 112, glucose: 28 },
    { hours: 6, sodium: 115, glucose: 20 },
    { hours: 12, sodium: 118, glucose: 14 },
    { hours: 20, sodium: 121, glucose: 9 },
    { hours: 30, sodium: 124, glucose: 7 },
  ],
  { nowHours: 31 },
)!;
const request = { tag: "bed 12", trend };

let t = performance.now();
const first = await drawChart(request);
const firstMs = performance.now() - t;
for (let i = 0; i < 5; i++) await drawChart(request);
const times: number[] = [];
for (let i = 0; i < 40; i++) {
  t = performance.now();
  await drawChart(request);
  times.push(performance.now() - t);
}
times.sort((a, b) => a - b);
process.stdout.write(
  `${JSON.stringify({ firstMs, warmMs: times[Math.floor(times.length / 2)], bytes: first.png.length })}\n`,
);
