import { structuredPatch } from "diff";
import canonicalize from "canonicalize";
import {
  EARLY_QUANTITIES,
  REDSHIFT_GROUPS,
  SUMMARY_QUANTITIES,
  TARGET_QUANTITIES,
  type QuantityInfo,
} from "../contract/quantityCatalog.js";
import {
  quantityValue,
  type Num,
  type StoredModelTables,
  type StoredTablesDocument,
} from "../contract/tablesDocument.js";
import { relativeChange } from "./tablesDrift.js";
import { tablesFormatOf, type StoredVersionRecord } from "../contract/versionRecord.js";
import { quantityKeys } from "./quantityKeys.js";

/** One line of the YAML text diff: kept (" "), removed ("-") or added ("+"), with its line numbers. */
export interface SourceDiffLine {
  op: " " | "-" | "+";
  oldLine: number | null;
  newLine: number | null;
  text: string;
}
export interface SourceDiffHunk {
  header: string;
  lines: SourceDiffLine[];
}

/** A resolved input that differs: scenario-level (model null) or of one model; values as JSON text, with provenance. */
export interface InputChange {
  model: string | null;
  key: string;
  before: string;
  after: string;
  beforeNumber: number | null;
  afterNumber: number | null;
  provenanceBefore: string | null;
  provenanceAfter: string | null;
}

/** The largest change of one output quantity in one model; relative is null when a value appeared, vanished or is not numeric. */
export interface ModelOutputChange {
  relative: number | null;
  where: string;
  before: Num;
  after: Num;
  changed: boolean;
}
/**
 * One output quantity; `absent` says which side's format does not have it at all ("not computed in version N"),
 * which is never shown as a change of value.
 */
export interface OutputChange {
  section: string;
  sectionStart: boolean;
  key: string;
  label: string;
  unit: string;
  absent: "before" | "after" | null;
  models: Record<string, ModelOutputChange>;
}

export interface VersionDiff {
  from: number;
  to: number;
  source: SourceDiffHunk[];
  /** Changed inputs: set, inherited or defaulted values, and scenario-level settings. */
  inputs: InputChange[];
  /** Changed derived parameters (closure, radiation densities, ...), which follow from the inputs. */
  derived: InputChange[];
  modelsAdded: string[];
  modelsRemoved: string[];
  /** Models present in both versions, in the order of the later one. */
  commonModels: { id: string; label: string }[];
  outputs: OutputChange[];
  engine: { before: string; after: string; changed: boolean; constantsChanged: string[] };
  /** The data-contract formats of the two versions, and the quantities one has and the other does not (key paths). */
  format: { before: string; after: string; changed: boolean; quantitiesAdded: string[]; quantitiesRemoved: string[] };
  /** The single largest output change, for the history page. */
  largest: { label: string; model: string; relative: number | null; where: string } | null;
}

const text = (v: unknown) => (v === undefined ? "(absent)" : (canonicalize(v) ?? String(v)));

function sourceHunks(before: string, after: string): SourceDiffHunk[] {
  const patch = structuredPatch("before", "after", before, after, "", "", { context: 3 });
  return patch.hunks.map((h) => {
    let o = h.oldStart;
    let n = h.newStart;
    const lines: SourceDiffLine[] = [];
    for (const raw of h.lines) {
      const op = raw[0] as SourceDiffLine["op"] | "\\";
      if (op === "\\") continue; // "\ No newline at end of file"
      const body = raw.slice(1);
      if (op === " ") lines.push({ op, oldLine: o++, newLine: n++, text: body });
      else if (op === "-") lines.push({ op, oldLine: o++, newLine: null, text: body });
      else lines.push({ op, oldLine: null, newLine: n++, text: body });
    }
    return { header: `@@ -${h.oldStart},${h.oldLines} +${h.newStart},${h.newLines} @@`, lines };
  });
}

const SCENARIO_KEYS = [
  "title",
  "description",
  "author",
  "tags",
  "baseline",
  "redshifts",
  "grid",
  "targets",
  "surveys",
  "draws",
] as const;

