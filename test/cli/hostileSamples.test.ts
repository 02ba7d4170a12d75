// Hostile input through the newer doors: samples files (links out of the folder, huge and sparse files, NUL in a
// path, one file under many spellings, numbers that are not decimal, a "#" inside a cell, overflowing weights, a
// one-row chain, bytes that are not UTF-8), quote's arguments and --save, and frozen versions read from their record
// alone. Every refusal: a located message, exit 2 (4 where the system refuses), no stack trace, nothing written.
import { describe, expect, it } from "vitest";
import {
  closeSync,
  existsSync,
  mkdirSync,
  openSync,
  readdirSync,
  readFileSync,
  rmSync,
  symlinkSync,
  writeFileSync,
  ftruncateSync,
} from "node:fs";
import { join } from "node:path";
import { compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";

const HEAD = "title: Hostile samples\nid: hostile-samples\ndraws: { count: 20, seed: 1 }\nmodels:\n";
const model = (samples: string) =>
  `  - { id: m, H0: 70, Omega_m: 0.3, spread: { samples: ${JSON.stringify(samples)} } }\n`;
/** A valid chain of `rows` rows around H0 = 70, Omega_m = 0.3 (made up for the test). */
const chain = (rows = 20) =>
  ["H0,Omega_m", ...Array.from({ length: rows }, (_, i) => `${69 + 0.1 * i},${(0.31 - 0.001 * i).toFixed(3)}`)].join(
    "\n",
  );

function project(yaml: string, files: Record<string, string | Buffer> = {}): string {
  const dir = tempDir("cosmoledger-hostile-samples-");
  mkdirSync(join(dir, "scenarios"));
  writeFileSync(join(dir, "scenarios/s.yaml"), yaml);
  for (const [name, text] of Object.entries(files)) writeFileSync(join(dir, "scenarios", name), text);
  return dir;
}

/** A refusal as every command must give it: exit 2, the message, no stack trace, nothing written. */
function refused(dir: string, message: RegExp, command = ["compute", "scenarios/s.yaml", "--out", "out"]) {
  const r = runCli(command, dir);
  expect(r.code, r.stderr).toBe(2);
  expect(r.stderr).toMatch(message);
  expect(r.stderr).not.toMatch(/\n\s+at /);
  expect(existsSync(join(dir, "out"))).toBe(false);
  return r;
}

describe("samples files stay inside the scenario's folder and are read only when they may be", {
  timeout: 300_000,
}, () => {
  it("a symbolic link out of the folder is refused without reading its target", () => {
    compileProject();
    const dir = project(HEAD + model("link.csv"));
    symlinkSync("/etc/passwd", join(dir, "scenarios/link.csv"));
    const r = refused(dir, /s\.yaml:\d+:\d+: models\[0\]\.spread\.samples: .*leads outside the scenario's folder/);
    expect(r.stderr).not.toMatch(/root:/);
    // A link to a valid chain elsewhere, and a linked folder, are refused the same way.
    const outside = tempDir();
    writeFileSync(join(outside, "chain.csv"), chain());
    const other = project(HEAD + model("far.csv"));
    symlinkSync(join(outside, "chain.csv"), join(other, "scenarios/far.csv"));
    refused(other, /leads outside the scenario's folder/);
    const folder = project(HEAD + model("linked/chain.csv"));
    symlinkSync(outside, join(folder, "scenarios/linked"), "dir");
    refused(folder, /leads outside the scenario's folder/);
    // freeze refuses it too, and writes no record.
    refused(folder, /leads outside the scenario's folder/, ["freeze", "scenarios/s.yaml", "-m", "x"]);
    expect(existsSync(join(folder, "scenarios/archive"))).toBe(false);
  });

  it("a 3 GiB sparse file is refused from its size, before a byte is read; a NUL in the path is located", () => {
    const dir = project(HEAD + model("huge.csv"));
    const fd = openSync(join(dir, "scenarios/huge.csv"), "w");
    ftruncateSync(fd, 3 * 1024 ** 3);
    closeSync(fd);
    refused(dir, /has 3221225472 bytes; at most 4194304 \(4 MiB\).*it was not read/);
    const nul = project(`${HEAD}  - { id: m, H0: 70, Omega_m: 0.3, spread: { samples: "a\\0b.csv" } }\n`);
    refused(nul, /models\[0\]\.spread\.samples: .*control character/);
  });

  it("one file under many spellings is one attachment of the record", () => {
    const spellings = ["a.csv", "./a.csv", ".//a.csv", "././a.csv"];
    const yaml =
      HEAD +
      spellings
        .map((s, i) => `  - { id: m${i}, H0: 70, Omega_m: 0.3, spread: { samples: ${JSON.stringify(s)} } }\n`)
        .join("");
    const dir = project(yaml, { "a.csv": chain() });
    const r = runCli(["freeze", "scenarios/s.yaml", "-m", "spellings"], dir);
    expect(r.code, r.stderr).toBe(0);
    const record = JSON.parse(readFileSync(join(dir, "scenarios/archive/hostile-samples/v1.json"), "utf8"));
    expect(record.attachments.map((a: { path: string }) => a.path)).toEqual(["a.csv"]);
    // The record alone recomputes every model.
    rmSync(join(dir, "scenarios/a.csv"));
    expect(runCli(["verify", "--archive", "scenarios/archive", "--strict"], dir).code).toBe(0);
  });

  it("cells are decimal numbers; # inside a cell is text; weights must add up; a chain needs 20 rows; UTF-8 only", () => {
    const with_ = (text: string | Buffer) => project(HEAD + model("c.csv"), { "c.csv": text });
    refused(with_(`${chain(19)}\n0x46,0.3\n`), /c\.csv:21:1: .*H0: "0x46" is not a finite decimal number/);
    refused(with_(`${chain(19)}\n70,0.31#5\n`), /c\.csv:21:\d+: .*Omega_m: "0\.31#5" is not a finite decimal number/);
    refused(with_(`${chain(19)}\n70,Infinity\n`), /"Infinity" is not a finite decimal number/);
    const heavy = `H0,Omega_m,weight\n${Array.from({ length: 20 }, (_, i) => `${69 + 0.1 * i},0.3,1e308`).join("\n")}\n`;
    refused(with_(heavy), /c\.csv:1:\d+: .*weights add up to more than a double can hold/);
    refused(with_("H0,Omega_m\n70,0.3\n"), /c\.csv:1:1: .*has 1 row; at least 20 are needed/);
    const latin1 = Buffer.concat([Buffer.from(`${chain(19)}\n70,0.3 `), Buffer.from([0xe9]), Buffer.from("\n")]);
    refused(with_(latin1), /samples\.?.*not UTF-8 text: byte 0xe9 at line 21, column 8/);
    // A comment line is still a comment.
    const commented = with_(`# a comment line\n${chain()}\n`);
    expect(runCli(["compute", "scenarios/s.yaml", "--out", "out"], commented).code).toBe(0);
  });

  it("a frozen version exports from its record alone, though its samples file has since gone", () => {
    const dir = project(HEAD + model("chain.csv"), { "chain.csv": chain() });
    expect(runCli(["freeze", "scenarios/s.yaml", "-m", "with chain"], dir).code).toBe(0);
    rmSync(join(dir, "scenarios/chain.csv"));
    const r = runCli(["export", "scenarios/s.yaml", "--version", "1", "--format", "csv", "--out", "exp"], dir);
    expect(r.code, r.stderr).toBe(0);
    expect(readdirSync(join(dir, "exp/hostile-samples/v1")).length).toBeGreaterThan(10);
  });
});

describe("quote keeps its promises", { timeout: 300_000 }, () => {
  it("quotes a scenario file with a samples file beside it (the demo's forecast)", () => {
    const r = runCli(["quote", "scenarios/saltmarsh-forecast.yaml", "--z", "1", "--quantities", "D_L"]);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/D_L/);
  });

  it("3,000 redshifts and 400 models are within the limits and are answered", () => {
    const zs = Array.from({ length: 3000 }, (_, i) => ((i + 1) / 1000).toString()).join(",");
    const many = runCli(["quote", "--model", "H0=70 Omega_m=0.3", "--z", zs, "--quantities", "D_L", "--format", "csv"]);
    expect(many.code, many.stderr.slice(0, 400)).toBe(0);
    expect(many.stdout.split("\n").filter((l) => l.startsWith('"z = ') || l.startsWith("z = ")).length).toBe(3000);
    const models = Array.from({ length: 400 }, (_, i) => ["--model", `H0=${60 + (i % 30)} Omega_m=0.3`]).flat();
    const wide = runCli(["quote", ...models, "--z", "1", "--quantities", "D_L", "--format", "json"]);
    expect(wide.code, wide.stderr.slice(0, 400)).toBe(0);
    expect(JSON.parse(wide.stdout).table.columns.length).toBe(400);
  });

  it("--save that the system refuses leaves no file and says which; numbers are decimal only", () => {
    const dir = tempDir();
    writeFileSync(join(dir, "a-file"), "x");
    const r = runCli(["quote", "--model", "H0=70 Omega_m=0.3", "--z", "1", "--save", "a-file/q.yaml"], dir);
    expect(r.code).toBe(4);
    expect(r.stderr).toMatch(/--save a-file\/q\.yaml: the file system refused to write it \(ENOTDIR/);
    expect(r.stderr).not.toMatch(/--out/);
    expect(readdirSync(dir)).toEqual(["a-file"]);
    const hex = runCli(["quote", "--model", "H0=70 Omega_m=0.3", "--z", "0x10"], dir);
    expect(hex.code).toBe(2);
    expect(hex.stderr).toMatch(/--z 0x10: "0x10" is not a decimal number/);
  });
});
