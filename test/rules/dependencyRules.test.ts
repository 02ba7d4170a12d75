// The rules that keep the layers honest fail on what they forbid: in a copy of the project, one forbidden import per
// dependency-cruiser rule (and a forbidden global for the lint rule of pure code) is added, and each is reported by
// its rule's name. The clean tree passes both in .ci/run (npm run lint:deps, npm run lint).
import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { appendFileSync, cpSync, mkdirSync, symlinkSync, writeFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { ROOT, compileProject, tempDir } from "../helpers/buildDemoSite.js";

/**
 * Each rule with a file that breaks it (path in the copy, text; appended when `append` is set) and, where the report
 * names another file of the violation, that file's name (`reported`).
 */
const VIOLATIONS: { rule: string; file: string; text: string; append?: boolean; reported?: string }[] = [
  { rule: "contract-imports-a-higher-layer", file: "src/contract/zzUp.ts", text: 'import "../site/sitePages.js";\n' },
  { rule: "engine-does-io", file: "src/engine/zzIo.ts", text: 'import "node:fs";\n' },
  { rule: "engine-uses-packages", file: "src/statistics/zzPackage.ts", text: 'import "yaml";\n' },
  {
    rule: "presentation-reads-the-contract-only",
    file: "src/presentation/zzCompute.ts",
    text: 'import "../tables/buildTablesDocument.js";\n',
  },
  {
    rule: "renderers-do-not-compute",
    file: "src/site/zzFilters.ts",
    text: 'import "../scenario/resolveScenario.js";\nimport "../tables/buildTablesDocument.js";\n',
  },
  { rule: "one-presentation", file: "src/exports/zzUnits.ts", text: 'import "../contract/littleHUnitNames.js";\n' },
  {
    rule: "site-config-does-not-compute",
    file: ".eleventy.js",
    text: '\nimport "./dist/tables/buildTablesDocument.js";\n',
    append: true,
  },
  {
    rule: "browser-assets-import-nothing",
    file: "content/assets/zz.js",
    text: 'import "../../dist/engine/index.js";\n',
  },
  { rule: "browser-code-is-pure", file: "src/site/browser/zz.ts", text: 'import "node:fs";\n' },
  { rule: "page-engine-runs-in-a-browser", file: "src/pageEngine/zz.ts", text: 'import "node:fs";\n' },
  { rule: "pageEngine-imports-a-higher-layer", file: "src/pageEngine/zzUp.ts", text: 'import "../cli/main.js";\n' },
  {
    rule: "cli-entry-runs-the-bundle",
    file: "bin/cosmoledger.js",
    text: '\nimport "../dist/tables/buildTablesDocument.js";\n',
    append: true,
  },
  {
    rule: "no-circular",
    file: "src/common/zzA.ts",
    text: 'import { b } from "./zzB.js";\nexport const a = () => b;\n',
  },
  {
    rule: "no-circular",
    file: "src/common/zzB.ts",
    text: 'import { a } from "./zzA.js";\nexport const b = () => a;\n',
    reported: "zzA.ts",
  },
  { rule: "not-to-unresolvable", file: "src/common/zzMissing.ts", text: 'import "./noSuchModule.js";\n' },
];

function copyProject(): string {
  const project = tempDir("cosmoledger-rules-");
  for (const f of ["src", "bin", "content", ".eleventy.js", ".dependency-cruiser.cjs", "tsconfig.json", "package.json"])
    cpSync(join(ROOT, f), join(project, f), { recursive: true });
  cpSync(join(ROOT, "biome.jsonc"), join(project, "biome.jsonc"));
  symlinkSync(join(ROOT, "node_modules"), join(project, "node_modules"), "dir");
  // A copy, not a link: dependency-cruiser names a linked file by its real path, outside the copy.
  cpSync(join(ROOT, "dist"), join(project, "dist"), { recursive: true });
  return project;
}

describe("every layer rule fails on a forbidden import", { timeout: 300_000 }, () => {
  it("dependency-cruiser names each broken rule", () => {
    compileProject();
    const project = copyProject();
    for (const v of VIOLATIONS) {
      const path = join(project, v.file);
      mkdirSync(dirname(path), { recursive: true });
      if (v.append) appendFileSync(path, v.text);
      else writeFileSync(path, v.text);
    }
    const r = spawnSync(
      process.execPath,
      [
        join(ROOT, "node_modules/dependency-cruiser/bin/dependency-cruise.mjs"),
        "src",
        "bin",
        "content/assets",
        ".eleventy.js",
        "--config",
        ".dependency-cruiser.cjs",
        "--output-type",
        "err",
      ],
      { cwd: project, encoding: "utf8" },
    );
    expect(r.status).not.toBe(0);
    const out = r.stdout + r.stderr;
    for (const v of VIOLATIONS)
      expect(out, `${v.rule} (${v.file})`).toMatch(
        new RegExp(`\\b${v.rule}\\b.*${(v.reported ?? v.file.split("/").pop()!).replace(".", "\\.")}`),
      );
  });

  it("the lint rule of pure code refuses the environment, clocks and the network in the engine", () => {
    const project = copyProject();
    writeFileSync(
      join(project, "src/engine/zzImpure.ts"),
      "export const impure = () => [process.env.HOME, Date.now(), fetch];\n",
    );
    const r = spawnSync(
      process.execPath,
      [join(ROOT, "node_modules/@biomejs/biome/bin/biome"), "lint", "src/engine/zzImpure.ts"],
      { cwd: project, encoding: "utf8" },
    );
    expect(r.status).not.toBe(0);
    const out = r.stdout + r.stderr;
    for (const name of ["process", "Date", "fetch"]) expect(out).toContain(`Do not use the global variable ${name}.`);
  });
});
