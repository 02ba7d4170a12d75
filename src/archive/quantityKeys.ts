import type { StoredTablesDocument } from "../contract/tablesDocument.js";

/**
 * The output quantities a tables document holds, as key paths within a model (`summary.age_Gyr`,
 * `redshifts[].age_Gyr`, `grid.age_Gyr`, `targets[].z`, `surveys[].volume_Gpc3`), read from the document itself:
 * what its format has, whatever this release computes. The union over its models.
 */
export function quantityKeys(doc: StoredTablesDocument): Set<string> {
  const keys = new Set<string>();
  for (const m of doc.models) {
    for (const k of Object.keys(m.summary)) keys.add(`summary.${k}`);
    for (const r of m.redshifts.slice(0, 1)) for (const k of Object.keys(r)) keys.add(`redshifts[].${k}`);
    for (const k of Object.keys(m.grid)) keys.add(`grid.${k}`);
    for (const t of m.targets.slice(0, 1)) for (const k of Object.keys(t)) keys.add(`targets[].${k}`);
    for (const s of m.surveys.slice(0, 1)) for (const k of Object.keys(s)) keys.add(`surveys[].${k}`);
  }
  return keys;
}
