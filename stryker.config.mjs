// Mutation testing of the clinical engine: `npm run mutate` (not in CI: too slow for two cores).
// Stryker changes core/ one small thing at a time and runs the core tests against each change; a
// change that no test notices ("survived") is a rule nobody guards. Incremental: a rerun tests only
// mutants whose code or tests changed since .stryker/incremental.json was written.
// No TypeScript checker: typescript 7 (the Go compiler) has no JavaScript API for
// @stryker-mutator/typescript-checker, so a mutant that would not compile runs anyway (esbuild strips
// types) and is judged by the tests like any other.
/** @type {import("@stryker-mutator/api/core").PartialStrykerOptions} */
export default {
  testRunner: "vitest",
  vitest: { configFile: "vitest.mutate.config.ts", related: false },
  plugins: ["@stryker-mutator/vitest-runner"],
  mutate: ["core/**/*.ts", "!core/index.ts"],
  // Texts (finding wording, vocabulary words) are not mutated: the wording is checked by the reply
  // tests in test/bot and test/adapters, not by the core suite, and a third of all mutants were
  // texts. Codes, units and names are strings too, but a wrong one fails a core test anyway.
  mutator: { excludedMutations: ["StringLiteral"] },
  coverageAnalysis: "perTest",
  incremental: true,
  incrementalFile: ".stryker/incremental.json",
  concurrency: 2,
  timeoutMS: 20000,
  reporters: ["clear-text", "progress", "json"],
  jsonReporter: { fileName: "reports/mutation/mutation.json" },
  clearTextReporter: { allowColor: false, logTests: false, reportMutants: false },
  thresholds: { high: 90, low: 80, break: null },
  // Stryker would rewrite tsconfig.json with the TypeScript API, which typescript 7 lacks; tsx and
  // vitest need no tsconfig to run, so none is given to it.
  tsconfigFile: "none.json",
  tempDirName: ".stryker/tmp",
  cleanTempDir: "always",
};
