// Spreads through the command line: bad spreads and samples files are located input errors (exit 2, nothing
// written); a frozen version keeps its samples file so that verify recomputes it without the file.
import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { existsSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { availableParallelism } from "node:os";
import { join } from "node:path";
import { parseHTML } from "linkedom";
import { ROOT, runCli, tempDir } from "../helpers/buildDemoSite.js";

const HEAD = "title: spread\nredshifts: [1]\ngrid: { points: 20 }\nmodels:\n";

function project(yaml: string, files: Record<string, string> = {}) {
  const dir = tempDir("cosmoledger-spread-");
  writeFileSync(join(dir, "s.yaml"), yaml);
  for (const [name, text] of Object.entries(files)) writeFileSync(join(dir, name), text);
  return dir;
}

function refused(yaml: string, files: Record<string, string>, located: RegExp) {
  const dir = project(yaml, files);
  const r = runCli(["compute", "s.yaml", "--out", "out"], dir);
  expect(r.code, r.stderr).toBe(2);
  expect(r.stderr).toMatch(located);
  expect(r.stderr).not.toMatch(/\n\s+at /); // no stack trace
  expect(existsSync(join(dir, "out"))).toBe(false);
}

const samplesModel = "  - id: m\n    H0: 70\n    Omega_m: 0.3\n    spread: { samples: chain.csv }\n";

describe("bad spreads are located input errors", () => {
  it("a samples row with a missing cell names the file, line and the header", () =>
    refused(
      HEAD + samplesModel,
      { "chain.csv": "H0,Omega_m\n70,0.3\n71\n" },
      /chain\.csv:3:1: .*row has 1 cells but the header has 2 \(H0, Omega_m\)/,
    ));

  it("a non-numeric cell names its line and column", () =>
    refused(
      HEAD + samplesModel,
      { "chain.csv": "H0,Omega_m\n70,0.3\n71,zero\n" },
      /chain\.csv:3:4: .*Omega_m: "zero" is not a finite decimal number/,
    ));

  it("a negative weight is refused where it is written", () =>
    refused(
      HEAD + samplesModel,
      { "chain.csv": "H0,Omega_m,weight\n70,0.3,1\n71,0.31,-2\n" },
      /chain\.csv:3:9: .*weight -2 is negative/,
    ));

  it("a column that is not a parameter suggests the near key", () =>
    refused(
      HEAD + samplesModel,
      { "chain.csv": "H0,omega_M\n70,0.3\n" },
      /chain\.csv:1:4: .*column "omega_M" is not a parameter key; did you mean Omega_m\?/,
    ));

  it("a missing samples file is located at the spread's samples key", () =>
    refused(
      HEAD + samplesModel,
      {},
      /s\.yaml:8:24: models\[0\]\.spread\.samples: cannot read samples file chain\.csv: the path does not exist/,
    ));

  it("a correlation matrix that is not positive definite", () =>
    refused(
      `${HEAD}  - id: m\n    H0: 70\n    Omega_m: 0.3\n    w0: -1\n    spread:\n      normal: { H0: 1, Omega_m: 0.01, w0: 0.1 }\n      correlation: [[1, 0.9, 0.9], [0.9, 1, -0.9], [0.9, -0.9, 1]]\n`,
      {},
      /s\.yaml:11:20: models\[0\]\.spread\.correlation: correlation is not positive definite/,
    ));

  it("a correlation matrix that is not symmetric names the cell", () =>
    refused(
      `${HEAD}  - id: m\n    H0: 70\n    Omega_m: 0.3\n    spread:\n      normal: { H0: 1, Omega_m: 0.01 }\n      correlation: [[1, -0.5], [-0.4, 1]]\n`,
      {},
      /models\[0\]\.spread\.correlation\[1\]\[0\]: correlation is not symmetric: row 2 column 1 is -0.4 but row 1 column 2 is -0.5/,
    ));

  it("a key that is not a parameter, and a parameter the model cannot vary", () => {
    refused(
      `${HEAD}  - id: m\n    H0: 70\n    Omega_m: 0.3\n    spread: { normal: { n_s: 0.01 } }\n`,
      {},
      /models\[0\]\.spread\.normal\.n_s: n_s is not a parameter a spread can vary; valid: H0, Omega_m/,
    );
    refused(
      `${HEAD}  - id: m\n    H0: 70\n    Omega_m: 0.3\n    spread: { normal: { omega_b: 0.001 } }\n`,
      {},
      /models\[0\]\.spread\.normal\.omega_b: omega_b cannot vary: this model has no baryon density; set omega_b first/,
    );
  });

  it("a samples file outside the scenario's folder is refused (no ..), and long cells are quoted short", () => {
    refused(
      `${HEAD}  - id: m\n    H0: 70\n    Omega_m: 0.3\n    spread: { samples: ../chain.csv }\n`,
      {},
      /models\[0\]\.spread\.samples: samples must name a file inside the scenario's folder or below it, without "\.\."/,
    );
    const long = "x".repeat(5000);
    const dir = project(HEAD + samplesModel, { "chain.csv": `H0,Omega_m\n70,${long}\n` });
    const r = runCli(["compute", "s.yaml", "--out", "out"], dir);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/Omega_m: "x{39}\u2026" is not a finite decimal number/);
    expect(r.stderr.length).toBeLessThan(1000);
  });

  it("a spread whose every draw is rejected is an input error at the model", () =>
    refused(
      `${HEAD}  - { id: m, H0: 70, Omega_m: 0.3, spread: { normal: { H0: 1e308 } } }\n`,
      {},
      /s\.yaml:5:5: models\[0\]: model m: every one of the 1000 draws of its spread was rejected \(1000 outside the accepted range\)/,
    ));

  it("models' errors are reported in model order, whether a spread or the model itself fails", () => {
    // Every model's own tables are computed before any spread (so that the draws' code is optimised once); the
    // first model in the file that fails is still the one reported. The second model sits next to a loitering model
    // (Omega_Lambda = 1.35 for Omega_m = 0.1 is critical; closed form, common practice), which the engine refuses.
    const spreadFails = "  - { id: m, H0: 70, Omega_m: 0.3, spread: { normal: { H0: 1e308 } } }\n";
    const modelFails = "  - { id: l, H0: 70, Omega_m: 0.1, Omega_Lambda: 1.34999999, radiation: none }\n";
    refused(`${HEAD}${spreadFails}${modelFails}`, {}, /s\.yaml:5:5: models\[0\]: model m: every one of the 1000 draws/);
    refused(`${HEAD}${modelFails}${spreadFails}`, {}, /s\.yaml:5:5: models\[0\]: model l: .*cannot compute this model/);
  });

  it("spreads too large for the document are refused with the limit named", () =>
    refused(
      "title: big\nredshifts: [1]\ngrid: { points: 5000 }\ndraws: { count: 20 }\nmodels:\n  - { id: a, H0: 70, Omega_m: 0.3, spread: { normal: { H0: 1 } } }\n  - { id: b, extends: a }\n  - { id: c, extends: a }\n",
      {},
      /the spreads would band 15003 rows .*at most 10000 are allowed/,
    ));

  it("a samples file above the documented 4 MiB is refused before freezing, naming the limit", () => {
    const row = "70.000000000,0.3000000000\n";
    const big = `H0,Omega_m\n${row.repeat(Math.ceil((4 * 1024 * 1024) / row.length) + 1)}`;
    refused(HEAD + samplesModel, { "chain.csv": big }, /has \d+ bytes; at most 4194304 \(4 MiB\) are allowed/);
  });
});

