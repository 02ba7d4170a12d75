// Mutation testing of the engine (npm run mutation; not in CI: about 30 minutes on 2 cores). Each mutant of
// src/engine is run against the engine's tests; a mutant that no test kills is a change of the physics or the
// numerics that nothing would notice. Reports go to test-output/mutation/.
export default {
  packageManager: "npm",
  testRunner: "vitest",
  vitest: { configFile: "test/vitest.mutation.config.ts" },
  // The physics first: the numerical building blocks (quadrature, root finding, compensated sums, the Fermi-Dirac
  // table) have their own tests and are left out to keep the run near 20 minutes on 2 idle cores.
  mutate: [
    "src/engine/**/*.ts",
    "!src/engine/index.ts",
    "!src/engine/declaredChanges.ts",
    "!src/engine/engineVersion.ts",
    "!src/engine/constants.ts",
    "!src/engine/noBigBangError.ts",
    "!src/engine/gaussKronrod.ts",
    "!src/engine/brentRoot.ts",
    "!src/engine/neumaierSum.ts",
    "!src/engine/scanForSign.ts",
    "!src/engine/fermiDiracEnergy.ts",
  ],
  coverageAnalysis: "perTest",
  // Static mutants (module-level tables and constants) need a full reload per mutant; they are checked by the
  // fixtures and closed forms anyway, and skipping them keeps the run near 20 minutes.
  ignoreStatic: true,
  // Error-message texts are checked by the input-error tests, not by numbers; mutating them here only costs time.
  mutator: { excludedMutations: ["StringLiteral"] },
  concurrency: 2,
  timeoutMS: 60_000,
  reporters: ["clear-text", "progress", "html", "json"],
  htmlReporter: { fileName: "test-output/mutation/index.html" },
  jsonReporter: { fileName: "test-output/mutation/report.json" },
  tempDirName: "test-output/stryker-tmp",
  cleanTempDir: "always",
  ignorePatterns: ["dist", "_site", "out", "test-output", "scenarios/archive", "test/fixtures/archive-format-1"],
};
