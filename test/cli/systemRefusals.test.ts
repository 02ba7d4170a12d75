// The file system refuses for real: a full disk (a 256 KiB tmpfs), a read-only mount, and permission
// denied (the commands run as the unprivileged user "nobody" through setpriv). Each must end with exit 4 and one
// line naming the path (README: exit statuses), no stack trace, no temporary file, and the previous output whole.
//
// Mounting needs root. As root (CI runs as root) every case runs; COSMOLEDGER_REQUIRE_ROOT_TESTS=1 (set in .ci/run)
// makes a machine where they cannot run fail instead of skipping them. Elsewhere they are reported as skipped.
import { describe, expect, it, beforeAll, afterAll } from "vitest";
import { execFileSync, spawnSync } from "node:child_process";
import { chmodSync, mkdirSync, readFileSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { createHash } from "node:crypto";
import { BIN, ROOT, compileProject, tempDir } from "../helpers/buildDemoSite.js";

const isRoot = process.getuid?.() === 0;
const required = process.env.COSMOLEDGER_REQUIRE_ROOT_TESTS === "1";
if (required && !isRoot) throw new Error("COSMOLEDGER_REQUIRE_ROOT_TESTS=1 but the tests do not run as root");

const SMALL = "title: T\nid: plan\nmodels:\n  - { id: a, H0: 70, Omega_m: 0.3 }\n";
// About 2 MB of tables: far more than the 256 KiB disk holds.
const LARGE = `title: T\nid: plan\nredshifts: [${Array.from({ length: 400 }, (_, i) => ((i + 1) / 40).toString()).join(", ")}]\nmodels:\n${Array.from({ length: 6 }, (_, i) => `  - { id: m${i}, H0: ${66 + i}, Omega_m: 0.3 }`).join("\n")}\n`;

const NOBODY = ["--reuid=65534", "--regid=65534", "--clear-groups"];

/**
 * The command line as user nobody can run it. A checkout inside a private folder (mktemp -d makes mode 700) is out
 * of nobody's reach, so the installed project is then mirrored, by hard links (no copy of the data), into a folder
 * anyone may read.
 */
let nobodyBin: string | null = null;
function binForNobody(): string {
  if (nobodyBin) return nobodyBin;
  const reachable = spawnSync("setpriv", [
    ...NOBODY,
    process.execPath,
    "-e",
    `require("fs").accessSync(${JSON.stringify(BIN)})`,
  ]);
  if (reachable.status === 0) {
    nobodyBin = BIN;
    return nobodyBin;
  }
  const mirror = tempDir("cosmoledger-nobody-");
  chmodSync(mirror, 0o755);
  for (const f of ["bin", "dist", "node_modules", "content", "package.json", ".eleventy.js"]) {
    try {
      execFileSync("cp", ["-al", join(ROOT, f), join(mirror, f)]);
    } catch {
      execFileSync("cp", ["-a", join(ROOT, f), join(mirror, f)]); // another file system: a real copy
    }
  }
  nobodyBin = join(mirror, "bin/cosmoledger.js");
  return nobodyBin;
}

function cli(args: string[], cwd: string, asNobody = false) {
  const command = asNobody ? "setpriv" : process.execPath;
  const prefix = asNobody ? [...NOBODY, process.execPath] : [];
  const bin = asNobody ? binForNobody() : BIN;
  const r = spawnSync(command, [...prefix, bin, ...args], { cwd, encoding: "utf8", timeout: 120_000 });
  return { code: r.status, stderr: r.stderr, signal: r.signal };
}
function refusedBySystem(r: ReturnType<typeof cli>, path: RegExp, reason: RegExp) {
  expect(r.signal, "the command hung and was killed").toBeNull();
  expect(r.code, r.stderr).toBe(4);
  const lines = r.stderr.trim().split("\n");
  expect(lines, r.stderr).toHaveLength(1);
  expect(lines[0]).toMatch(path);
  expect(lines[0]).toMatch(reason);
  expect(r.stderr).not.toMatch(/unexpected failure|\n\s+at /);
}
const listing = (dir: string): string[] =>
  readdirSync(dir, { recursive: true, encoding: "utf8" })
    .sort()
    .map((f) => {
      try {
        return `${f} ${createHash("sha256")
          .update(readFileSync(join(dir, f)))
          .digest("hex")}`;
      } catch {
        return `${f} (folder)`;
      }
    });
const temporaries = (dir: string): string[] =>
  readdirSync(dir, { recursive: true, encoding: "utf8" }).filter((f) =>
    /\.tmp|\.writing-|\.previous-|\.building-/.test(f),
  );

let mountPoint: string | null = null;
function mountTmpfs(sizeKiB: number, readOnly = false): string {
  const dir = tempDir("cosmoledger-mnt-");
  execFileSync("mount", ["-t", "tmpfs", "-o", `size=${sizeKiB}k,mode=0777`, "tmpfs", dir]);
  mountPoint = dir;
  if (readOnly) execFileSync("mount", ["-o", "remount,ro", dir]);
  return dir;
}
function unmount(): void {
  if (mountPoint) execFileSync("umount", [mountPoint]);
  mountPoint = null;
}

beforeAll(() => compileProject());
afterAll(() => unmount());

describe.skipIf(!isRoot)("the system refuses: full disk, read-only, permission denied", { timeout: 300_000 }, () => {
  it("a full disk: compute, freeze and build stop with exit 4, leave no temporary file, keep what was there", () => {
    const work = tempDir();
    writeFileSync(join(work, "plan.yaml"), SMALL);
    const disk = mountTmpfs(256);
    try {
      // A first, small run fits and is the previous output a later run must not damage.
      expect(cli(["compute", "plan.yaml", "--out", join(disk, "tables")], work).code).toBe(0);
      const before = listing(disk);
      writeFileSync(join(work, "plan.yaml"), LARGE);
      refusedBySystem(cli(["compute", "plan.yaml", "--out", join(disk, "tables")], work), /tables/, /no space left/);
      expect(listing(disk)).toEqual(before);
      expect(temporaries(disk)).toEqual([]);
      refusedBySystem(
        cli(["freeze", "plan.yaml", "-m", "m", "--archive", join(disk, "archive")], work),
        /archive/,
        /no space left/,
      );
      expect(listing(disk)).toEqual(before);
      refusedBySystem(
        cli(["export", "plan.yaml", "--format", "csv,json,md,tex,html", "--out", join(disk, "exports")], work),
        /exports/,
        /no space left/,
      );
      expect(listing(disk)).toEqual(before);
      mkdirSync(join(work, "scenarios"));
      writeFileSync(join(work, "scenarios/plan.yaml"), LARGE);
      refusedBySystem(
        cli(["build", "--scenarios", "scenarios", "--out", join(disk, "site"), "--skip-images"], work),
        /site|cosmoledger/,
        /no space left/,
      );
      expect(listing(disk)).toEqual(before);
      expect(temporaries(disk)).toEqual([]);
    } finally {
      unmount();
    }
  });

  it("a read-only file system: exit 4 naming the path, nothing written", () => {
    const work = tempDir();
    writeFileSync(join(work, "plan.yaml"), SMALL);
    const disk = mountTmpfs(256, true);
    try {
      refusedBySystem(
        cli(["compute", "plan.yaml", "--out", join(disk, "tables")], work),
        /tables/,
        /read-only; choose a writable/,
      );
      refusedBySystem(
        cli(["freeze", "plan.yaml", "--archive", join(disk, "archive")], work),
        /archive/,
        /read-only; choose a writable/,
      );
      expect(readdirSync(disk)).toEqual([]);
    } finally {
      unmount();
    }
  });

  it("permission denied on the scenario, the output and the archive (as user nobody): exit 4 naming the path", () => {
    const work = tempDir();
    chmodSync(work, 0o755);
    writeFileSync(join(work, "plan.yaml"), SMALL);
    // Made by root, so nobody can read the scenario or write into the folders.
    writeFileSync(join(work, "secret.yaml"), SMALL);
    chmodSync(join(work, "secret.yaml"), 0o600);
    mkdirSync(join(work, "tables"), { mode: 0o755 });
    mkdirSync(join(work, "archive"), { mode: 0o755 });
    refusedBySystem(cli(["check", "secret.yaml"], work, true), /secret\.yaml/, /permission denied/);
    // A samples file the user cannot read is the system refusing too (4), not a bad scenario (2).
    writeFileSync(join(work, "chain.csv"), "H0\n70\n");
    chmodSync(join(work, "chain.csv"), 0o600);
    writeFileSync(
      join(work, "spread.yaml"),
      "title: s\nmodels:\n  - { id: m, H0: 70, Omega_m: 0.3, spread: { samples: chain.csv } }\n",
    );
    refusedBySystem(cli(["check", "spread.yaml"], work, true), /chain\.csv/, /permission denied/);
    refusedBySystem(cli(["compute", "plan.yaml", "--out", "tables"], work, true), /tables/, /permission denied/);
    refusedBySystem(cli(["freeze", "plan.yaml", "--archive", "archive"], work, true), /archive/, /permission denied/);
    mkdirSync(join(work, "scenarios"), { mode: 0o755 });
    writeFileSync(join(work, "scenarios/plan.yaml"), SMALL);
    mkdirSync(join(work, "site"), { mode: 0o755 });
    refusedBySystem(
      cli(["build", "--scenarios", "scenarios", "--out", "site/www", "--skip-images"], work, true),
      /site/,
      /permission denied/,
    );
    expect(readdirSync(join(work, "site"))).toEqual([]);
    expect(readdirSync(join(work, "tables"))).toEqual([]);
    expect(readdirSync(join(work, "archive"))).toEqual([]);
    rmSync(work, { recursive: true, force: true });
  });
});
