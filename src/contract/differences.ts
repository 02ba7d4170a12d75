import type { Difference, ModelDifferences, ModelTables, Num, RedshiftRow } from "./tablesDocument.js";

function relative(x: Num | string, base: Num | string): Num {
  if (typeof x !== "number" || typeof base !== "number" || base === 0) return null;
  return (x - base) / Math.abs(base);
}

function rowDifferences(rows: RedshiftRow[], baseRows: RedshiftRow[]): Record<string, Num>[] {
  return rows.map((row, i) => {
    const base = baseRows[i];
    const out: Record<string, Num> = { z: row.z };
    const r = row as unknown as Record<string, Num>;
    const rb = base as unknown as Record<string, Num>;
    for (const key of Object.keys(r)) {
      if (key === "z") continue;
      const x = r[key];
      const b = rb[key];
      out[key] = relative(x, b);
    }
    return out;
  });
}

/** Each model against the baseline: summary differences (absolute and relative) and relative differences per table row. */
export function differencesFromBaseline(model: ModelTables, baseline: ModelTables): ModelDifferences {
  const summary: Record<string, Difference> = {};
  for (const [key, value] of Object.entries(model.summary)) {
    const b = (baseline.summary as Record<string, Num | string>)[key];
    if (typeof value === "string" || typeof b === "string" || (value === null && b === null && key.endsWith("_note")))
      continue;
    summary[key] = { absolute: value !== null && b !== null ? value - b : null, relative: relative(value, b) };
  }
  return {
    summary,
    redshifts: rowDifferences(model.redshifts, baseline.redshifts),
  };
}
