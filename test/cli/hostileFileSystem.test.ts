// Hostile input and a hostile file system: every case ends with a documented exit status and a one-line message
// naming the path, never a stack trace or a hang, and leaves no temporary file. The rules are the README's (exit
// statuses, limits) and common practice for command-line tools on a shared server.
import { describe, expect, it, beforeAll } from "vitest";
import { execFileSync, spawnSync } from "node:child_process";
import {
  existsSync,
  mkdirSync,
  readFileSync,
  readdirSync,
  renameSync,
  rmSync,
  symlinkSync,
  writeFileSync,
} from "node:fs";
import { join } from "node:path";
import { BIN, compileProject, tempDir } from "../helpers/buildDemoSite.js";
import { versionHash } from "../../src/contract/versionRecord.js";

const GOOD = "title: T\nid: good\nmodels:\n  - { id: a, H0: 70, Omega_m: 0.3 }\n";

/** Runs the CLI with a deadline: a hang fails the test instead of stalling the suite. */
function cli(args: string[], cwd: string) {
  const r = spawnSync(process.execPath, [BIN, ...args], { cwd, encoding: "utf8", timeout: 120_000 });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr, signal: r.signal };
}
/** A documented failure: the status given, a message naming `path`, no stack trace. */
function refused(r: ReturnType<typeof cli>, status: number, path: RegExp) {
  expect(r.signal, "the command hung and was killed").toBeNull();
  expect(r.code, r.stderr).toBe(status);
  expect(r.stderr).toMatch(path);
  expect(r.stderr).not.toMatch(/unexpected failure|\n\s+at /);
}
const temps = (dir: string): string[] =>
  readdirSync(dir, { recursive: true, encoding: "utf8" }).filter((f) =>
    /\.tmp|\.writing-|\.previous-|\.building-/.test(f),
  );

beforeAll(() => compileProject());

describe("bytes that are not text", { timeout: 180_000 }, () => {
  it.each([
    [
      "a NUL in a scalar",
      Buffer.from("title: T\u0000x\nmodels: []\n"),
      /x\.yaml:1:9: control character U\+0000 \(NUL\)/,
    ],
    [
      "invalid UTF-8",
      Buffer.concat([Buffer.from("title: T\nid: t\nauthor: "), Buffer.from([0xff, 0xfe]), Buffer.from("\n")]),
      /x\.yaml:3:9: byte 0xff is not valid UTF-8/,
    ],
    [
      "a Latin-1 file",
      Buffer.from("title: Caf\xe9\nmodels: []\n", "latin1"),
      /x\.yaml:1:11: byte 0xe9 is not valid UTF-8/,
    ],
  ])("%s is refused with its line and column (exit 2), not turned into U+FFFD", (_, bytes, message) => {
    const dir = tempDir();
    writeFileSync(join(dir, "x.yaml"), bytes);
    for (const command of ["check", "compute"])
      refused(
        cli(
          [command, "x.yaml", "--quiet"].filter((a) => command === "compute" || a !== "--quiet"),
          dir,
        ),
        2,
        message,
      );
    expect(existsSync(join(dir, "out"))).toBe(false);
  });
});

