// Evaluates one spread's 2,000 draws through the draw pool of the compiled modules (dist/) and prints, as JSON, how
// many draws the helper thread evaluated and a hash of every number and status: for test/spread/spreadCli.test.ts.
import { createHash } from "node:crypto";
import { join } from "node:path";

const dist = join(import.meta.dirname, "../../dist");
const { loadScenario } = await import(join(dist, "scenario/loadScenario.js"));
const { buildTablesDocument } = await import(join(dist, "tables/buildTablesDocument.js"));
const { gridRedshifts } = await import(join(dist, "tables/gridRedshifts.js"));
const { layoutKeysOf } = await import(join(dist, "tables/drawEvaluation.js"));
const { evaluateDraws } = await import(join(dist, "tables/drawPool.js"));
const { spreadDraws } = await import(join(dist, "tables/spreadBands.js"));

const yaml = [
  "title: pool",
  "redshifts: [1]",
  "grid: { points: 40 }",
  "draws: { count: 2000, seed: 5 }",
  "models:",
  "  - { id: m, H0: 70, Omega_m: 0.3, omega_b: 0.0224, spread: { normal: { H0: 1, Omega_m: 0.01 } } }",
  "",
].join("\n");
const s = loadScenario(yaml, "pool.yaml");
const doc = buildTablesDocument(s); // this also starts the helper thread, so that it is idle and ready for the job
const m = s.models[0];
const grid = gridRedshifts(s.grid);
const d = spreadDraws(m.spread, m.id, s.draws.count, s.draws.seed, undefined);
const job = {
  inputs: m.inputs,
  keys: d.keys,
  values: d.values,
  weights: null,
  count: d.count,
  where: { redshifts: s.redshifts, grid, targets: s.targets, surveys: s.surveys },
  layout: layoutKeysOf(doc.models[0], grid.length),
};
const r = evaluateDraws(job, s.redshifts.length + grid.length);
const hash = createHash("sha256")
  .update(new Uint8Array(r.out.buffer))
  .update(new Uint8Array(r.status.buffer))
  .digest("hex");
console.log(JSON.stringify({ helperDraws: r.helperDraws, count: d.count, hash }));
