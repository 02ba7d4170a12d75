import { chartSpecs, chartPng, chartSvg } from "./dist/exports/chartImage.js";
import { readFileSync } from "node:fs";
const doc = JSON.parse(readFileSync("/tmp/t1/lantern-deep-field/tables.json", "utf8"));
const p = { tool: "cosmoledger", tool_version: "0.1.0", scenario_id: "x", scenario_title: "t", version: 2, version_sha256: "ab".repeat(32), inputs_sha256: "cd".repeat(32), engine_version: "1.0.0", page: "x" };
const specs = chartSpecs(doc);
chartPng(specs[0], p); chartSvg(specs[0], p);
let t0 = performance.now(); for (const s of specs) chartPng(s, p); console.log("png per chart", (performance.now() - t0) / specs.length);
t0 = performance.now(); let n = 0; for (const s of specs) n += chartSvg(s, p).length; console.log("svg per chart", (performance.now() - t0) / specs.length, n / specs.length);
