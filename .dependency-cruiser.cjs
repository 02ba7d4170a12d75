// The layers of src/, lowest first. A folder may import its own layer and those below it, never one above it
// (DEVELOPERS.md, "Layers"). `npx depcruise src` checks this in .ci/run.
const LAYERS = [
  "common",
  "schema",
  "engine",
  "statistics",
  "scenario",
  "contract",
  "tables",
  "archive",
  "exports",
  "site",
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