describe("a frozen version keeps its samples file", () => {
  it("verify recomputes it without the file; an edited file is a new version", () => {
    // Twenty rows, the least a samples file may hold (invented values spread around the model).
    const chain = [
      "H0,Omega_m,weight",
      ...Array.from({ length: 20 }, (_, i) => `${69 + 0.15 * i},${(0.32 - 0.002 * i).toFixed(3)},${1 + (i % 3)}`),
    ].join("\n");
    const dir = project(HEAD + samplesModel, { "chain.csv": chain });
    expect(runCli(["freeze", "s.yaml", "--archive", "archive", "-m", "with chain"], dir).code).toBe(0);
    const v1 = JSON.parse(readFileSync(join(dir, "archive/s/v1.json"), "utf8"));
    expect(v1.format).toBe("cosmoledger.version/3");
    expect(v1.attachments).toEqual([
      { path: "chain.csv", sha256: expect.stringMatching(/^[0-9a-f]{64}$/), text: chain },
    ]);
    expect(v1.tables.models[0].spread.accepted).toBe(20);
    rmSync(join(dir, "chain.csv"));
    const v = runCli(["verify", "--archive", "archive", "--strict"], dir);
    expect(v.code, v.stderr).toBe(0);
    expect(v.stdout).toMatch(/every archived number reproduces/);
    // The same scenario text with another chain is another version (the file's SHA-256 is part of the inputs).
    writeFileSync(join(dir, "chain.csv"), `${chain}\n72.0,0.27,1\n`);
    const f = runCli(["freeze", "s.yaml", "--archive", "archive", "-m", "new chain"], dir);
    expect(f.code, f.stderr).toBe(0);
    expect(f.stdout).toMatch(/froze s version 2/);
  });
});

