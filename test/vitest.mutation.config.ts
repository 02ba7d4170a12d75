// vitest settings for mutation testing (npm run mutation): the engine's own tests, which compare it with closed
// forms, mpmath fixtures and identities, run against each mutant of src/engine.
import { fileURLToPath } from "node:url";
import { defineConfig } from "vitest/config";

export default defineConfig({
  root: fileURLToPath(new URL("..", import.meta.url)),
  test: { include: ["test/engine/**/*.test.ts"], testTimeout: 180_000, hookTimeout: 180_000 },
});
