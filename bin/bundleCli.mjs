// Bundles the compiled CLI (dist/cli/main.js) into dist/bundle/ with esbuild, so that a command loads a few files
// instead of about a hundred: start-up is mostly module loading (npm run bench). Packages that load files of their
// own (Eleventy, the canvas, Chart.js, the site's renderers, ajv) stay external; the rest are bundled. Dynamic
// imports become chunks, loaded only by the commands that need them. `build` and the Eleventy config use dist/
// directly, so the site shares one copy of every module with .eleventy.js.
import { build } from "esbuild";
import { rmSync } from "node:fs";
import { dirname, join, resolve } from "node:path";

const ROOT = resolve(import.meta.dirname, "..");
const out = join(ROOT, "dist/bundle");
rmSync(out, { recursive: true, force: true });
await build({
  // The helper thread of spreads (src/tables/drawPool.ts) is its own entry: dist/bundle/drawWorker.mjs.
  entryPoints: { cosmoledger: join(ROOT, "dist/cli/main.js"), drawWorker: join(ROOT, "dist/tables/drawWorker.js") },
  outdir: out,
  bundle: true,
  splitting: true,
  format: "esm",
  platform: "node",
  target: "node20",
  outExtension: { ".js": ".mjs" },
  external: [
    "@11ty/eleventy",
    "@napi-rs/canvas",
    "chart.js",
    "ajv",
    "ajv/*",
    "json-schema-to-typescript",
    "sanitize-html",
    "markdown-it",
    "temml",
    "jsonc-parser", // its "main" is a UMD build that requires its own files at run time
  ],
  logLevel: "warning",
  legalComments: "none",
  minifyWhitespace: true,
  minifySyntax: true,
  // CommonJS packages bundled into ES modules still call require() for Node's built-ins.
  banner: {
    js: 'import { createRequire as __cosmoledgerRequire } from "node:module"; const require = __cosmoledgerRequire(import.meta.url);',
  },
});

// The pages' scripts are classic scripts (they work from file:// and under the pages' content security policy: no
// eval, no modules).
const dist = join(ROOT, "dist");
const pageScript = (entry, name, more = {}) =>
  build({
    entryPoints: [join(dist, entry)],
    outfile: join(out, name),
    bundle: true,
    format: "iife",
    platform: "browser",
    target: "es2020",
    logLevel: "warning",
    legalComments: "none",
    minifyWhitespace: true,
    minifySyntax: true,
    ...more,
  });

// The page's chart script: the browser side of the one chart-configuration builder (src/site/browser/charts.ts).
await pageScript("site/browser/charts.js", "charts.js");

// The what-if engine of the pages: the scenario pipeline (src/pageEngine/whatIfEngine.ts) as one classic script,
// loaded by a page when its reader opens the what-if panel.
// Node built-ins get browser stand-ins: SHA-256 from @noble/hashes; the precompiled scenario validator imported
// directly (it is loaded with require() on Node); the helper thread of spreads, samples files (csv-parse) and TeX
// label checking, which a what-if scenario never reaches, fail loudly if they ever are.
await pageScript("pageEngine/whatIfEngine.js", "what-if-engine.js", {
  globalName: "cosmoledgerWhatIfEngine",
  // The helper thread of spreads (src/tables/drawPool.ts) finds its script through import.meta.url; a what-if never
  // starts it, so the empty import.meta of a classic script is never read.
  logOverride: { "empty-import-meta": "silent" },
  minify: true,
  plugins: [
    {
      name: "browser-stand-ins",
      setup(b) {
        b.onResolve({ filter: /^node:crypto$/ }, () => ({ path: join(dist, "pageEngine/nodeCryptoShim.js") }));
        b.onResolve({ filter: /^(node:(worker_threads|os|module|url)|csv-parse\/sync)$/ }, (a) => ({
          path: a.path,
          namespace: "absent",
        }));
        b.onLoad({ filter: /.*/, namespace: "absent" }, (a) => ({
          contents: `const absent = () => { throw new Error("${a.path} is not available in a page"); };
export const Worker = class { constructor() { absent(); } };
export const availableParallelism = () => 1;
export const parentPort = null;
export const createRequire = () => absent;
export const fileURLToPath = absent;
export const parse = absent;`,
          loader: "js",
        }));
        b.onLoad({ filter: /scenario[\\/]validateScenarioSchema\.js$/ }, async (a) => {
          const { readFile } = await import("node:fs/promises");
          const text = await readFile(a.path, "utf8");
          const loading = "const validate = await loadValidator();";
          if (!text.includes(loading))
            throw new Error("validateScenarioSchema.js no longer loads its validator as expected");
          return {
            contents: text.replace(loading, 'import validate from "../schema/scenarioValidator.cjs";'),
            loader: "js",
            resolveDir: dirname(a.path),
          };
        });
      },
    },
  ],
});

// The page's what-if panel (src/site/browser/whatIfPanel.ts): form, columns and curves; it calls the engine above.
await pageScript("site/browser/whatIfPanel.js", "what-if-panel.js", { minify: true });