describe("a helper thread evaluates draws beside the main thread", () => {
  it("the helper thread takes part of the draws, and the numbers are the same bytes as on one thread", () => {
    const run = (env: Record<string, string>) => {
      const r = spawnSync(process.execPath, [join(ROOT, "test/helpers/drawPoolProbe.mjs")], {
        encoding: "utf8",
        env: { ...process.env, ...env },
      });
      expect(r.status, r.stderr).toBe(0);
      return JSON.parse(r.stdout) as { helperDraws: number; count: number; hash: string };
    };
    const one = run({ COSMOLEDGER_DRAW_THREADS: "1" });
    expect(one.helperDraws).toBe(0);
    const two = run({});
    expect(two.hash).toBe(one.hash);
    // On two or more cores the helper, started and idle before the job, claims some of the 2,000 draws while the
    // main thread spends a few hundred milliseconds on its own share.
    if (availableParallelism() >= 2) {
      expect(two.helperDraws).toBeGreaterThan(0);
      expect(two.helperDraws).toBeLessThan(two.count);
    }
  });

  it("the tables document is byte-identical with the helper thread and without it", () => {
    // 500 draws x (2 redshifts + 120 grid points) is above the size at which the helper thread is used.
    const yaml = `title: threads\nredshifts: [0.5, 2]\ngrid: { points: 120 }\ndraws: { count: 500, seed: 9 }\nmodels:\n  - id: m\n    H0: 70\n    Omega_m: 0.3\n    omega_b: 0.0224\n    m_nu_eV: [0.06]\n    spread: { normal: { H0: 1, Omega_m: 0.01, omega_b: 0.0002 } }\n  - { id: n, extends: m, Omega_k: 0.02 }\n`;
    const dir = project(yaml);
    const two = runCli(["compute", "s.yaml", "--out", "two"], dir);
    expect(two.code, two.stderr).toBe(0);
    const one = runCli(["compute", "s.yaml", "--out", "one"], dir, { COSMOLEDGER_DRAW_THREADS: "1" });
    expect(one.code, one.stderr).toBe(0);
    const a = readFileSync(join(dir, "two/s/tables.json"), "utf8");
    expect(readFileSync(join(dir, "one/s/tables.json"), "utf8")).toBe(a);
    expect(JSON.parse(a).models[1].spread.accepted).toBe(500);
  });
});

describe("quote with a published set", () => {
  it("answers with the set's central values and cites it, marking values not yet checked against the table", () => {
    const r = runCli([
      "quote",
      "--model",
      "id=planck extends=published/planck2018-ttteee-lowe-lensing-bao",
      "--z",
      "2",
      "--quantities",
      "age0",
    ]);
    expect(r.code, r.stderr).toBe(0);
    // Planck 2018 VI, Table 2, last column: age 13.787 +/- 0.020 Gyr (recalled from memory); the quote prints 6 figures.
    const age = Number(/age0\s+\[Gyr\]\s+([\d.]+)/.exec(r.stdout)?.[1]);
    expect(Math.abs(age - 13.787)).toBeLessThan(0.02);
    expect(r.stdout).toMatch(
      /published sets:\n {2}planck: Planck 2018, TT,TE,EE\+lowE\+lensing\+BAO: A&A 641, A6 \(2020\), arXiv:1807\.06209, Table 2.*; H0, Omega_m, omega_b not yet checked against the published table/,
    );
  });
});

describe("the diff page of two versions names a changed spread", () => {
  it("lists the draws' seed and the spread's uncertainties among the resolved inputs that changed", () => {
    const v1 = `${HEAD.replace("models:", "draws: { count: 40, seed: 1 }\nmodels:")}  - { id: m, H0: 70, Omega_m: 0.3, spread: { normal: { H0: 1 } } }\n`;
    const dir = project(v1);
    expect(runCli(["freeze", "s.yaml", "--archive", "archive", "-m", "one"], dir).code).toBe(0);
    writeFileSync(join(dir, "s.yaml"), v1.replace("seed: 1", "seed: 2").replace("H0: 1 }", "H0: 2 }"));
    expect(runCli(["freeze", "s.yaml", "--archive", "archive", "-m", "two"], dir).code).toBe(0);
    const b = runCli(
      ["build", "--scenarios", ".", "--archive", "archive", "--out", "site", "--skip-images", "--quiet"],
      dir,
    );
    expect(b.code, b.stderr).toBe(0);
    const page = parseHTML(readFileSync(join(dir, "site/s/diff/v1-v2/index.html"), "utf8")).document;
    const rows = [...page.querySelectorAll("tr")].map((r) => (r.textContent ?? "").replace(/\s+/g, " "));
    expect(rows.some((r) => /draws .*"seed":1.*"seed":2/.test(r))).toBe(true);
    expect(rows.some((r) => /spread .*"plus":1.*"plus":2/.test(r))).toBe(true);
  });
});
