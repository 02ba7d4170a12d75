import type { Band, StoredModelTables, StoredTablesDocument } from "../contract/tablesDocument.js";
import { differencesFromBaseline } from "../contract/differences.js";
import { hPowerOfKey, littleHUnit, wantsLittleHUnits } from "../contract/littleHUnitNames.js";
import { TABLES_FORMAT_PREFIX } from "../contract/formats.js";
import { unitText } from "./formatNumber.js";

/** How a document is to be shown: today one choice, whether lengths are quoted in h^-1 Mpc. */
export interface DisplayChoices {
  hUnits: boolean;
}

/** The choices a document's own scenario makes (`h_units: true` in the scenario file). */
export const choicesOf = (doc: StoredTablesDocument): DisplayChoices => ({ hUnits: wantsLittleHUnits(doc) });

/**
 * A tables document as every output shows it. `doc` has the stored document's shape, with every number in display
 * units: lengths, volumes, wavenumbers and number densities converted with each model's own h when h units are on,
 * differences from the baseline taken again on the converted values, and the spreads' bands in the same units (or
 * absent where the stored document cannot give them). `stored` is the document exactly as stored: identity,
 * hashes, inputs and source are read from it, never numbers to print. Made only by `presentDocument`; renderers take
 * this type, so a stored document cannot reach a page, an export or the terminal unconverted.
 */
export interface PresentedDocument {
  readonly presented: true;
  stored: StoredTablesDocument;
  doc: StoredTablesDocument;
  hUnits: boolean;
  /** Each model's H0 (km/s/Mpc, as stored) and h = H0 / 100, in model order. */
  h: { id: string; label: string; H0: number; h: number }[];
  /** Each model's warnings (the engine's, then those about its own inputs), by model id, in the words `check` prints. */
  warnings: Record<string, string[]>;
  /** What a reader must know about the numbers shown that the numbers cannot say (one sentence each). */
  notes: string[];
}

/** A unit as this presentation writes it: in h units when they are on (Mpc -> h^-1 Mpc), else as stored. */
export const displayUnit = (p: { hUnits: boolean }, unit: string): string => (p.hUnits ? littleHUnit(unit) : unit);

type BandRecord = Record<string, Band | null>;
type GridBandRecord = Record<string, { q: (number | null)[][]; mc_error: (number | null)[][] } | null>;

const times = (x: number | null, f: number) => (x === null ? null : x * f);

/** Every number of a flat record whose key scales with h, converted (h^p); other fields as they are. */
function scaledRecord<T extends object>(record: T, h: number): T {
  const out: Record<string, unknown> = { ...(record as Record<string, unknown>) };
  for (const [k, v] of Object.entries(record)) {
    const p = hPowerOfKey(k);
    if (p === 0) continue;
    if (typeof v === "number") out[k] = v * h ** p;
    else if (Array.isArray(v)) out[k] = v.map((x) => (typeof x === "number" ? x * h ** p : x));
  }
  return out as T;
}

/** A band map in h units by one h for the whole model (exact: percentiles commute with a positive factor). */
function scaledBands(bands: BandRecord, h: number): BandRecord {
  const out: BandRecord = {};
  for (const [k, b] of Object.entries(bands)) {
    const f = h ** hPowerOfKey(k);
    out[k] = b && f !== 1 ? { q: b.q.map((x) => x * f), mc_error: b.mc_error.map((x) => x * f) } : b;
  }
  return out;
}
function scaledGridBands(bands: GridBandRecord, h: number): GridBandRecord {
  const out: GridBandRecord = {};
  for (const [k, b] of Object.entries(bands)) {
    const f = h ** hPowerOfKey(k);
    out[k] =
      b && f !== 1
        ? { q: b.q.map((c) => c.map((x) => times(x, f))), mc_error: b.mc_error.map((c) => c.map((x) => times(x, f))) }
        : b;
  }
  return out;
}
/** The bands of quantities that do not scale with h, then `replacement` for those that do (null: none shown). */
function withHBands<B>(bands: Record<string, B>, replacement: Record<string, B> | null): Record<string, B> {
  const out: Record<string, B> = {};
  for (const [k, b] of Object.entries(bands))
    out[k] = hPowerOfKey(k) === 0 ? b : replacement ? (replacement[k] ?? (null as B)) : (null as B);
  return out;
}

type StoredSpread = NonNullable<Extract<StoredModelTables, { spread?: unknown }>["spread"]>;

/**
 * A spread's bands in h units. The compute step stores them (format 5 on, `spread.h_scaled`): each draw converted
 * with its own h before the percentiles are taken. An older record that did not vary H0 gives them exactly by one
 * factor; one that varied H0 cannot, and its h-scaled bands are left out (returned flag true).
 */
