// vitest settings for mutation testing (npm run mutation): the tests of the engine (closed forms, mpmath fixtures,
// identities) and of spreads (central draws, known answers, draws against first-order propagation) run against each
// mutant; the spread tests that start whole processes are left out (they test the command line, not the numbers).
import { fileURLToPath } from "node:url";
import { defineConfig } from "vitest/config";

export default defineConfig({
  root: fileURLToPath(new URL("..", import.meta.url)),
  test: {
    include: ["test/engine/**/*.test.ts", "test/spread/**/*.test.ts", "test/presentation/**/*.test.ts"],
    exclude: ["test/spread/spreadCli.test.ts", "test/spread/drawPoolFaults.test.ts"],
    testTimeout: 180_000,
    hookTimeout: 180_000,
  },
});