describe("the file system says no", { timeout: 180_000 }, () => {
  it("a FIFO, a folder or a dangling link named *.yaml is refused by name; nothing hangs", () => {
    const dir = tempDir();
    mkdirSync(join(dir, "scenarios"));
    writeFileSync(join(dir, "scenarios/good.yaml"), GOOD);
    execFileSync("mkfifo", [join(dir, "scenarios/pipe.yaml")]);
    mkdirSync(join(dir, "scenarios/folder.yaml"));
    symlinkSync(join(dir, "nowhere.yaml"), join(dir, "scenarios/dangling.yaml"));
    refused(cli(["check", "scenarios/pipe.yaml"], dir), 2, /scenarios\/pipe\.yaml:1:1: the path is not a regular file/);
    const b = cli(["build", "--scenarios", "scenarios", "--out", "site", "--skip-images"], dir);
    refused(b, 2, /scenarios\/dangling\.yaml:1:1: the path is a symbolic link whose target does not exist/);
    expect(b.stderr).toMatch(/scenarios\/folder\.yaml:1:1: the path is a folder/);
    expect(b.stderr).toMatch(/scenarios\/pipe\.yaml:1:1: the path is not a regular file/);
    expect(existsSync(join(dir, "site"))).toBe(false);
  });

  it("--out that is a file, or an output folder that is a file, is refused (exit 2)", () => {
    const dir = tempDir();
    writeFileSync(join(dir, "good.yaml"), GOOD);
    writeFileSync(join(dir, "out-file"), "x");
    refused(cli(["compute", "good.yaml", "--out", "out-file"], dir), 2, /out-file is a file, not a folder/);
    mkdirSync(join(dir, "out"));
    writeFileSync(join(dir, "out/good"), "x");
    refused(cli(["compute", "good.yaml", "--out", "out"], dir), 2, /out\/good: it exists and is not a folder/);
    refused(
      cli(["build", "--scenarios", ".", "--out", "out-file", "--skip-images"], dir),
      2,
      /out-file is a file, not a folder/,
    );
    expect(readFileSync(join(dir, "out-file"), "utf8")).toBe("x");
    expect(temps(dir)).toEqual([]);
  });

  it("--out or OUT/<id> that is a dangling symbolic link is refused by name (exit 2) and the link is kept", () => {
    const dir = tempDir();
    writeFileSync(join(dir, "good.yaml"), GOOD);
    symlinkSync(join(dir, "gone"), join(dir, "link-out"));
    refused(
      cli(["compute", "good.yaml", "--out", "link-out"], dir),
      2,
      /link-out is a symbolic link whose target does not exist/,
    );
    mkdirSync(join(dir, "out"));
    symlinkSync(join(dir, "gone-too"), join(dir, "out/good"));
    refused(
      cli(["compute", "good.yaml", "--out", "out"], dir),
      2,
      /out\/good: it is a symbolic link whose target does not exist/,
    );
    expect(readdirSync(join(dir, "out"))).toEqual(["good"]);
    expect(temps(dir)).toEqual([]);
  });

  it("a path the system refuses (permission, read-only, no such device) is one line and exit 4, nothing half-written", () => {
    const dir = tempDir();
    writeFileSync(join(dir, "good.yaml"), GOOD);
    // /proc and /sys refuse new folders even to root: the same class as a read-only or full file system.
    refused(
      cli(["compute", "good.yaml", "--out", "/proc/cosmoledger-test"], dir),
      4,
      /\/proc\/cosmoledger-test.*: cannot mkdir it: /,
    );
    refused(
      cli(["freeze", "good.yaml", "--archive", "/sys/cosmoledger-test"], dir),
      4,
      /\/sys\/cosmoledger-test.*: cannot mkdir it: /,
    );
    expect(temps(dir)).toEqual([]);
  });

  it("build --out that is the user's symbolic link builds into its target and keeps the link", () => {
    const dir = tempDir();
    mkdirSync(join(dir, "scenarios"));
    writeFileSync(join(dir, "scenarios/good.yaml"), GOOD);
    mkdirSync(join(dir, "webroot"));
    symlinkSync(join(dir, "webroot"), join(dir, "site"));
    const b = cli(["build", "--scenarios", "scenarios", "--out", "site", "--skip-images"], dir);
    expect(b.code, b.stderr).toBe(0);
    expect(existsSync(join(dir, "webroot/good/index.html"))).toBe(true);
    expect(readdirSync(dir).sort()).toEqual(["scenarios", "site", "webroot"]);
    expect(cli(["build", "--scenarios", "scenarios", "--out", "site", "--skip-images"], dir).code).toBe(0); // again
    expect(existsSync(join(dir, "webroot/good/index.html"))).toBe(true);
  });
});