function inputChanges(a: StoredVersionRecord, b: StoredVersionRecord): InputChange[] {
  const out: InputChange[] = [];
  for (const key of SCENARIO_KEYS) {
    const x = text((a.inputs as unknown as Record<string, unknown>)[key]);
    const y = text((b.inputs as unknown as Record<string, unknown>)[key]);
    if (x !== y)
      out.push({
        model: null,
        key,
        before: x,
        after: y,
        beforeNumber: null,
        afterNumber: null,
        provenanceBefore: null,
        provenanceAfter: null,
      });
  }
  for (const mb of b.tables.models) {
    const ma = a.tables.models.find((m) => m.id === mb.id);
    if (!ma) continue;
    const mods = (m: StoredModelTables) => m as unknown as Record<string, unknown>;
    // The spread is compared as resolved (its inputs record: form, parameters and uncertainties, or the samples
    // file's hash), not as its bands; the published sets by their ids.
    const spreadOf = (r: StoredVersionRecord, id: string) =>
      (r.inputs.models as { id: string; spread?: unknown }[]).find((m) => m.id === id)?.spread;
    const published = (m: StoredModelTables) =>
      "published" in m && m.published ? m.published.map((p) => p.id) : undefined;
    for (const [key, x, y] of [
      ["spread", spreadOf(a, mb.id), spreadOf(b, mb.id)],
      ["published", published(ma), published(mb)],
    ] as const) {
      if (text(x) !== text(y))
        out.push({
          model: mb.id,
          key,
          before: text(x),
          after: text(y),
          beforeNumber: null,
          afterNumber: null,
          provenanceBefore: null,
          provenanceAfter: null,
        });
    }
    for (const key of ["label", "extends", "notes"] as const) {
      if (text(mods(ma)[key]) !== text(mods(mb)[key]))
        out.push({
          model: mb.id,
          key,
          before: text(mods(ma)[key]),
          after: text(mods(mb)[key]),
          beforeNumber: null,
          afterNumber: null,
          provenanceBefore: null,
          provenanceAfter: null,
        });
    }
    const keys = [...new Set([...Object.keys(mb.parameters), ...Object.keys(ma.parameters)])];
    for (const key of keys) {
      const pa = (ma.parameters as unknown as Record<string, unknown>)[key];
      const pb = (mb.parameters as unknown as Record<string, unknown>)[key];
      const va = (ma.provenance as Record<string, string>)[key] ?? null;
      const vb = (mb.provenance as Record<string, string>)[key] ?? null;
      if (text(pa) !== text(pb) || va !== vb)
        out.push({
          model: mb.id,
          key,
          before: text(pa),
          after: text(pb),
          beforeNumber: typeof pa === "number" ? pa : null,
          afterNumber: typeof pb === "number" ? pb : null,
          provenanceBefore: va,
          provenanceAfter: vb,
        });
    }
  }
  return out;
}

function change(before: Num | string | undefined, after: Num | string | undefined, where: string): ModelOutputChange {
  const b = typeof before === "number" ? before : null;
  const a = typeof after === "number" ? after : null;
  if (b !== null && a !== null) {
    const r = relativeChange(b, a);
    return { relative: r, where, before: b, after: a, changed: r !== 0 };
  }
  return { relative: null, where, before: b, after: a, changed: text(before ?? null) !== text(after ?? null) };
}

/** Keeps the larger of two changes; a change with no relative size (appeared, vanished) outranks any number. */
function worse(x: ModelOutputChange | undefined, y: ModelOutputChange): ModelOutputChange {
  if (!x) return y;
  if (y.changed && y.relative === null) return x.changed && x.relative === null ? x : y;
  if (x.changed && x.relative === null) return x;
  return (y.relative ?? 0) > (x.relative ?? 0) ? y : x;
}

function rowsChange(
  ma: StoredModelTables,
  mb: StoredModelTables,
  key: Parameters<typeof quantityValue>[1],
): ModelOutputChange {
  let w: ModelOutputChange | undefined;
  for (const rb of mb.redshifts) {
    const ra = ma.redshifts.find((r) => r.z === rb.z);
    if (ra) w = worse(w, change(quantityValue(ra, key), quantityValue(rb, key), `z = ${rb.z}`));
  }
  return w ?? { relative: null, where: "no redshift in common", before: null, after: null, changed: false };
}

function namedChange<T extends { name: string }>(
  xs: T[],
  ys: T[],
  key: Parameters<typeof quantityValue>[1],
): ModelOutputChange {
  let w: ModelOutputChange | undefined;
  for (const y of ys) {
    const x = xs.find((e) => e.name === y.name);
    if (x) w = worse(w, change(quantityValue(x, key), quantityValue(y, key), y.name));
  }
  return w ?? { relative: null, where: "none in common", before: null, after: null, changed: false };
}

