import { exportFiles } from "./dist/exports/exportFiles.js";
import { readFileSync, writeFileSync, mkdirSync } from "node:fs";
const doc = JSON.parse(readFileSync("/tmp/t1/lantern-deep-field/tables.json", "utf8"));
const t0 = performance.now();
const { files, index } = exportFiles(doc, { tool: "cosmoledger", tool_version: "0.1.0", scenario_id: doc.scenario.id, scenario_title: doc.scenario.title, version: 2, version_sha256: "ab".repeat(32), inputs_sha256: doc.scenario.inputs_sha256, engine_version: "1.0.0" }, "lantern-deep-field/v2/index.html");
console.log("ms", performance.now() - t0, files.length);
mkdirSync("/tmp/ex", { recursive: true });
for (const f of files) writeFileSync("/tmp/ex/" + f.name, f.content);
