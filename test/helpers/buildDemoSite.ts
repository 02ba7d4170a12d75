import { spawnSync } from "node:child_process";
import { existsSync, mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";

export const ROOT = resolve(import.meta.dirname, "../..");
export const BIN = join(ROOT, "bin/cosmoledger.js");

export function runCli(args: string[], cwd = ROOT, env: Record<string, string> = {}) {
  const r = spawnSync(process.execPath, [BIN, ...args], {
    cwd,
    encoding: "utf8",
    maxBuffer: 256 * 1024 * 1024,
    env: { ...process.env, ...env },
  });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** The CLI runs compiled JavaScript; `npm test` compiles before vitest starts (npm run build:ts). */
export function compileProject(): void {
  for (const f of ["dist/cli/main.js", "dist/schema/scenarioValidator.cjs"]) {
    if (!existsSync(join(ROOT, f))) throw new Error(`${f} is missing: run npm run build:ts first (npm test does)`);
  }
}

export const tempDir = (prefix = "cosmoledger-test-") => mkdtempSync(join(tmpdir(), prefix));

/** A scenario whose every user-supplied string tries to inject markup or script. */
export const HOSTILE_SCENARIO = [
  `title: "<script>window.__pwned = 1</script> Hostile <img src=x onerror=window.__pwned=2>"`,
  "id: hostile",
  'author: "<b onmouseover=window.__pwned=3>me</b>"',
  'tags: ["<script>t</script>"]',
  "description: |",
  '  Click [here](javascript:window.__pwned=4) or <script>window.__pwned=5</script> <a href="javascript:x" onclick="window.__pwned=6">this</a>',
  '  ![img](x" onerror="window.__pwned=7)',
  "models:",
  "  - id: a",
  '    label: "<svg onload=window.__pwned=8>"',
  '    notes: "</script><script>window.__pwned=9</script>"',
  "    H0: 70",
  "    Omega_m: 0.3",
  "targets:",
  '  - { name: "<iframe src=javascript:window.__pwned=10>", z: 1, size_kpc: 5 }',
  "",
].join("\n");
