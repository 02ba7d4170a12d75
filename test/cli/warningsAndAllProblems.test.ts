// Plausibility warnings printed like errors (file:line:column) and turned into errors by --strict; every
// problem of every file in one run; did-you-mean inside targets and surveys; YAML 1.2 booleans; `check FOLDER`.
// The ranges are those the README names (common practice: H0 between 20 and 150 km/s/Mpc, omega_b = Omega_b h^2
// about 0.022, Omega_b about 0.049, T_cmb = 2.7255 K from Fixsen 2009).
import { describe, expect, it, beforeAll } from "vitest";
import { existsSync, mkdirSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";

beforeAll(() => compileProject());

function scenarioIn(dir: string, name: string, models: string[], rest = ""): string {
  writeFileSync(join(dir, name), `title: T\nmodels:\n${models.map((m) => `  - ${m}\n`).join("")}${rest}`);
  return name;
}

describe("plausibility warnings", { timeout: 180_000 }, () => {
  it.each([
    [
      "{ id: a, H0: 0.7, Omega_m: 0.3 }",
      "models[0].H0",
      /H0 = 0\.7 km\/s\/Mpc lies outside 20 to 150 km\/s\/Mpc; it looks like h: did you mean 70\?/,
    ],
    ["{ id: a, H0: 700, Omega_m: 0.3 }", "models[0].H0", /H0 = 700 km\/s\/Mpc lies outside 20 to 150/],
    [
      "{ id: a, H0: 70, Omega_m: 0.3, omega_b: 0.06 }",
      "models[0].omega_b",
      /omega_b = 0\.06 is large .*did you mean Omega_b: 0\.06\?/,
    ],
    ["{ id: a, H0: 70, Omega_m: 0.3, Omega_b: 0.0224 }", "models[0].Omega_b", /did you mean omega_b: 0\.0224\?/],
    [
      "{ id: a, H0: 70, Omega_m: 0.3, T_cmb: 3.5 }",
      "models[0].T_cmb",
      /T_cmb = 3\.5 K is far from the measured 2\.7255 K/,
    ],
    ["{ id: a, H0: 70, Omega_m: 0.3, Omega_de: -0.2 }", "models[0]", /model a: recollapses: expansion stops/],
    [
      "{ id: a, H0: 70, Omega_m: 0.3, w0: -2.5, Omega_de: 0.7 }",
      "models[0]",
      /w0 = -2\.5 lies outside .* where the engine's 1e-10 accuracy is verified/,
    ],
  ])(
    "%s: a located warning; check passes, --strict fails with exit 2 and compute writes nothing",
    (model, path, message) => {
      const dir = tempDir();
      const file = scenarioIn(dir, "w.yaml", [model]);
      const r = runCli(["check", file], dir);
      expect(r.code, r.stderr).toBe(0);
      const line = r.stderr.split("\n").find((l) => l.includes(path) && message.test(l));
      expect(line, r.stderr).toMatch(new RegExp(`^warning: w\\.yaml:3:\\d+: ${path.replace(/[[\].]/g, "\\$&")}: `));
      const strict = runCli(["compute", file, "--strict", "--out", "out"], dir);
      expect(strict.code).toBe(2);
      expect(strict.stderr).toMatch(new RegExp(`error: w\\.yaml:3:\\d+: ${path.replace(/[[\].]/g, "\\$&")}: `));
      expect(strict.stderr).toMatch(/under --strict; nothing was written/);
      expect(existsSync(join(dir, "out"))).toBe(false);
    },
  );

  it("baryons above all matter: an error of the engine, with the warning that explains it beside it", () => {
    const dir = tempDir();
    const file = scenarioIn(dir, "b.yaml", ["{ id: a, H0: 70, Omega_m: 0.04, Omega_b: 0.05 }"]);
    const r = runCli(["check", file], dir);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/error: b\.yaml:3:\d+: models\[0\]: .*exceeds the cold matter plus baryons/);
    expect(r.stderr).toMatch(/warning: b\.yaml:3:\d+: models\[0\]\.Omega_b: .*exceeds all matter, Omega_m = 0\.04/);
    expect(r.stderr).toMatch(/^1 problem found/m); // warnings are not counted as problems
  });

  it("an inherited value is questioned once, where it is written; a plausible model says nothing", () => {
    const dir = tempDir();
    const file = scenarioIn(dir, "i.yaml", ["{ id: a, H0: 0.7, Omega_m: 0.3 }", "{ id: b, extends: a, w0: -0.9 }"]);
    const r = runCli(["check", file], dir);
    expect(r.stderr.match(/warning: .*H0 = 0\.7/g)).toHaveLength(1);
    const ok = scenarioIn(dir, "ok.yaml", ["{ id: a, H0: 67.7, Omega_m: 0.31, omega_b: 0.0224, T_cmb: 2.7255 }"]);
    expect(runCli(["check", ok], dir).stderr).toBe("");
  });

  it("build prints the warnings too, and build --strict leaves the site untouched", () => {
    const dir = tempDir();
    mkdirSync(join(dir, "scenarios"));
    scenarioIn(join(dir, "scenarios"), "w.yaml", ["{ id: a, H0: 0.7, Omega_m: 0.3 }"]);
    const strict = runCli(["build", "--scenarios", "scenarios", "--out", "site", "--skip-images", "--strict"], dir);
    expect(strict.code).toBe(2);
    expect(strict.stderr).toMatch(/error: scenarios\/w\.yaml:3:\d+: models\[0\]\.H0: H0 = 0\.7/);
    expect(existsSync(join(dir, "site"))).toBe(false);
    const b = runCli(["build", "--scenarios", "scenarios", "--out", "site", "--skip-images"], dir);
    expect(b.code, b.stderr).toBe(0);
    expect(b.stderr).toMatch(/warning: scenarios\/w\.yaml:3:\d+: models\[0\]\.H0/);
  });
});

