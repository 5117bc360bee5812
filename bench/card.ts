/**
 * The Teams card on a phone: renders Solute's Adaptive Cards with the `adaptivecards` library (the
 * renderer Microsoft publishes) in headless Chromium at 360 and 600 px wide, measures the height
 * of the first view (the "More" card closed), and writes screenshots to docs/. Budget: the README's
 * example at most 600 px tall at 360 px.
 *
 *   npx tsx bench/card.ts        (also run by npm run bench; needs Debian's chromium package)
 *
 * Chromium is driven by its own command line (--dump-dom, --screenshot): no browser download and
 * no extra dependency.
 */
import { execFileSync } from "node:child_process";
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { MemoryStore } from "../adapters/store/memory.js";
import { renderCard } from "../adapters/teams/render.js";
import { loadConfig } from "../bot/config.js";
import { Conversation } from "../bot/conversation.js";

export const CARD_BUDGET_PX = 600;
const CHROMIUM = ["/usr/bin/chromium", "/usr/bin/chromium-browser"].find((p) => existsSync(p));
const FLAGS = [
  "--headless",
  "--no-sandbox",
  "--disable-gpu",
  "--disable-quic",
  "--no-first-run",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
  "--hide-scrollbars",
];

const EXAMPLES = [
  ["README example", "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310"],
  ["toxic alcohol", "Na 140 glu 5 mmol/L urea 5 mmol/L osm 320 Cl 104 HCO3 26"],
  ["DKA", "Na 132 Cl 96 HCO3 10 glu 25 mmol/L urea 6 mmol/L ketones 5.2 mmol/L pH 7.15"],
  ["plan too fast", "plan Na 110 TBW 30 L 1 L 3% NaCl"],
] as const;

function page(card: object, width: number, script: string): string {
  return `<!doctype html><html><head><meta charset="utf-8">
<style>body{margin:0;background:#fff;font-family:"Segoe UI",system-ui,sans-serif;width:${width}px}
#card{width:${width}px;box-sizing:border-box;padding:12px;border:1px solid #ddd}</style>
<script>${script}</script></head><body><div id="card"></div><script>
// As Teams' own Markdown processing does: a backslash escape shows the character itself.
AdaptiveCards.AdaptiveCard.onProcessMarkdown = (text, result) => {
  const div = document.createElement("div");
  div.textContent = text.replace(/\\\\(.)/g, "$1");
  result.outputHtml = div.innerHTML;
  result.didProcess = true;
};
const ac = new AdaptiveCards.AdaptiveCard();
ac.hostConfig = new AdaptiveCards.HostConfig({ fontFamily: "Segoe UI, system-ui, sans-serif" });
ac.parse(${JSON.stringify(card)});
document.getElementById("card").appendChild(ac.render());
document.title = "height:" + Math.ceil(document.getElementById("card").getBoundingClientRect().height);
</script></body></html>`;
}

function chromium(args: string[]): string {
  return execFileSync(CHROMIUM!, [...FLAGS, ...args], {
    encoding: "utf8",
    stdio: ["ignore", "pipe", "ignore"],
    timeout: 60_000,
  });
}

export interface CardMeasure {
  name: string;
  width: number;
  height: number;
}

export async function measureCards(write = true): Promise<CardMeasure[] | undefined> {
  if (!CHROMIUM) return undefined;
  const bot = new Conversation(new MemoryStore(), loadConfig({ SOLUTE_SECRET: "solute-secret-0123456789" }));
  const script = readFileSync(
    join(import.meta.dirname, "..", "node_modules", "adaptivecards", "dist", "adaptivecards.min.js"),
    "utf8",
  );
  const dir = mkdtempSync(join(tmpdir(), "solute-card-"));
  const out: CardMeasure[] = [];
  for (const [name, text] of EXAMPLES) {
    const card = renderCard(await bot.handle({ text, channel: "bench", platform: "teams" }));
    for (const width of [360, 600]) {
      const file = join(dir, `${width}-${out.length}.html`);
      writeFileSync(file, page(card, width, script));
      const dom = chromium(["--virtual-time-budget=2000", "--dump-dom", `file://${file}`]);
      const height = Number(/height:(\d+)/.exec(dom)?.[1] ?? Number.NaN);
      out.push({ name, width, height });
      if (write && name === "README example") {
        const png = join(import.meta.dirname, "..", "docs", `teams-card-${width}.png`);
        chromium([
          `--window-size=${width},${Math.max(200, height + 2)}`,
          `--screenshot=${png}`,
          `file://${file}`,
        ]);
      }
    }
  }
  return out;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const { loadUnits } = await import("../core/units.js");
  await loadUnits();
  const results = await measureCards();
  if (!results) {
    process.stderr.write("chromium not found: apt-get install -y chromium\n");
    process.exit(2);
  }
  for (const r of results) process.stdout.write(`${r.name} at ${r.width} px: ${r.height} px tall\n`);
  const readme = results.find((r) => r.name === "README example" && r.width === 360)!;
  process.stdout.write(
    `budget: README example ≤ ${CARD_BUDGET_PX} px at 360 px — ${readme.height <= CARD_BUDGET_PX ? "met" : "NOT met"}\n`,
  );
}
