// Bundles the compiled CLI (dist/cli/main.js) into dist/bundle/ with esbuild, so that a command loads a few files
// instead of about a hundred: start-up is mostly module loading (npm run bench). Packages that load files of their
// own (Eleventy, the canvas, Chart.js, the site's renderers, ajv) stay external; the rest are bundled. Dynamic
// imports become chunks, loaded only by the commands that need them. `build` and the Eleventy config use dist/
// directly, so the site shares one copy of every module with .eleventy.js.
import { build } from "esbuild";
import { rmSync } from "node:fs";
import { join, resolve } from "node:path";

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

// The page's chart script: the browser side of the one chart-configuration builder (src/site/browser/charts.ts),
// one classic script (works from file:// and under the pages' content security policy: no eval, no modules).
await build({
  entryPoints: [join(ROOT, "dist/site/browser/charts.js")],
  outfile: join(out, "charts.js"),
  bundle: true,
  format: "iife",
  platform: "browser",
  target: "es2020",
  logLevel: "warning",
  legalComments: "none",
  minifyWhitespace: true,
  minifySyntax: true,
});
