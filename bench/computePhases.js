// Where a compute's time goes, in one fresh process (cold, as a user's run is): loading the modules, reading and
// resolving the scenario, computing, serialising the JSON and the CSVs, writing. Prints one JSON object (ms).
import { performance } from "node:perf_hooks";

const [file, out] = process.argv.slice(2);
const phases = {};
let t = performance.now();
const lap = (name) => {
  const now = performance.now();
  phases[name] = Number((now - t).toFixed(1));
  t = now;
};
const { loadScenarioFiles } = await import("../dist/cli/readScenarioFile.js");
const { locatedTables } = await import("../dist/tables/locatedTables.js");
const { tablesCsv } = await import("../dist/contract/tablesCsv.js");
const { writeOutputsAtomically } = await import("../dist/cli/writeOutputsAtomically.js");
lap("load modules (unbundled)");
const { scenarios } = loadScenarioFiles([file]);
lap("read and resolve the scenario");
const doc = locatedTables(scenarios[0]);
lap("compute (engine and rows, cold)");
const json = `${JSON.stringify(doc)}\n`;
lap("serialise tables.json");
const csv = tablesCsv(doc);
lap("CSVs");
writeOutputsAtomically([{ dir: out, files: { "tables.json": json, ...csv } }]);
lap("write (atomic, fsync)");
process.stdout.write(JSON.stringify(phases));
