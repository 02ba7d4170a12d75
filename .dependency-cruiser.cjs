// The layers of src/, lowest first. A folder may import its own layer and those below it, never one above it
// (DEVELOPERS.md, "Layers"). `npm run lint:deps` checks src/, bin/, content/assets/ and .eleventy.js in .ci/run, and
// test/rules/dependencyRules.test.ts proves that every rule fails on a forbidden import.
const LAYERS = [
  "common",
  "schema",
  "engine",
  "statistics",
  "scenario",
  "contract",
  "tables",
  "presentation",
  "archive",
  "exports",
  "site",
  "pageEngine",
  "cli",
];

const above = (i) => LAYERS.slice(i + 1);
const layerRules = LAYERS.slice(0, -1).map((layer, i) => ({
  name: `${layer}-imports-a-higher-layer`,
  comment: `src/${layer} may import only ${LAYERS.slice(0, i + 1).join(", ")}; not ${above(i).join(", ")}`,
  severity: "error",
  from: { path: `^src/${layer}/` },
  to: { path: `^src/(${above(i).join("|")})/` },
}));

module.exports = {
  forbidden: [
    ...layerRules,
    {
      name: "engine-does-io",
      comment: "The engine is pure TypeScript: no Node built-in modules (no I/O, no clocks, no crypto).",
      severity: "error",
      from: { path: "^src/(engine|statistics)/" },
      to: { dependencyTypes: ["core"] },
    },
    {
      name: "engine-uses-packages",
      comment: "The engine and the statistics depend on no package.",
      severity: "error",
      from: { path: "^src/(engine|statistics)/" },
      to: { dependencyTypes: ["npm", "npm-dev", "npm-optional", "npm-peer", "npm-no-pkg", "npm-unknown"] },
    },
    {
      name: "presentation-reads-the-contract-only",
      comment:
        "src/presentation turns stored tables documents into what every output shows: it reads the contract (and common), never the scenario, the engine or the compute step.",
      severity: "error",
      from: { path: "^src/presentation/" },
      to: { path: "^src/(schema|engine|statistics|scenario|tables)/" },
    },
    {
      name: "renderers-do-not-compute",
      comment:
        "Pages and exports render presented documents: they never import the scenario resolution, the engine, the statistics or the compute step (src/tables).",
      severity: "error",
      from: { path: "^src/(exports|site)/" },
      to: { path: "^src/(engine|statistics|scenario|tables)/" },
    },
    {
      name: "one-presentation",
      comment:
        "Units are converted and numbers formatted in src/presentation only: renderers do not read h-unit rules or format numbers on their own.",
      severity: "error",
      from: { path: "^src/(exports|site|cli)/", pathNot: "^src/cli/runCommand\\.ts$" },
      to: { path: "^src/contract/littleHUnitNames\\.ts$" },
    },
    {
      name: "site-config-does-not-compute",
      comment:
        "The Eleventy configuration composes (filters, the ledger, the export writer): it never imports the compute step, the statistics or the engine's physics.",
      severity: "error",
      from: { path: "^\\.eleventy\\.js$" },
      to: { path: "^(src|dist)/(tables|statistics|engine/(?!engineVersion))" },
    },
    {
      name: "browser-assets-import-nothing",
      comment:
        "Files in content/assets are served as they are to browsers (also from file://): they import no module; the page's chart script is bundled from src/site/browser.",
      severity: "error",
      from: { path: "^content/assets/" },
      to: {},
    },
    {
      name: "page-engine-runs-in-a-browser",
      comment:
        "src/pageEngine is bundled for the pages' what-if panel: it composes the scenario, compute and presentation layers and imports no Node built-in itself (node:crypto reaches it only through the browser stand-in the bundler puts in its place).",
      severity: "error",
      from: { path: "^src/pageEngine/" },
      to: { dependencyTypes: ["core"] },
    },
    {
      name: "browser-code-is-pure",
      comment:
        "src/site/browser is bundled for the page: it may use the presentation only, never Node built-ins, packages or the compute layers.",
      severity: "error",
      from: { path: "^src/site/browser/" },
      to: { pathNot: "^src/(presentation|site/browser)/" },
    },
    {
      name: "cli-entry-runs-the-bundle",
      comment: "bin/cosmoledger.js starts the bundled command line (dist/bundle) or dist/cli itself, nothing deeper.",
      severity: "error",
      from: { path: "^bin/cosmoledger\\.js$" },
      to: { path: "^(src|dist)/", pathNot: "^dist/(bundle|cli)/" },
    },
    { name: "no-circular", severity: "error", from: {}, to: { circular: true } },
    { name: "not-to-unresolvable", severity: "error", from: {}, to: { couldNotResolve: true } },
  ],
  options: {
    doNotFollow: { path: "node_modules" },
    tsConfig: { fileName: "tsconfig.json" },
    tsPreCompilationDeps: true,
    enhancedResolveOptions: {
      extensions: [".ts", ".js", ".json"],
      exportsFields: ["exports"],
      conditionNames: ["import", "require", "node", "default"],
    },
  },
};
