// Prints the last `npm run mutate` report (reports/mutation/mutation.json) as Markdown: the score of
// each file, and its surviving mutants grouped by line, so they can be killed or explained in
// docs/quality.md. Usage: node scripts/mutation-summary.mjs [report.json] [--survivors]
//
// "Static" survivors are mutants of code that runs once, when a module loads (tables, regular
// expressions, Sets of words): the core suite loads each module once (isolate: false), so such a
// mutant is never active while the tests run and cannot be killed here. They are counted apart, and
// the last column is the score without them.
import { readFileSync } from "node:fs";

const reportFile = process.argv.slice(2).find((a) => !a.startsWith("--")) ?? "reports/mutation/mutation.json";
const report = JSON.parse(readFileSync(reportFile, "utf8"));
const showSurvivors = process.argv.includes("--survivors");
const rows = [];
const survivors = [];
let killedAll = 0;
let validAll = 0;
let staticAll = 0;
const score = (killed, valid) => `${((100 * killed) / (valid || 1)).toFixed(1)} %`;
for (const [file, { mutants, source }] of Object.entries(report.files)) {
  const killed = mutants.filter((m) => m.status === "Killed" || m.status === "Timeout").length;
  const valid = mutants.filter((m) => !["CompileError", "RuntimeError", "Ignored"].includes(m.status)).length;
  killedAll += killed;
  validAll += valid;
  const left = mutants.filter((m) => m.status === "Survived" || m.status === "NoCoverage");
  const statics = left.filter((m) => m.static).length;
  staticAll += statics;
  rows.push(
    `| ${file} | ${valid} | ${killed} | ${left.length} | ${statics} | ${score(killed, valid)} | ${score(killed, valid - statics)} |`,
  );
  const lines = source.split("\n");
  for (const m of left)
    survivors.push(
      `- ${file}:${m.location.start.line}${m.static ? " (static)" : ""} ${m.mutatorName} → \`${m.replacement ?? ""}\`: \`${lines[m.location.start.line - 1].trim().slice(0, 90)}\``,
    );
}
console.log("| File | Mutants | Killed | Survived | of them static | Score | Without static |");
console.log("|---|---|---|---|---|---|---|");
for (const r of rows) console.log(r);
console.log(
  `| all | ${validAll} | ${killedAll} | ${validAll - killedAll} | ${staticAll} | ${score(killedAll, validAll)} | ${score(killedAll, validAll - staticAll)} |`,
);
if (showSurvivors) {
  console.log("\nSurvivors:");
  for (const s of survivors) console.log(s);
}
