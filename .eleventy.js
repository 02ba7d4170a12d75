// Eleventy configuration: filters, passthrough copies, the tables documents as global data, and the folder layout.
// Templates format the tables documents; every number they show was computed by the engine before Eleventy ran.
import { HTML_FILTERS, TEXT_FILTERS } from "./dist/site/siteFilters.js";
import { defaultArchive, readLedger } from "./dist/cli/readLedger.js";
import { getSiteLedger } from "./dist/site/siteLedger.js";
import * as catalog from "./dist/contract/quantityCatalog.js";
import { CLOSURE_TEX, FERMI_DIRAC_TEX, FRIEDMANN_TEX, NEUTRINO_TEX } from "./dist/site/renderMath.js";
import { formatIssue } from "./dist/scenario/scenarioIssue.js";
import { ENGINE_VERSION } from "./dist/engine/engineVersion.js";
import { SITE_MARKER } from "./dist/cli/siteMarker.js";
import { writeExportFiles } from "./dist/exports/exportFiles.js";
import { WHAT_IF_FORM } from "./dist/site/whatIfFields.js";
import { PUBLISHED_SETS } from "./dist/scenario/publishedSets.js";
import { mkdirSync, writeFileSync } from "node:fs";
import { dirname, join } from "node:path";

export default function (eleventyConfig) {
  const scenariosDir = process.env.COSMOLEDGER_SCENARIOS ?? "scenarios";
  const archiveDir = process.env.COSMOLEDGER_ARCHIVE ?? defaultArchive(scenariosDir);
  eleventyConfig.setNunjucksEnvironmentOptions({ autoescape: true, throwOnUndefined: false });
  for (const [name, fn] of Object.entries({ ...TEXT_FILTERS, ...HTML_FILTERS })) eleventyConfig.addFilter(name, fn);

  // `cosmoledger build` and `cosmoledger serve` hand over the ledger they checked; a bare `eleventy` run reads one.
  let current = null;
  eleventyConfig.addGlobalData("ledger", () => {
    current = getSiteLedger();
    if (current) return current;
    const { ledger, issues } = readLedger(scenariosDir, archiveDir);
    if (!ledger) throw new Error(issues.map(formatIssue).join("\n"));
    current = ledger;
    return current;
  });
  // `cosmoledger serve` renders pages that listen to it (Server-Sent Events from the same origin, for reloads and the
  // overlay of a scenario's errors); only its output may connect anywhere. A built site keeps connect-src 'none'.
  const preview = process.env.COSMOLEDGER_PREVIEW === "1";
  eleventyConfig.addGlobalData("preview", preview);
  eleventyConfig.addGlobalData("connectSrc", preview ? "'self'" : "'none'");
  if (preview) eleventyConfig.addPassthroughCopy({ "content/preview/live-preview.js": "assets/live-preview.js" });
  eleventyConfig.addGlobalData("catalog", { ...catalog });
  eleventyConfig.addGlobalData("tex", {
    friedmann: FRIEDMANN_TEX,
    closure: CLOSURE_TEX,
    neutrinos: NEUTRINO_TEX,
    fermiDirac: FERMI_DIRAC_TEX,
  });
  eleventyConfig.addGlobalData("tool", { name: "cosmoledger", engine: ENGINE_VERSION });
  // The what-if panel's inputs (from the scenario schema) and the published sets a what-if may start from: those
  // that give a whole model (H0 and Omega_m); the others (a sigma8, an H0 alone) are extended after a whole one.
  eleventyConfig.addGlobalData("whatIf", {
    form: WHAT_IF_FORM,
    published: PUBLISHED_SETS.filter((s) => "H0" in s.parameters && "Omega_m" in s.parameters).map((s) => ({
      id: s.id,
      title: s.title,
    })),
  });
  eleventyConfig.addWatchTarget(scenariosDir);
  eleventyConfig.addWatchTarget(archiveDir);
  // Mark the output as ours, so that `cosmoledger build` may replace a folder that `npm start` wrote.
  // Exports (tables in five formats, chart images) are files, not pages: they are written beside the pages, then the marker.
  eleventyConfig.on("eleventy.after", async ({ dir, directories }) => {
    const output = directories?.output ?? dir.output; // directories honours a command-line --output
    await writeExportFiles(current?.exportFiles ?? [], (f, content) => {
      const target = join(output, f.path);
      mkdirSync(dirname(target), { recursive: true });
      writeFileSync(target, content);
    });
    writeFileSync(join(output, SITE_MARKER), "Built by cosmoledger; this folder is replaced by the next build.\n");
    // Let the ledger go: Eleventy keeps this configuration's listeners after the run, and a build renders many
    // batches, each with its own ledger.
    current = null;
  });

  // A build renders its pages in batches; the index, which lists every scenario, comes with the last one.
  if (process.env.COSMOLEDGER_NO_INDEX === "1") eleventyConfig.ignores.add("content/index.njk");
  eleventyConfig.addPassthroughCopy({ "content/assets": "assets" });
  // Served at the site's root, browsers ask for /favicon.ico whenever a page names no icon (an exported HTML
  // fragment opened on its own): the file is there (bin/drawFavicon.mjs draws it from favicon.svg).
  eleventyConfig.addPassthroughCopy({ "content/assets/favicon.ico": "favicon.ico" });
  eleventyConfig.addPassthroughCopy({ "node_modules/chart.js/dist/chart.umd.min.js": "assets/chart.umd.min.js" });
  // The page's charts: src/site/browser/charts.ts, bundled by `npm run build:ts` with the configuration builder that
  // the exported images use.
  eleventyConfig.addPassthroughCopy({ "dist/bundle/charts.js": "assets/charts.js" });
  // The what-if panel (src/site/browser/whatIfPanel.ts) and the engine it loads when a reader opens it
  // (src/pageEngine/whatIfEngine.ts, the scenario pipeline bundled for the browser): one copy per site.
  eleventyConfig.addPassthroughCopy({ "dist/bundle/what-if-panel.js": "assets/what-if-panel.js" });
  eleventyConfig.addPassthroughCopy({ "dist/bundle/what-if-engine.js": "assets/what-if-engine.js" });

  // Under `cosmoledger build` (which reports the build itself), Eleventy's timing notes ("[11ty] Benchmark ...") are
  // silenced: a slow machine must not add lines to a command's output.
  if (process.env.COSMOLEDGER_SITE_OUT) {
    eleventyConfig.benchmarkManager?.setVerboseOutput(false);
    for (const group of Object.values(eleventyConfig.benchmarkManager?.getAll() ?? {})) group.setIsVerbose(false);
  }

  return {
    // cosmoledger build renders into a temporary folder that it then swaps in (COSMOLEDGER_SITE_OUT).
    dir: {
      input: "content",
      includes: "_includes",
      data: "_data",
      output: process.env.COSMOLEDGER_SITE_OUT ?? "_site",
    },
    templateFormats: ["njk"],
    htmlTemplateEngine: "njk",
  };
}
