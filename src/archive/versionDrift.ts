import {
  DECLARED_CHANGES,
  ENGINE_TOLERANCE,
  ENGINE_VERSION,
  explainingChange,
  type DeclaredChange,
} from "../engine/index.js";
import type { StoredTablesDocument, TablesDocument } from "../contract/tablesDocument.js";
import { tablesDrift } from "./tablesDrift.js";
import { fateInFormat } from "../contract/quantityCatalog.js";
import { tablesFormatOf } from "../contract/versionRecord.js";

/** Drift of one quantity in one model of one archived version, recomputed with the current code. */
export interface DriftFinding {
  model: string;
  quantity: string;
  relative: number;
  where: string;
  before: unknown;
  after: unknown;
  /** The declared engine change that explains it, or null. */
  explainedBy: DeclaredChange | null;
}

/**
 * How a stored tables document compares with the same inputs recomputed now, separated into three kinds:
 * - `added`: quantities the current format has and the stored one lacks (not drift: they were never computed);
 * - `removed`: quantities the stored one has and the current format lacks (a format that dropped a key);
 * - `drift`: quantities in both whose values moved by more than the tolerance, each explained by a declared engine
 *   change or not. `largest` is the largest relative change of each quantity present in both (for the full table).
 * Models are matched by id; a model missing on one side is reported in `shape`.
 */
export interface VersionComparison {
  added: string[];
  removed: string[];
  drift: DriftFinding[];
  shape: string[];
  largest: { quantity: string; relative: number; model: string; where: string }[];
}

export function compareWithRecomputed(
  stored: StoredTablesDocument,
  now: TablesDocument,
  changes: readonly DeclaredChange[] = DECLARED_CHANGES,
  currentEngine: string = ENGINE_VERSION,
  tolerance: number = ENGINE_TOLERANCE,
): VersionComparison {
  const added = new Set<string>();
  const removed = new Set<string>();
  const drift: DriftFinding[] = [];
  const shape: string[] = [];
  const largest = new Map<string, VersionComparison["largest"][number]>();
  const consider = (
    model: string,
    parameters: Parameters<typeof explainingChange>[1],
    before: unknown,
    after: unknown,
    skip: string[] = [],
  ) => {
    for (const d of tablesDrift(before, after, skip)) {
      if (d.absent === "before") {
        added.add(d.quantity);
        continue;
      }
      if (d.absent === "after") {
        removed.add(d.quantity);
        continue;
      }
      const seen = largest.get(d.quantity);
      if (!seen || d.relative > seen.relative)
        largest.set(d.quantity, { quantity: d.quantity, relative: d.relative, model, where: d.where });
      if (d.relative > tolerance) {
        drift.push({
          model,
          quantity: d.quantity,
          relative: d.relative,
          where: d.where,
          before: d.before,
          after: d.after,
          explainedBy: explainingChange(d.quantity, parameters, stored.engine.version, changes, currentEngine),
        });
      }
    }
  };
  for (const m of stored.models) {
    const n = now.models.find((x) => x.id === m.id);
    if (!n) {
      shape.push(`model ${m.id} is no longer computed`);
      continue;
    }
    // id, the derived differences and the warnings about inputs (which follow from the hashed inputs) are not
    // quantities of the model; everything else is compared. The fate is
    // compared in the stored format's own vocabulary (formats 1 and 2 say only expands_forever or recollapses).
    const storedFormat = tablesFormatOf(stored);
    const nowInStoredTerms =
      storedFormat >= 3 ? n : { ...n, summary: { ...n.summary, fate: fateInFormat(n.summary.fate, storedFormat) } };
    consider(m.id, m.parameters, m, nowInStoredTerms, ["id", "input_warnings"]);
  }
  for (const n of now.models)
    if (!stored.models.some((m) => m.id === n.id)) shape.push(`model ${n.id} is computed now but was not stored`);
  // The cautions belong to the scenario; a change of their text is explained only by a change that names "cautions".
  const anyModel = stored.models[0].parameters;
  consider("(scenario)", anyModel, { cautions: stored.cautions }, { cautions: now.cautions });
  return { added: [...added].sort(), removed: [...removed].sort(), drift, shape, largest: [...largest.values()] };
}
