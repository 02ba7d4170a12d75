// The least a compute of the bench scenario can cost beyond Node's own start-up: serialising its tables document and
// writing tables.json as compute does (writeFileSync, then fsync), and nothing else: no module of ours, no scenario,
// no engine. The document comes prepared (compute.js): its chart grid as raw doubles (grid.f64) and the rest as a
// small JSON skeleton, rebuilt here into the same object, so the bytes written are compute's own tables.json.
import { closeSync, fsyncSync, openSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";

const [prepared, out] = process.argv.slice(2);
const doc = JSON.parse(readFileSync(join(prepared, "skeleton.json"), "utf8"));
const raw = readFileSync(join(prepared, "grid.f64"));
const doubles = new Float64Array(raw.buffer, raw.byteOffset, raw.byteLength / 8);
let at = 0;
for (const model of doc.models) {
  for (const key of Object.keys(model.grid)) {
    const n = model.grid[key];
    const column = [];
    for (let i = 0; i < n; i++) {
      const v = doubles[at++];
      column.push(Number.isNaN(v) ? null : v);
    }
    model.grid[key] = column;
  }
}
writeFileSync(out, `${JSON.stringify(doc)}\n`);
const fd = openSync(out, "r+");
fsyncSync(fd);
closeSync(fd);
