// `cosmoledger build` into a folder it built before reuses the pages whose inputs did not change, and the result is
// byte for byte the site a clean build of the same inputs writes. Source of the expectation: the README's promise
// that builds are deterministic (same scenarios and archive, byte-identical output), which an incremental build
// must keep; each step below compares every file, dot files included, with a clean build into a fresh folder.
import { beforeAll, describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { createHash } from "node:crypto";
import {
  copyFileSync,
  existsSync,
  mkdirSync,
  readdirSync,
  readFileSync,
  renameSync,
  rmSync,
  statSync,
  writeFileSync,
} from "node:fs";
import { dirname, join } from "node:path";
import { ROOT, compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";

const scenario = (h0: number) =>
  `title: Shelf\nid: shelf\nredshifts: [0.5, 1, 2]\nmodels:\n  - { id: a, H0: ${h0}, Omega_m: 0.3 }\n  - { id: b, extends: a, Omega_k: 0.05 }\ntargets:\n  - { name: arc, z: 2, size_kpc: 5 }\n`;
const other = "title: Other\nid: other\nmodels:\n  - { id: a, H0: 68, Omega_m: 0.31 }\n";

/** Every file of a site (relative path and SHA-256 of its bytes), in path order. */
function tree(dir: string): [string, string][] {
  return readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile())
    .map((e) => join(e.parentPath, e.name))
    .map((f): [string, string] => [f.slice(dir.length + 1), createHash("sha256").update(readFileSync(f)).digest("hex")])
    .sort((a, b) => (a[0] < b[0] ? -1 : 1));
}

/** A build through the compiled buildSite with a given tool version (an upgrade of cosmoledger, simulated). */
function buildAs(toolVersion: string, scenarios: string, out: string) {
  const code = `const { buildSite } = await import(${JSON.stringify(join(ROOT, "dist/cli/buildSite.js"))});
process.exitCode = await buildSite(${JSON.stringify(scenarios)}, ${JSON.stringify(out)}, false, undefined, { images: false, toolVersion: ${JSON.stringify(toolVersion)} });`;
  const r = spawnSync(process.execPath, ["--input-type=module", "-e", code], { encoding: "utf8" });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

describe("incremental builds", { timeout: 600_000 }, () => {
  let dir: string;
  let scenarios: string;
  let site: string;
  let cleanCount = 0;
  const build = () => runCli(["build", "--scenarios", scenarios, "--out", site, "--skip-images"], dir);
  const cleanTree = () => {
    const fresh = join(dir, `clean-${cleanCount++}`);
    const r = runCli(["build", "--scenarios", scenarios, "--out", fresh, "--skip-images", "--quiet"], dir);
    expect(r.code, r.stderr).toBe(0);
    const t = tree(fresh);
    rmSync(fresh, { recursive: true, force: true });
    return t;
  };
  const rendered = (stdout: string) => {
    const m = /\((\d+) of (\d+) pages rendered/.exec(stdout);
    return m ? { rendered: Number(m[1]), of: Number(m[2]) } : null;
  };

  beforeAll(() => {
    compileProject();
    dir = tempDir();
    scenarios = join(dir, "scenarios");
    site = join(dir, "site");
    mkdirSync(scenarios);
    writeFileSync(join(scenarios, "shelf.yaml"), scenario(70));
    writeFileSync(join(scenarios, "other.yaml"), other);
    for (const h0 of [67, 68, 69]) {
      writeFileSync(join(scenarios, "shelf.yaml"), scenario(h0));
      const f = runCli(["freeze", join(scenarios, "shelf.yaml"), "-m", `H0 ${h0}`], dir);
      expect(f.code, f.stderr).toBe(0);
    }
    writeFileSync(join(scenarios, "shelf.yaml"), scenario(70)); // a draft after version 3
    const r = build();
    expect(r.code, r.stderr).toBe(0);
    expect(rendered(r.stdout)).toBeNull(); // a first build renders everything
  });

  it("a rebuild with nothing changed renders no page and writes the same bytes", () => {
    const before = tree(site);
    const r = build();
    expect(r.code, r.stderr).toBe(0);
    expect(rendered(r.stdout)?.rendered).toBe(0);
    expect(tree(site)).toEqual(before);
  });

  it("after an edit: only the edited scenario's live page and its draft diffs and history are rendered", () => {
    writeFileSync(join(scenarios, "shelf.yaml"), scenario(70.5));
    const r = build();
    expect(r.code, r.stderr).toBe(0);
    // Rendered: shelf/ (live), shelf/history/, and the three diffs of versions 1 to 3 against the draft.
    expect(rendered(r.stdout)).toEqual({ rendered: 5, of: expect.any(Number) });
    expect(tree(site)).toEqual(cleanTree());
  });

  it("after a freeze: the new version page, its diffs, the history and the live page; earlier version pages stay as they were", () => {
    const f = runCli(["freeze", join(scenarios, "shelf.yaml"), "-m", "H0 70.5"], dir);
    expect(f.code, f.stderr).toBe(0);
    const inode = statSync(join(site, "other/index.html")).ino;
    const v1 = statSync(join(site, "shelf/v1/index.html")).ino;
    const r = build();
    expect(r.code, r.stderr).toBe(0);
    const n = rendered(r.stdout);
    expect(n!.rendered).toBeLessThan(n!.of);
    expect(tree(site)).toEqual(cleanTree());
    // The untouched scenario's page was not rendered again: its file is the previous build's own.
    expect(statSync(join(site, "other/index.html")).ino).toBe(inode);
    // A frozen page is made from its record alone (the latest version comes from shelf/latest.js).
    expect(statSync(join(site, "shelf/v1/index.html")).ino).toBe(v1);
  });

  it("after a scenario file is deleted: its pages and downloads are gone, as in a clean build", () => {
    rmSync(join(scenarios, "other.yaml"));
    const r = build();
    expect(r.code, r.stderr).toBe(0);
    const t = tree(site);
    expect(t.some(([f]) => f.startsWith("other/"))).toBe(false);
    expect(t).toEqual(cleanTree());
  });

  it("after an upgrade (another tool version): every page is rendered again, and the site is the clean build's", () => {
    const before = tree(site);
    const r = buildAs("99.0.0", scenarios, site);
    expect(r.code, r.stderr).toBe(0);
    expect(rendered(r.stdout)).toBeNull(); // nothing reused
    const after = tree(site);
    // The exports name the tool version: pages with exports changed, so they were not carried over.
    const changed = after.filter(([f, h]) => before.find(([g]) => g === f)?.[1] !== h).map(([f]) => f);
    expect(changed).toContain("shelf/v1/exports/assumptions.txt");
    expect(readFileSync(join(site, "shelf/v1/exports/assumptions.txt"), "utf8")).toContain("99.0.0");
    const clean = join(dir, "clean-upgrade");
    const c = buildAs("99.0.0", scenarios, clean);
    expect(c.code, c.stderr).toBe(0);
    expect(after).toEqual(tree(clean));
  });

  it("a page with any of its files removed from the site by hand is rendered again", () => {
    rmSync(join(site, "shelf/v2/index.html"));
    rmSync(join(site, "shelf/v1/tables.json"));
    const r = build();
    expect(r.code, r.stderr).toBe(0);
    expect(tree(site)).toEqual(cleanTree());
  });

  it("a site whose list of checked version files names other code checks every version file again", () => {
    // The list is tied to the code that checked (its salt); a list from other code must not spare a check.
    const list = join(site, ".cosmoledger-records.json");
    const kept = JSON.parse(readFileSync(list, "utf8"));
    expect(kept.records.length).toBeGreaterThan(0);
    // A version file altered after freezing, and a list that claims its new bytes were checked by other code.
    const v1 = join(scenarios, "archive/shelf/v1.json");
    const original = readFileSync(v1, "utf8");
    const altered = original.replace('"message":"H0 67"', '"message":"H0 67!"');
    expect(altered).not.toBe(original);
    writeFileSync(v1, altered);
    const hash = createHash("sha256").update(altered).digest("hex");
    const forged = kept.records.map(([h, m]: [string, unknown]) => [h === kept.records[0][0] ? hash : h, m]);
    writeFileSync(list, JSON.stringify({ ...kept, salt: "other code", records: forged }));
    const r = build();
    writeFileSync(v1, original);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/shelf\/v1\.json\S*: content does not match its sha256/);
  });

  it("a build killed while moving its staged changes into the site is finished by the next build", () => {
    // The state such a kill leaves, made by hand: the next site (built clean elsewhere) staged as the changed and
    // new files plus a journal of deletions, half of the staged files already moved in, the site's page list gone
    // (the apply removes it first), and the staging folder named after a process that no longer runs.
    writeFileSync(join(scenarios, "shelf.yaml"), scenario(71.5));
    const next = join(dir, "next-site");
    const n = runCli(["build", "--scenarios", scenarios, "--out", next, "--skip-images", "--quiet"], dir);
    expect(n.code, n.stderr).toBe(0);
    const now = new Map(tree(site));
    const wanted = tree(next);
    const dead = spawnSync(process.execPath, ["-e", "0"]).pid;
    const staged = `${site}.building-${dead}-1`;
    const changed = wanted.filter(([f, h]) => now.get(f) !== h).map(([f]) => f);
    expect(changed).toContain(".cosmoledger-pages.json");
    for (const f of changed) {
      mkdirSync(dirname(join(staged, f)), { recursive: true });
      copyFileSync(join(next, f), join(staged, f));
    }
    const deletions = [...now.keys()].filter((f) => !wanted.some(([g]) => g === f));
    writeFileSync(join(staged, ".cosmoledger-apply.json"), JSON.stringify({ deletions }));
    rmSync(join(site, ".cosmoledger-pages.json"));
    const pages = changed.filter((f) => f !== ".cosmoledger-pages.json");
    for (const f of pages.slice(0, Math.floor(pages.length / 2))) {
      mkdirSync(dirname(join(site, f)), { recursive: true });
      renameSync(join(staged, f), join(site, f));
    }
    const r = build();
    expect(r.code, r.stderr).toBe(0);
    // Finished, not thrown away: the staged page list came in with the pages, so nothing needed rendering.
    expect(rendered(r.stdout)?.rendered).toBe(0);
    expect(existsSync(staged)).toBe(false);
    expect(tree(site)).toEqual(wanted);
  });
});