function outputChanges(a: StoredTablesDocument, b: StoredTablesDocument, common: string[]): OutputChange[] {
  const out: OutputChange[] = [];
  const model = (doc: StoredTablesDocument, id: string) => doc.models.find((m) => m.id === id)!;
  const keysA = quantityKeys(a);
  const keysB = quantityKeys(b);
  const add = (
    section: string,
    path: string,
    q: QuantityInfo,
    f: (ma: StoredModelTables, mb: StoredModelTables) => ModelOutputChange,
  ) => {
    const inA = keysA.has(path);
    const inB = keysB.has(path);
    if (!inA && !inB) return;
    const models: Record<string, ModelOutputChange> = {};
    for (const id of common)
      models[id] =
        inA && inB
          ? f(model(a, id), model(b, id))
          : { relative: null, where: "", before: null, after: null, changed: false };
    out.push({
      section,
      sectionStart: out.at(-1)?.section !== section,
      key: q.key,
      label: q.label,
      unit: q.unit,
      absent: !inA ? "before" : !inB ? "after" : null,
      models,
    });
  };
  for (const q of [
    ...SUMMARY_QUANTITIES,
    ...EARLY_QUANTITIES.filter((e) => !SUMMARY_QUANTITIES.some((s) => s.key === e.key)),
  ]) {
    add("Summary", `summary.${q.key}`, q, (ma, mb) =>
      change(quantityValue(ma.summary, q.key), quantityValue(mb.summary, q.key), "today"),
    );
  }
  for (const g of REDSHIFT_GROUPS)
    for (const q of g.quantities)
      add(`Redshift table: ${g.title}`, `redshifts[].${q.key}`, q, (ma, mb) => rowsChange(ma, mb, q.key));
  if (b.models[0]?.targets.length || a.models[0]?.targets.length) {
    for (const q of TARGET_QUANTITIES)
      add("Targets", `targets[].${q.key}`, q, (ma, mb) => namedChange(ma.targets, mb.targets, q.key));
  }
  if (b.models[0]?.surveys.length || a.models[0]?.surveys.length) {
    add(
      "Survey shells",
      "surveys[].volume_Gpc3",
      { key: "volume_Gpc3", label: "Shell volume", unit: "Gpc^3" },
      (ma, mb) => namedChange(ma.surveys, mb.surveys, "volume_Gpc3"),
    );
    add(
      "Survey shells",
      "surveys[].expected_count",
      { key: "expected_count", label: "Expected count", unit: "" },
      (ma, mb) => namedChange(ma.surveys, mb.surveys, "expected_count"),
    );
  }
  return out;
}

/** What changed from version `a` to version `b` of one scenario: source text, resolved inputs, outputs and engine. */
export function versionDiff(a: StoredVersionRecord, b: StoredVersionRecord): VersionDiff {
  const idsA = a.tables.models.map((m) => m.id);
  const idsB = b.tables.models.map((m) => m.id);
  const common = idsB.filter((id) => idsA.includes(id));
  const outputs = outputChanges(a.tables, b.tables, common);
  const changes = inputChanges(a, b);
  const isDerived = (c: InputChange) => c.provenanceBefore === "derived" && c.provenanceAfter === "derived";
  let largest: VersionDiff["largest"] = null;
  let best: ModelOutputChange | undefined;
  const keysA = quantityKeys(a.tables);
  const keysB = quantityKeys(b.tables);
  for (const o of outputs)
    for (const id of common) {
      const c = o.models[id];
      if (c.changed && worse(best, c) === c && c !== best) {
        best = c;
        largest = { label: o.label, model: id, relative: c.relative, where: c.where };
      }
    }
  const constants = new Set([...Object.keys(a.engine.constants), ...Object.keys(b.engine.constants)]);
  const constant = (r: StoredVersionRecord, k: string) => (r.engine.constants as Record<string, unknown>)[k];
  return {
    from: a.version,
    to: b.version,
    source: sourceHunks(a.source.text, b.source.text),
    inputs: changes.filter((c) => !isDerived(c)),
    derived: changes.filter(isDerived),
    modelsAdded: idsB.filter((id) => !idsA.includes(id)),
    modelsRemoved: idsA.filter((id) => !idsB.includes(id)),
    commonModels: common.map((id) => ({ id, label: b.tables.models.find((m) => m.id === id)!.label })),
    outputs,
    engine: {
      before: a.engine.version,
      after: b.engine.version,
      changed: a.engine.version !== b.engine.version,
      constantsChanged: [...constants].filter((k) => text(constant(a, k)) !== text(constant(b, k))).sort(),
    },
    format: {
      before: a.tables.format,
      after: b.tables.format,
      changed: tablesFormatOf(a.tables) !== tablesFormatOf(b.tables),
      quantitiesAdded: [...keysB].filter((k) => !keysA.has(k)).sort(),
      quantitiesRemoved: [...keysA].filter((k) => !keysB.has(k)).sort(),
    },
    largest,
  };
}