describe("the archive refuses damage and notices losses", { timeout: 180_000 }, () => {
  function archive(): string {
    const dir = tempDir();
    mkdirSync(join(dir, "scenarios"));
    writeFileSync(join(dir, "scenarios/good.yaml"), GOOD);
    expect(cli(["freeze", "scenarios/good.yaml", "-m", "one"], dir).code).toBe(0);
    writeFileSync(join(dir, "scenarios/good.yaml"), GOOD.replace("H0: 70", "H0: 71"));
    expect(cli(["freeze", "scenarios/good.yaml", "-m", "two"], dir).code).toBe(0);
    return dir;
  }

  it("a deleted newest version, or a deleted scenario folder, is reported (heads.json)", () => {
    const a = archive();
    rmSync(join(a, "scenarios/archive/good/v2.json"));
    refused(
      cli(["verify", "--archive", "scenarios/archive"], a),
      2,
      /archive\/good: ends at v1, but heads\.json records v2: the newest version was deleted/,
    );
    refused(cli(["freeze", "scenarios/good.yaml"], a), 2, /ends at v1/);
    const b = archive();
    rmSync(join(b, "scenarios/archive/good"), { recursive: true });
    refused(
      cli(["verify", "--archive", "scenarios/archive"], b),
      2,
      /archive\/good: is missing: heads\.json records its version 2/,
    );
  });

  it("a duplicate key in a record, a stray huge version number and dangling links are damage, found at once", () => {
    const a = archive();
    const v2 = join(a, "scenarios/archive/good/v2.json");
    const text = readFileSync(v2, "utf8");
    writeFileSync(v2, text.replace('"message":"two"', '"message":"two","message":"other"'));
    refused(
      cli(["verify", "--archive", "scenarios/archive"], a),
      2,
      /good\/v2\.json: not valid JSON \(duplicate key "message"/,
    );
    writeFileSync(v2, text);
    const r = JSON.parse(text);
    r.version = 100000000;
    r.sha256 = versionHash(r);
    writeFileSync(join(a, "scenarios/archive/good/v100000000.json"), JSON.stringify(r));
    refused(
      cli(["verify", "--archive", "scenarios/archive"], a),
      2,
      /v3 to v99999999 were deleted or never landed \(v100000000 is an implausible version number/,
    );
    rmSync(join(a, "scenarios/archive/good/v100000000.json"));
    renameSync(v2, join(a, "v2-elsewhere.json"));
    symlinkSync(join(a, "gone.json"), v2);
    refused(
      cli(["verify", "--archive", "scenarios/archive"], a),
      2,
      /good\/v2\.json: the path is a symbolic link whose target does not exist/,
    );
    symlinkSync(join(a, "no-archive"), join(a, "dangling-archive"));
    refused(cli(["verify", "--archive", "dangling-archive"], a), 2, /dangling-archive/);
    refused(
      cli(["freeze", "scenarios/good.yaml", "--archive", "dangling-archive"], a),
      2,
      /dangling-archive is a symbolic link whose target does not exist/,
    );
  });
});

describe("limits that hold", { timeout: 300_000 }, () => {
  it("100,000 unknown keys are refused at the key limit; a file above the size limit is refused unread", () => {
    const dir = tempDir();
    const keys = Array.from({ length: 100_000 }, (_, i) => `k${i}: 1`).join("\n");
    writeFileSync(join(dir, "many.yaml"), `title: T\nmodels: []\n${keys}\n`);
    refused(cli(["check", "many.yaml"], dir), 2, /many\.yaml:\d+:\d+: .*more than 50000 keys/);
    writeFileSync(join(dir, "big.yaml"), `title: T\n#${"x".repeat(3 * 1024 * 1024)}\n`);
    refused(
      cli(["check", "big.yaml"], dir),
      2,
      /big\.yaml:1:1: the file is \d+ bytes; scenario files may be at most 2097152 bytes/,
    );
  });

  it("inputs that would overflow double precision are refused where they are written", () => {
    const dir = tempDir();
    writeFileSync(
      join(dir, "h.yaml"),
      "title: T\nmodels:\n  - { id: a, H0: 1.0e-300, Omega_m: 0.3, radiation: none }\n",
    );
    refused(cli(["check", "h.yaml"], dir), 2, /h\.yaml:3:\d+: models\[0\]\.H0: /);
    writeFileSync(
      join(dir, "d.yaml"),
      `${GOOD}surveys:\n  - { name: S, area_deg2: 10, z_min: 0.1, z_max: 0.2, density_per_Mpc3: 1.0e+308 }\n`,
    );
    refused(cli(["check", "d.yaml"], dir), 2, /d\.yaml:6:\d+: surveys\[0\]\.density_per_Mpc3: /);
  });

  it("a model the engine cannot compute to its accuracy (next to a loitering model) is a located input error", () => {
    // Omega_m = 0.1 loiters at Omega_Lambda = 4 Omega_m cosh^3(arccosh((1 - Omega_m)/Omega_m) / 3) = 1.35 (closed
    // form for the critical model with matter and a cosmological constant; common practice).
    const dir = tempDir();
    writeFileSync(
      join(dir, "l.yaml"),
      "title: T\nmodels:\n  - { id: a, H0: 70, Omega_m: 0.1, Omega_Lambda: 1.34999999, radiation: none }\n",
    );
    for (const command of ["check", "compute"])
      refused(cli([command, "l.yaml"], dir), 2, /l\.yaml:3:\d+: models\[0\]: model a: .*cannot compute this model/);
    // How close: with radiation off, E^2(x = 1 + z) = 0.1 x^3 + (0.9 - Omega_Lambda) x^2 + Omega_Lambda has its
    // minimum at x = 3 (z = 2) for the critical model, where it equals 8 (1.35 - Omega_Lambda) = 8e-8 here.
    refused(
      cli(["check", "l.yaml"], dir),
      2,
      /\(H\/H0\)\^2 falls to 8\.0e-8 at z = 2\.000; 0 there would be a static point/,
    );
    // Just past the critical model it bounced: the scan for the turnaround misses so shallow a dip, and the
    // message says so, with the (negative) depth, instead of an unexpected failure.
    writeFileSync(
      join(dir, "b.yaml"),
      "title: T\nmodels:\n  - { id: a, H0: 70, Omega_m: 0.1, Omega_Lambda: 1.35000001, radiation: none }\n",
    );
    // Ahead: Omega_m = 3.2, Omega_Lambda = 0.2 (closed) has a double root of E^2 at a = 2 (E^2 = 3.2 x^3 + Omega_k x^2
    // + Omega_Lambda and its derivative vanish at x = 1/a = 1/2), an Einstein static state approached forever; with
    // Omega_Lambda = 0.2 + 1e-9 the minimum there is 0.4 - 0.25 (2.4 + 1e-9) - 0.4 + 0.2 + 1e-9 = 7.5e-10.
    writeFileSync(
      join(dir, "f.yaml"),
      "title: T\nmodels:\n  - { id: a, H0: 70, Omega_m: 3.2, Omega_Lambda: 0.200000001, radiation: none }\n",
    );
    refused(cli(["check", "f.yaml"], dir), 2, /approaches a static state ahead .*falls to 7\.5e-10 near a = 2\.000/);
    refused(
      cli(["check", "b.yaml"], dir),
      2,
      /b\.yaml:3:\d+: models\[0\]: model a: .*no big bang: .*falls to -8\.0e-8 near z = 2\.000/,
    );
  });
});
