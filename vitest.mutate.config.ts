// The tests Stryker runs against each mutant of core/ (npm run mutate): the core suite only, so a
// mutant costs milliseconds. The whole suite (vitest.config.ts) is what CI runs.
import { defineConfig } from "vitest/config";

export default defineConfig({
  test: {
    include: ["test/core/**/*.test.ts"],
    setupFiles: ["test/setup.ts"],
    testTimeout: 20_000,
    // One module graph for all files: mathjs and the catalogue load once, not once per file and
    // mutant. Stryker switches mutants at run time, so nothing needs reloading.
    isolate: false,
  },
});
