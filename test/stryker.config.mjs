// Mutation testing (npm run mutation; not in CI). Each mutant of the engine (with its numerical building blocks),
// the statistics of spreads and the draw path is run against the tests that cover it; a mutant that no test kills
// is a change of the physics, the numerics or the statistics that nothing would notice. The run is incremental
// (test-output/mutation/incremental.json): after a small change only the mutants of changed code run again. Reports
// go to test-output/mutation/; the run fails below the break threshold.
export default {
  packageManager: "npm",
  testRunner: "vitest",
  vitest: { configFile: "test/vitest.mutation.config.ts" },
  mutate: [
    "src/engine/**/*.ts",
    "!src/engine/index.ts",
    "!src/engine/declaredChanges.ts",
    "!src/engine/engineVersion.ts",
    "!src/engine/noBigBangError.ts",
    "src/statistics/**/*.ts",
    "!src/statistics/index.ts",
    "src/tables/drawEvaluation.ts",
    "src/tables/spreadBands.ts",
    "src/tables/bandStatistics.ts",
  ],
  coverageAnalysis: "perTest",
  // Static mutants (module-level tables and constants) need a full reload per mutant; the constants are pinned by
  // the closed-form and fixture tests, which take them from outside the engine.
  ignoreStatic: true,
  // Error-message texts are checked by the input-error tests, not by numbers; mutating them here only costs time.
  mutator: { excludedMutations: ["StringLiteral"] },
  incremental: true,
  incrementalFile: "test-output/mutation/incremental.json",
  thresholds: { high: 90, low: 85, break: 80 },
  concurrency: 2,
  timeoutMS: 60_000,
  reporters: ["clear-text", "progress", "html", "json"],
  htmlReporter: { fileName: "test-output/mutation/index.html" },
  jsonReporter: { fileName: "test-output/mutation/report.json" },
  tempDirName: "test-output/stryker-tmp",
  cleanTempDir: "always",
  ignorePatterns: ["dist", "_site", "out", "test-output", "scenarios/archive", "test/fixtures/archive-format-1"],
};