describe("every problem in one run", { timeout: 180_000 }, () => {
  it("schema errors, cross-field errors, physics and warnings of one file are all reported at once", () => {
    const dir = tempDir();
    const file = scenarioIn(
      dir,
      "many.yaml",
      [
        "{ id: a, H0: seventy, Omega_m: 0.3, Omega_M: 0.2 }",
        "{ id: b, H0: 70, Omega_m: 0.3, Omega_k: 0.1, Omega_de: 0.6 }",
        "{ id: c, H0: 70, Omega_m: 0.3, Omega_b: 0.04, omega_b: 0.02 }",
        "{ id: d, extends: nowhere }",
        "{ id: e, H0: 70, Omega_m: 0.1, Omega_Lambda: 1.5 }",
        "{ id: f, H0: 0.7, Omega_m: 0.3 }",
        "{ id: g, H0: 70, Omega_m: 0.3, flat: yes }",
      ],
      "targets:\n  - { name: x, redshift: 2 }\nsurveys:\n  - { name: s, area: 10, z_min: 0.5, z_max: 0.2 }\n",
    );
    const r = runCli(["check", file], dir);
    expect(r.code).toBe(2);
    const expected: [string, RegExp][] = [
      ["models[0].Omega_M", /unknown key Omega_M\. did you mean Omega_m\?/],
      ["models[0].H0", /must be a number \(got "seventy"\)/],
      ["models[1].Omega_de", /curvature is over-determined/],
      ["models[2].omega_b", /baryons are over-determined/],
      ["models[3].extends", /extends unknown model nowhere/],
      ["models[4]", /no big bang/],
      ["models[5].H0", /looks like h: did you mean 70\?/],
      ["models[6].flat", /YAML 1\.2, where only true and false are booleans/],
      ["targets[0].redshift", /unknown key redshift\. did you mean z\?/],
      ["surveys[0].area", /unknown key area\. did you mean area_deg2\?/],
    ];
    for (const [path, message] of expected) {
      const line = r.stderr.split("\n").find((l) => l.includes(`: ${path}: `));
      expect(line, `${path} in:\n${r.stderr}`).toMatch(message);
    }
    // The consequences of a refused key are not repeated ("H0 is required" after H0: seventy).
    expect(r.stderr).not.toMatch(/models\[0\]: .*H0 is required/);
  });

  it("check FOLDER checks every scenario in it (not EISDIR), and an empty folder is named", () => {
    const dir = tempDir();
    mkdirSync(join(dir, "scenarios"));
    scenarioIn(join(dir, "scenarios"), "a.yaml", ["{ id: a, H0: 70, Omega_m: 0.3 }"]);
    writeFileSync(join(dir, "scenarios/b.yaml"), "title: B\nid: bee\nmodels:\n  - { id: a, H0: 70, Omega_m: 0.3 }\n");
    const r = runCli(["check", "scenarios/"], dir);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/ok: scenarios\/a\.yaml/);
    expect(r.stdout).toMatch(/ok: scenarios\/b\.yaml/);
    mkdirSync(join(dir, "empty"));
    const e = runCli(["check", "empty"], dir);
    expect(e.code).toBe(2);
    expect(e.stderr).toMatch(/empty: a folder with no scenario files/);
  });
});