function spreadInLittleH(spread: StoredSpread, h: number): { spread: StoredSpread; missing: boolean } {
  const s = spread as StoredSpread & {
    h_scaled?: Pick<StoredSpread, "summary" | "redshifts" | "targets" | "surveys" | "grid">;
  };
  const { h_scaled, ...plain } = s;
  if (h_scaled)
    return {
      spread: {
        ...plain,
        summary: withHBands(plain.summary, h_scaled.summary),
        redshifts: plain.redshifts.map((r, i) => withHBands(r, h_scaled.redshifts[i] ?? {})),
        targets: plain.targets.map((r, i) => withHBands(r, h_scaled.targets[i] ?? {})),
        surveys: plain.surveys.map((r, i) => withHBands(r, h_scaled.surveys[i] ?? {})),
        grid: withHBands(plain.grid, h_scaled.grid),
      },
      missing: false,
    };
  if (!plain.parameters.includes("H0"))
    return {
      spread: {
        ...plain,
        summary: scaledBands(plain.summary, h),
        redshifts: plain.redshifts.map((r) => scaledBands(r, h)),
        targets: plain.targets.map((r) => scaledBands(r, h)),
        surveys: plain.surveys.map((r) => scaledBands(r, h)),
        grid: scaledGridBands(plain.grid, h),
      },
      missing: false,
    };
  return {
    spread: {
      ...plain,
      summary: withHBands(plain.summary, null),
      redshifts: plain.redshifts.map((r) => withHBands(r, null)),
      targets: plain.targets.map((r) => withHBands(r, null)),
      surveys: plain.surveys.map((r) => withHBands(r, null)),
      grid: withHBands(plain.grid, null),
    },
    missing: true,
  };
}

/**
 * The one place where stored numbers become shown numbers: every page, download of an export, `export`, copy button,
 * chart and `quote` renders the result, and none converts a unit or picks a band on its own. Pure: no I/O.
 */
export function presentDocument(
  stored: StoredTablesDocument,
  choices: DisplayChoices = choicesOf(stored),
): PresentedDocument {
  const notes: string[] = [];
  const warnings: Record<string, string[]> = {};
  for (const m of stored.models)
    warnings[m.id] = [...m.warnings, ...("input_warnings" in m ? (m.input_warnings as string[]) : [])];
  const h = stored.models.map((m) => ({ id: m.id, label: m.label, H0: m.parameters.H0, h: m.parameters.H0 / 100 }));
  if (!choices.hUnits) return { presented: true, stored, doc: stored, hUnits: false, h, warnings, notes };
  const withoutHBands: string[] = [];
  const models = stored.models.map((m) => {
    const hm = m.parameters.H0 / 100;
    const out = {
      ...m,
      summary: scaledRecord(m.summary, hm),
      redshifts: m.redshifts.map((r) => scaledRecord(r, hm)),
      grid: scaledRecord(m.grid, hm),
      targets: m.targets.map((t) => scaledRecord(t, hm)),
      surveys: m.surveys.map((s) => scaledRecord(s, hm)),
    } as StoredModelTables;
    if ("spread" in m && m.spread) {
      const { spread, missing } = spreadInLittleH(m.spread as StoredSpread, hm);
      (out as { spread?: StoredSpread }).spread = spread;
      if (missing) withoutHBands.push(m.label);
    }
    return out;
  });
  if (withoutHBands.length > 0)
    notes.push(
      `The ${stored.format.replace(TABLES_FORMAT_PREFIX, "format ")} record of ${withoutHBands.join(", ")} holds the intervals of lengths and volumes in Mpc only, and its spread varies H0, so their intervals in h units cannot be given and are left out here; the Mpc intervals are in spread.csv and tables.json.`,
    );
  const baseline = models.find((m) => m.id === stored.scenario.baseline) ?? models[0];
  const differences: Record<string, unknown> = {};
  for (const m of models)
    if (m.id !== baseline.id) differences[m.id] = differencesFromBaseline(m as never, baseline as never);
  const doc = { ...stored, models, differences } as StoredTablesDocument;
  return { presented: true, stored, doc, hUnits: true, h, warnings, notes };
}

/**
 * What travels with every table of a presented document, in every format: how h units were applied (with each
 * model's H0, so that a quoted h^-1 Mpc can be turned back into Mpc), the presentation's own notes, and each model's
 * warnings in the words `check` prints.
 */
export function presentationNotes(p: PresentedDocument): string[] {
  return [...unitNotes(p), ...warningNotes(p)];
}

/** Each model's warnings as notes ("warning (label): ..."). */
export function warningNotes(p: PresentedDocument): string[] {
  const out: string[] = [];
  for (const m of p.doc.models) for (const w of p.warnings[m.id] ?? []) out.push(`warning (${m.label}): ${w}`);
  return out;
}

/** How the numbers are shown (h units and each model's H0) and the presentation's own notes. */
export function unitNotes(p: PresentedDocument): string[] {
  const out: string[] = [];
  if (p.hUnits)
    out.push(
      `Lengths are in ${unitText("h^-1 Mpc")}, volumes in ${unitText("h^-3 Mpc^3")} and wavenumbers in ${unitText("h/Mpc")}, each model with its own h = H0/100 (${p.h
        .map((m) => `${m.label}: H0 = ${m.H0} km/s/Mpc`)
        .join("; ")}).`,
    );
  out.push(...p.notes);
  return out;
}
