// Frozen versions, history, diffs and verification, end to end through the CLI (compiled by `npm test`).
// Expected numbers are closed forms: the Hubble distance c/H0 with c = 299792.458 km/s (SI definition of c).
import { beforeAll, describe, expect, it } from "vitest";
import { spawn } from "node:child_process";
import { existsSync, mkdirSync, readFileSync, readdirSync, renameSync, rmSync, writeFileSync, statSync } from "node:fs";
import { join } from "node:path";
import { parseHTML } from "linkedom";
import { BIN, compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";
import { sealVersion, versionHash, type VersionRecord } from "../../src/contract/versionRecord.js";

const C_KM_S = 299792.458; // SI definition of the speed of light

const scenario = (h0: number, extra = "") =>
  [
    "id: shelf-test",
    "title: Archive test scenario",
    "redshifts: [0.5, 1, 2]",
    "grid: { z_max: 3, points: 20, spacing: linear }",
    "models:",
    "  - id: base",
    `    H0: ${h0}`,
    "    Omega_m: 0.3",
    "    flat: true",
    "    radiation: none",
    extra,
    "",
  ].join("\n");

const page = (file: string) => parseHTML(readFileSync(file, "utf8")).document;
const hubbleDistanceCell = (doc: Document) => {
  const row = [...doc.querySelectorAll("table.glance tr")].find((tr) =>
    tr.querySelector("th")?.textContent?.startsWith("Hubble distance"),
  );
  return row?.querySelector("td")?.textContent?.trim();
};

function listFiles(dir: string, prefix = ""): string[] {
  return readdirSync(dir)
    .sort()
    .flatMap((name) => {
      const full = join(dir, name);
      return statSync(full).isDirectory() ? listFiles(full, `${prefix}${name}/`) : [`${prefix}${name}`];
    });
}

// Builds draw chart images into empty caches here, so each test gets a generous time limit.
describe("freeze, history, diff and verify", { timeout: 180_000 }, () => {
  // Every test makes its own working folder, so that each passes alone and in any order.
  let work: string;
  const cli = (...args: string[]) => runCli(args, work);
  beforeAll(() => compileProject());
  /** A fresh folder with scenarios/shelf.yaml; with `versions`, v1 (H0 = 70) and v2 (H0 = 60) frozen. */
  function fresh(o: { versions?: boolean; draft?: boolean; site?: boolean } = {}): void {
    work = tempDir();
    mkdirSync(join(work, "scenarios"));
    const file = join(work, "scenarios/shelf.yaml");
    writeFileSync(file, scenario(70));
    if (o.versions) {
      expect(cli("freeze", "scenarios/shelf.yaml", "-m", "first numbers").code).toBe(0);
      writeFileSync(file, scenario(60));
      expect(cli("freeze", "scenarios/shelf.yaml", "-m", "lower H0").code).toBe(0);
    }
    if (o.draft) writeFileSync(file, scenario(65));
    if (o.site) {
      const b = runCli(["build", "--scenarios", "scenarios", "--out", "site"], work, {
        COSMOLEDGER_CACHE: join(work, "cache-a"),
      });
      expect(b.code, b.stderr).toBe(0);
    }
  }

  it("freezes version 1, treats an unchanged freeze as a no-op, and numbers an edit as version 2", () => {
    fresh();
    const file = join(work, "scenarios/shelf.yaml");
    writeFileSync(file, scenario(70));
    const first = cli("freeze", "scenarios/shelf.yaml", "-m", "first numbers");
    expect(first.code, first.stderr).toBe(0);
    expect(first.stdout).toMatch(/froze shelf-test version 1 /);
    const v1 = join(work, "scenarios/archive/shelf-test/v1.json");
    const v1Bytes = readFileSync(v1, "utf8");
    const again = cli("freeze", "scenarios/shelf.yaml", "-m", "again");
    expect(again.code).toBe(0);
    expect(again.stdout).toMatch(/unchanged: shelf-test version 1 already holds these inputs/);
    expect(readdirSync(join(work, "scenarios/archive/shelf-test"))).toEqual(["v1.json"]);
    writeFileSync(file, scenario(60));
    const second = cli("freeze", "scenarios/shelf.yaml", "-m", "lower H0");
    expect(second.stdout).toMatch(/froze shelf-test version 2 /);
    expect(readFileSync(v1, "utf8")).toBe(v1Bytes); // never rewritten
    const r1: VersionRecord = JSON.parse(v1Bytes);
    const r2: VersionRecord = JSON.parse(readFileSync(join(work, "scenarios/archive/shelf-test/v2.json"), "utf8"));
    expect(r1.previous_sha256).toBeNull();
    expect(r2.previous_sha256).toBe(r1.sha256);
    expect(r2.source.text).toBe(scenario(60));
    expect(r2.inputs.models[0].inputs.H0).toBe(60);
    expect(r2.message).toBe("lower H0");
    // The tables were frozen with the version: c/H0 in the stored summary.
    expect(r1.tables.models[0].summary.hubble_distance_Mpc).toBeCloseTo(C_KM_S / 70, 9);
    expect(r2.tables.models[0].summary.hubble_distance_Mpc).toBeCloseTo(C_KM_S / 60, 9);
  });

  it("returning to an earlier version's inputs is a new version that names the earlier one", () => {
    fresh();
    const dir = join(work, "revert");
    mkdirSync(dir);
    const f = join(dir, "s.yaml");
    writeFileSync(f, scenario(70));
    expect(cli("freeze", f).stdout).toMatch(/version 1 /);
    writeFileSync(f, scenario(71));
    expect(cli("freeze", f).stdout).toMatch(/version 2 /);
    writeFileSync(f, scenario(70));
    expect(cli("freeze", f).stdout).toMatch(/version 3 .*; its inputs are those of version 1/);
  });

  it("verify passes on the intact archive and reports zero drift", () => {
    fresh({ versions: true });
    const r = cli("verify", "--archive", "scenarios/archive", "--strict");
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toMatch(
      /1 scenario, 2 versions \(2 of cosmoledger\.tables\/\d+\); every hash and chain link checks out/,
    );
    expect(r.stdout).toMatch(/(\d+) of \1 quantities reproduce within 1e-10 \(largest 0: bit-identical\)/);
    const full = cli("verify", "--archive", "scenarios/archive", "--verbose");
    expect(full.stdout).toMatch(/summary\.hubble_distance_Mpc\s+0 \(identical\)/);
  });

  it("renders version pages, the history, the diff and marks the edited file as an unfrozen draft", () => {
    fresh({ versions: true });
    writeFileSync(join(work, "scenarios/shelf.yaml"), scenario(65));
    const b = runCli(["build", "--scenarios", "scenarios", "--out", "site"], work, {
      COSMOLEDGER_CACHE: join(work, "cache-a"),
    });
    expect(b.code, b.stderr).toBe(0);
    const v1 = page(join(work, "site/shelf-test/v1/index.html"));
    const v2 = page(join(work, "site/shelf-test/v2/index.html"));
    const live = page(join(work, "site/shelf-test/index.html"));
    // c/H0 to six significant figures, as the page prints it.
    expect(hubbleDistanceCell(v1)).toBe((C_KM_S / 70).toPrecision(6));
    expect(hubbleDistanceCell(v2)).toBe((C_KM_S / 60).toPrecision(6));
    expect(hubbleDistanceCell(live)).toBe((C_KM_S / 65).toPrecision(6));
    expect(v1.querySelector("article")?.getAttribute("data-status")).toBe("frozen");
    expect(v1.querySelector(".banner")?.textContent).toMatch(/Version 1, frozen .*first numbers/s);
    // Which version is the latest: one data file per scenario, read by the frozen pages (they never change).
    const latest = /window\.cosmoledgerLatest = (.*);\n$/.exec(
      readFileSync(join(work, "site/shelf-test/latest.js"), "utf8"),
    );
    expect(JSON.parse(latest![1])).toEqual({ n: 2, path: "shelf-test/v2/" });
    expect(v1.querySelector('script[src="../latest.js"]')).not.toBeNull();
    expect(live.querySelector("article")?.getAttribute("data-status")).toBe("draft");
    expect(live.querySelector(".banner-draft")?.textContent).toMatch(/Unfrozen draft/);
    // Downloads beside a version page are the frozen ones.
    const t1 = JSON.parse(readFileSync(join(work, "site/shelf-test/v1/tables.json"), "utf8"));
    expect(t1.models[0].parameters.H0).toBe(70);
    expect(JSON.parse(readFileSync(join(work, "site/shelf-test/v1/version.json"), "utf8")).version).toBe(1);

    const history = page(join(work, "site/shelf-test/history/index.html"));
    const rows = [...history.querySelectorAll("table.versions tbody tr")];
    expect(rows.map((tr) => tr.getAttribute("data-version"))).toEqual(["2", "1"]);
    expect(rows[0].textContent).toMatch(/lower H0/);
    expect(rows[0].textContent).toMatch(/inputs changed in 1 model/);
    expect(history.querySelector(".banner-draft")).not.toBeNull();

    const diff = page(join(work, "site/shelf-test/diff/v1-v2/index.html"));
    const h0 = [...diff.querySelectorAll("table.input-changes tbody tr")].find(
      (tr) => tr.querySelector("code")?.textContent === "H0",
    );
    expect(h0?.textContent).toMatch(/70[\s\S]*60/);
    expect(diff.querySelector(".source-diff tr.del")?.textContent).toMatch(/H0: 70/);
    expect(diff.querySelector(".source-diff tr.add")?.textContent).toMatch(/H0: 60/);
    expect(diff.querySelector(".engine-change")?.textContent).toMatch(/unchanged/);
    // Hubble distance scales as 1/H0: relative change (c/60 - c/70)/(c/60) = 1/7 (closed form).
    const hd = diff.querySelector('tr[data-quantity="hubble_distance_Mpc"] td')?.textContent ?? "";
    expect(hd.startsWith(`${(100 / 7).toPrecision(3)}\u00a0%`)).toBe(true);
    expect(existsSync(join(work, "site/shelf-test/diff/v2-draft/index.html"))).toBe(true);
  });

  it("two builds of the same inputs and archive are byte-identical, chart images included", () => {
    fresh({ versions: true, draft: true, site: true });
    // Each build draws its images afresh (its own empty image cache), so the comparison covers the drawing too.
    const r = runCli(["build", "--scenarios", "scenarios", "--out", "site-again"], work, {
      COSMOLEDGER_CACHE: join(work, "cache-b"),
    });
    expect(r.code, r.stderr).toBe(0);
    const a = listFiles(join(work, "site"));
    const b = listFiles(join(work, "site-again"));
    expect(b).toEqual(a);
    expect(a.filter((f) => f.endsWith(".png")).length).toBeGreaterThan(0);
    for (const f of a)
      expect(readFileSync(join(work, "site-again", f)).equals(readFileSync(join(work, "site", f))), f).toBe(true);
  });

  it("a version frozen by an earlier engine is shown as frozen and verify reports its drift (exit 3 with --strict)", () => {
    fresh({ versions: true, draft: true });
    // Simulate an archive written by an older engine: a valid, sealed version 3 whose stored c/H0 differs by 1e-6.
    const r2: VersionRecord = JSON.parse(readFileSync(join(work, "scenarios/archive/shelf-test/v2.json"), "utf8"));
    const tables = structuredClone(r2.tables);
    tables.models[0].summary.hubble_distance_Mpc =
      (tables.models[0].summary.hubble_distance_Mpc as number) * (1 + 1e-6);
    const { sha256: _s, format: _f, engine: _e, tool: _t, ...fields } = r2;
    const r3 = sealVersion(
      { ...fields, version: 3, previous_sha256: r2.sha256, message: "older engine", tables },
      "0.0.0-test",
    );
    const dir = join(work, "older");
    mkdirSync(join(dir, "shelf-test"), { recursive: true });
    for (const n of [1, 2])
      writeFileSync(
        join(dir, `shelf-test/v${n}.json`),
        readFileSync(join(work, `scenarios/archive/shelf-test/v${n}.json`)),
      );
    writeFileSync(join(dir, "shelf-test/v3.json"), `${JSON.stringify(r3)}\n`);
    // The head record comes along (it says v2; a newer v3 is not a loss).
    writeFileSync(join(dir, "heads.json"), readFileSync(join(work, "scenarios/archive/heads.json")));
    const loose = cli("verify", "--archive", "older");
    expect(loose.code).toBe(0);
    expect(loose.stderr).toMatch(
      /warning: shelf-test v3: base: summary\.hubble_distance_Mpc drifts by 1\.00e-6 .*; no declared engine change explains it/,
    );
    const strict = cli("verify", "--archive", "older", "--strict");
    expect(strict.code).toBe(3);
    const b = cli("build", "--scenarios", "scenarios", "--archive", "older", "--out", "site-older");
    expect(b.code, b.stderr).toBe(0);
    expect(hubbleDistanceCell(page(join(work, "site-older/shelf-test/v3/index.html")))).toBe(
      ((C_KM_S / 60) * (1 + 1e-6)).toPrecision(6),
    );
  });

  it("a changed digit, a missing or a reordered version fails verify naming the file, and the build refuses it", () => {
    fresh({ versions: true, draft: true, site: true });
    const copy = (name: string) => {
      const dir = join(work, name);
      mkdirSync(join(dir, "shelf-test"), { recursive: true });
      for (const n of [1, 2])
        writeFileSync(
          join(dir, `shelf-test/v${n}.json`),
          readFileSync(join(work, `scenarios/archive/shelf-test/v${n}.json`)),
        );
      return dir;
    };
    const tampered = copy("tampered");
    const v1 = join(tampered, "shelf-test/v1.json");
    const text = readFileSync(v1, "utf8");
    expect(text).toContain('"H0":70,');
    writeFileSync(v1, text.replace('"H0":70,', '"H0":71,'));
    const r = cli("verify", "--archive", "tampered");
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/tampered\/shelf-test\/v1\.json: content does not match its sha256/);

    const missing = copy("missing");
    rmSync(join(missing, "shelf-test/v1.json"));
    const m = cli("verify", "--archive", "missing");
    expect(m.code).toBe(2);
    expect(m.stderr).toMatch(/missing\/shelf-test\/v1\.json: is missing/);

    const reordered = copy("reordered");
    renameSync(join(reordered, "shelf-test/v1.json"), join(reordered, "shelf-test/tmp"));
    renameSync(join(reordered, "shelf-test/v2.json"), join(reordered, "shelf-test/v1.json"));
    renameSync(join(reordered, "shelf-test/tmp"), join(reordered, "shelf-test/v2.json"));
    const o = cli("verify", "--archive", "reordered");
    expect(o.code).toBe(2);
    expect(o.stderr).toMatch(/reordered\/shelf-test\/v1\.json: holds version 2 but is named v1\.json/);

    // A record whose hash is right but whose shape is not (hand-made, or from another tool) is refused by the schema.
    const misshapen = copy("misshapen");
    const r2 = JSON.parse(readFileSync(join(misshapen, "shelf-test/v2.json"), "utf8"));
    delete r2.tables.models;
    r2.sha256 = versionHash(r2);
    writeFileSync(join(misshapen, "shelf-test/v2.json"), JSON.stringify(r2));
    const s = cli("verify", "--archive", "misshapen");
    expect(s.code).toBe(2);
    expect(s.stderr).toMatch(
      /misshapen\/shelf-test\/v2\.json: not a valid version record: tables: src\/schema\/tables\/\d+\.schema\.json: \(the document\) must have required property 'models'/,
    );

    const before = readFileSync(join(work, "site/index.html"), "utf8");
    const b = cli("build", "--scenarios", "scenarios", "--archive", "tampered", "--out", "site");
    expect(b.code).toBe(2);
    expect(b.stderr).toMatch(/tampered\/shelf-test\/v1\.json:1:1: content does not match its sha256/);
    expect(readFileSync(join(work, "site/index.html"), "utf8")).toBe(before);
    const f = cli("freeze", "scenarios/shelf.yaml", "--archive", "tampered");
    expect(f.code).toBe(2);
    expect(readdirSync(join(tampered, "shelf-test")).sort()).toEqual(["v1.json", "v2.json"]);
  });

  it("a scenario whose file was removed keeps its pages; its address shows the latest frozen version", () => {
    fresh();
    const dir = join(work, "gone");
    mkdirSync(dir);
    writeFileSync(join(dir, "s.yaml"), scenario(68));
    expect(cli("freeze", join(dir, "s.yaml"), "-m", "before removal").code).toBe(0);
    rmSync(join(dir, "s.yaml"));
    const b = cli("build", "--scenarios", dir, "--out", join(dir, "site"), "--skip-images");
    expect(b.code, b.stderr).toBe(0);
    const live = page(join(dir, "site/shelf-test/index.html"));
    expect(live.querySelector("article")?.getAttribute("data-status")).toBe("archived-only");
    expect(live.querySelector(".banner")?.textContent).toMatch(/no longer in the scenarios folder/);
    expect(hubbleDistanceCell(live)).toBe((C_KM_S / 68).toPrecision(6));
    expect(existsSync(join(dir, "site/shelf-test/v1/index.html"))).toBe(true);
  });

  it("bad input to freeze, verify, build and export: exit 2, a located message, nothing written", () => {
    fresh({ versions: true });
    const bad = join(work, "bad.yaml");
    writeFileSync(bad, scenario(70).replace("    Omega_m: 0.3\n", "    Omega_m: -0.3\n"));
    const f = cli("freeze", "bad.yaml", "--archive", "bad-archive");
    expect(f.code).toBe(2);
    expect(f.stderr).toMatch(/bad\.yaml:\d+:\d+: models\[0\]\.Omega_m: .*\n1 problem found; nothing was frozen\./);
    expect(existsSync(join(work, "bad-archive"))).toBe(false);
    const none = cli("verify", "--archive", "no-such-archive");
    expect(none.code).toBe(2);
    expect(none.stderr).toMatch(/no archive at no-such-archive/);
    expect(cli("build", "--scenarios", "scenarios", "--archive", "no-such-archive", "--out", "site-none").code).toBe(2);
    expect(existsSync(join(work, "site-none"))).toBe(false);
    writeFileSync(join(work, "not-a-folder"), "x");
    const notFolder = cli("verify", "--archive", "not-a-folder");
    expect(notFolder.code).toBe(2);
    expect(notFolder.stderr).toMatch(/not-a-folder: is a file, not an archive folder/);
    const intoFile = cli("freeze", "scenarios/shelf.yaml", "--archive", "not-a-folder");
    expect(intoFile.code).toBe(2);
    expect(intoFile.stderr).toMatch(/not-a-folder is a file, not an archive folder; nothing was frozen/);
    mkdirSync(join(work, "odd/shelf-test/v1.json"), { recursive: true });
    const odd = cli("verify", "--archive", "odd");
    expect(odd.code).toBe(2);
    expect(odd.stderr).toMatch(/odd\/shelf-test\/v1\.json: unexpected folder/);
    expect(cli("freeze", "scenarios/shelf.yaml", "--strict").code).toBe(2); // an option of another command
    expect(cli("freeze").code).toBe(2);
  });

  it("concurrent freezes of different edits take distinct numbers and leave an intact chain", async () => {
    fresh();
    const dir = join(work, "race");
    mkdirSync(dir);
    const files = [61, 62, 63, 64, 66, 67].map((h0) => {
      const f = join(dir, `edit-${h0}.yaml`);
      writeFileSync(f, scenario(h0));
      return f;
    });
    const results = await Promise.all(
      files.map(
        (f) =>
          new Promise<{ code: number | null; out: string }>((done) => {
            const p = spawn(process.execPath, [BIN, "freeze", f, "--archive", join(dir, "archive"), "-m", f], {
              cwd: work,
            });
            let out = "";
            p.stdout.on("data", (d) => (out += d));
            p.on("close", (code) => done({ code, out }));
          }),
      ),
    );
    expect(results.map((r) => r.code)).toEqual(files.map(() => 0));
    const numbers = results.map((r) => Number(/version (\d+)/.exec(r.out)?.[1])).sort((a, b) => a - b);
    expect(numbers).toEqual([1, 2, 3, 4, 5, 6]);
    expect(readdirSync(join(dir, "archive/shelf-test")).sort()).toEqual([
      "v1.json",
      "v2.json",
      "v3.json",
      "v4.json",
      "v5.json",
      "v6.json",
    ]);
    const v = cli("verify", "--archive", join(dir, "archive"), "--quiet");
    expect(v.code, v.stderr).toBe(0);
  });

  it("a build killed part way leaves the previous site whole, and the next build cleans up after it", async () => {
    fresh({ versions: true, site: true });
    const out = join(work, "site");
    const before = listFiles(out).map((f) => [f, readFileSync(join(out, f), "utf8")]);
    // Enough scenarios that Eleventy is still writing when the kill comes.
    const many = join(work, "many");
    mkdirSync(many);
    for (let i = 0; i < 40; i++)
      writeFileSync(join(many, `s${i}.yaml`), scenario(60 + i / 10).replace("id: shelf-test", `id: s${i}`));
    const p = spawn(process.execPath, [BIN, "build", "--scenarios", many, "--out", out, "--skip-images"], {
      cwd: work,
    });
    const killedWhileBuilding = await new Promise<boolean>((done) => {
      const poll = setInterval(() => {
        const building = readdirSync(work).find((n) => n.startsWith("site.building-"));
        let started = false;
        try {
          started = !!building && readdirSync(join(work, building)).length > 0;
        } catch {
          started = false; // the folder was swapped in between the two reads: the build got past the point to test
        }
        if (started) {
          clearInterval(poll);
          p.kill("SIGKILL");
          done(true);
        }
      }, 5);
      p.on("exit", () => {
        clearInterval(poll);
        done(false);
      });
    });
    await new Promise((r) => (p.exitCode !== null || p.signalCode !== null ? r(null) : p.on("exit", r)));
    expect(killedWhileBuilding).toBe(true);
    expect(listFiles(out).map((f) => [f, readFileSync(join(out, f), "utf8")])).toEqual(before);
    expect(readdirSync(work).some((n) => n.startsWith("site.building-"))).toBe(true);
    const again = cli("build", "--scenarios", "scenarios", "--out", "site");
    expect(again.code, again.stderr).toBe(0);
    expect(readdirSync(work).filter((n) => n.startsWith("site."))).toEqual([]);
  });
});

describe("the committed demo archive", () => {
  it("passes verify: every hash and chain link holds and every version reproduces with the current engine", () => {
    compileProject();
    // --strict: any drift that no declared engine change explains fails; after an engine change, freeze new demo
    // versions (never edit old ones) or declare the change in src/engine/declaredChanges.ts.
    const r = runCli(["verify", "--archive", "scenarios/archive", "--strict"]);
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/every hash and chain link checks out/);
    expect(r.stderr).toBe("");
  });
});
