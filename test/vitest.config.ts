// vitest settings for `npm test`. Generous limits, because CI and developers' machines are shared 2-core machines
// that may be fully loaded by other work: a test fails on an assertion, never on the clock. Tests that wait for
// something poll with a deadline instead of sleeping for a fixed time.
import { fileURLToPath } from "node:url";
import { defineConfig } from "vitest/config";

export default defineConfig({
  root: fileURLToPath(new URL("..", import.meta.url)),
  test: {
    include: ["test/**/*.test.ts"],
    testTimeout: 180_000,
    hookTimeout: 180_000,
    teardownTimeout: 60_000,
  },
});
