import { createHash } from "node:crypto";
import { existsSync, readdirSync, readFileSync } from "node:fs";
import { join, relative } from "node:path";
import { PACKAGE_ROOT } from "../common/toolVersion.js";

let memo: string | null = null;

/**
 * A hash of everything besides the scenarios that a page's bytes depend on: cosmoledger's compiled code (dist/), its
 * templates and assets (content/, .eleventy.js) and the locked versions of its dependencies. A changed tool or
 * template changes every page's key, so the next build renders everything again.
 */
export function buildSalt(): string {
  if (memo) return memo;
  const hash = createHash("sha256");
  const add = (file: string) => {
    hash.update(relative(PACKAGE_ROOT, file)).update("\0").update(readFileSync(file)).update("\0");
  };
  const walk = (dir: string) => {
    if (!existsSync(dir)) return;
    for (const e of readdirSync(dir, { withFileTypes: true }).sort((a, b) => (a.name < b.name ? -1 : 1))) {
      const p = join(dir, e.name);
      if (e.isDirectory()) walk(p);
      else if (e.isFile()) add(p);
    }
  };
  for (const f of ["package.json", "package-lock.json", ".eleventy.js"])
    if (existsSync(join(PACKAGE_ROOT, f))) add(join(PACKAGE_ROOT, f));
  walk(join(PACKAGE_ROOT, "content"));
  walk(join(PACKAGE_ROOT, "dist"));
  memo = hash.digest("hex");
  return memo;
}
