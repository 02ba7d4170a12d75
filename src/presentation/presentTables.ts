import { quantityValue, type StoredModelTables, type StoredTablesDocument } from "../contract/tablesDocument.js";
import { catalogFor, fateText } from "../contract/quantityCatalog.js";
import { intervalOf, type IntervalText } from "./formatInterval.js";
import {
  columnIsScientific,
  exactParts,
  formatNumber,
  formatPercent,
  numberParts,
  numberPartsIn,
  partsText,
  type NumberParts,
} from "./formatNumber.js";
import { displayUnit, presentationNotes, type PresentedDocument } from "./presentDocument.js";
import { chartData } from "./chartData.js";
export { keysOfRows, rowKeys } from "./rowKeys.js";

/** One cell: the raw value (full precision, for CSV and JSON) and what the page prints (number parts or text). */
export interface PresentationCell {
  kind: "number" | "text";
  value: number | string | null;
  parts: NumberParts | null;
  text: string;
  /** For a model with a spread: the median of its draws and the central 68 % interval (absent otherwise). */
  interval?: IntervalText;
  /** Pages only: the difference from the baseline model ("+12.3 (+1.23 %)" or "+1.23 %"), notable above 1 %. */
  difference?: { text: string; notable: boolean };
  /** Pages only: how the value came to be (set, inherited, default, derived), for the models table. */
  provenance?: string;
}
export interface PresentationRow {
  label: string;
  unit: string;
  cells: PresentationCell[];
}

/** A table as the page shows it, ready for every export format. Units sit in the row labels or in `spans`. */
export interface PresentationTable {
  id: string;
  title: string;
  /** The page section the table sits in (for the provenance address). */
  anchor: string;
  /**
   * Header cells spanning the columns of one quantity (redshift tables): one span over the models for a table of one
   * quantity, one per quantity for a whole group. null for tables whose rows are quantities.
   */
  spans: { label: string; unit: string; columns: number }[] | null;
  stub: string;
  /**
   * tex: the model's LaTeX label (label_tex), used by the LaTeX export instead of the escaped plain label; model: for
   * a model's column, its id, whether it is the baseline and the models it extends (the page's models header).
   */
  columns: {
    label: string;
    unit: string;
    tex?: string;
    model?: { id: string; baseline: boolean; parents: string[] };
  }[];
  rows: PresentationRow[];
  /** What the numbers cannot say (h units and each model's H0, warnings), printed with the table in every format. */
  notes: string[];
}

/** Target quantities that exist only when the target was given their input (a size, a luminosity, an angle). */
const ASKED_FOR = new Set([
  "angular_size_arcsec",
  "apparent_magnitude",
  "bolometric_flux_erg_s_cm2",
  "size_arcsec",
  "proper_size_kpc",
  "comoving_size_kpc",
]);

/** Whether a relative difference is above 1 % (such cells stand out on pages). */
const notable = (x: number | null | undefined) => typeof x === "number" && Math.abs(x) > 0.01;

/** A number as every output prints it: its raw value and its six significant figures (an em dash for none). */
export const numberCell = (x: number | null | undefined): PresentationCell => {
  const parts = numberParts(x);
  return { kind: "number", value: x ?? null, parts, text: partsText(parts) };
};
const num = numberCell;
const inStyle = (x: number | null | undefined, scientific: boolean): PresentationCell => {
  const parts = numberPartsIn(x, scientific);
  return { kind: "number", value: x ?? null, parts, text: partsText(parts) };
};
const exact = (x: number | null | undefined): PresentationCell => {
  const parts = exactParts(x);
  return { kind: "number", value: x ?? null, parts, text: partsText(parts) };
};
const text = (s: string | null | undefined): PresentationCell => ({
  kind: "text",
  value: s ?? null,
  parts: null,
  text: s ?? "",
});

type BandSection = "summary" | "redshifts" | "targets" | "surveys";
/** A cell with the model's 68 % interval of the same quantity, when the model has a spread and the quantity a band. */
const banded = (
  cell: PresentationCell,
  m: StoredModelTables,
  where: BandSection,
  row: number | null,
  key: string,
): PresentationCell => {
  if (!("spread" in m) || !m.spread) return cell;
  const section = m.spread[where] as unknown;
  const holder = (row === null ? section : (section as unknown[])[row]) as Record<string, never> | undefined;
  const interval = intervalOf(holder?.[key]);
  return interval ? { ...cell, interval } : cell;
};

/** The per-redshift quantities a proposal quotes, in the order the key-number sheet lists them. */
const SHEET_ROWS = [
  ["luminosity_distance_Mpc", "D_L", "Mpc"],
  ["angular_diameter_distance_Mpc", "D_A", "Mpc"],
  ["kpc_per_arcsec_proper", "Proper scale", "kpc/arcsec"],
  ["lookback_time_Gyr", "Lookback time", "Gyr"],
  ["age_Gyr", "Age at z", "Gyr"],
] as const;
const GROWTH_SHEET_ROWS = [
  ["sigma8_z", "sigma8(z)", ""],
  ["f_sigma8", "f sigma8", ""],
] as const;

/**
 * "Numbers to quote": the key-number sheet at the top of a scenario page, models side by side. Every target as it
 * was placed (its redshift when solved, then its angular or physical size, magnitude or flux as given), then the
 * headline quantities at each table redshift, then the age today. Read from the document, never recomputed.
 */
/** The key-number sheet alone (the page renders it; its exports come with the other tables). */
export function keyNumbersTable(p: PresentedDocument): PresentationTable {
  return keyNumbers(p, modelColumns(p.doc));
}

function modelColumns(doc: StoredTablesDocument): PresentationTable["columns"] {
  return doc.models.map((m) => {
    const tex = "label_tex" in m ? m.label_tex : null; // format 3 on
    const model = {
      id: m.id,
      baseline: m.id === doc.scenario.baseline,
      parents: m.extends === null || m.extends === undefined ? [] : Array.isArray(m.extends) ? m.extends : [m.extends],
    };
    return tex ? { label: m.label, unit: "", tex, model } : { label: m.label, unit: "", model };
  });
}

function keyNumbers(p: PresentedDocument, columns: PresentationTable["columns"]): PresentationTable {
  const doc = p.doc;
  const models = doc.models;
  const rows: PresentationRow[] = [];
  // Each number with its 68 % interval when the model has a spread (where: the band's section, row and key).
  const row = (
    label: string,
    unit: string,
    value: (m: StoredModelTables) => number | null | undefined,
    where: [BandSection, number | null, string],
  ) =>
    rows.push({
      label,
      unit: displayUnit(p, unit),
      cells: models.map((m) => banded(num(value(m)), m, ...where)),
    });
  models[0].targets.forEach((t, ti) => {
    const at = (m: StoredModelTables) => m.targets[ti] as unknown as Record<string, number | null | undefined>;
    const key = (k: string): [BandSection, number, string] => ["targets", ti, k];
    if (t.placed_by !== "z") row(`${t.name}: redshift`, "", (m) => at(m).z, key("z"));
    else rows.push({ label: `${t.name}: redshift`, unit: "", cells: models.map(() => exact(t.z)) }); // as given
    if (t.angular_size_arcsec !== null)
      row(`${t.name}: angular size`, "arcsec", (m) => at(m).angular_size_arcsec, key("angular_size_arcsec"));
    if ((t as Record<string, unknown>).proper_size_kpc != null)
      row(`${t.name}: proper size`, "kpc", (m) => at(m).proper_size_kpc, key("proper_size_kpc"));
    if (t.apparent_magnitude !== null)
      row(`${t.name}: apparent magnitude`, "mag", (m) => at(m).apparent_magnitude, key("apparent_magnitude"));
    if (t.bolometric_flux_erg_s_cm2 !== null)
      row(
        `${t.name}: bolometric flux`,
        "erg/s/cm^2",
        (m) => at(m).bolometric_flux_erg_s_cm2,
        key("bolometric_flux_erg_s_cm2"),
      );
  });
  // sigma8(z) and f sigma8 where a model gives sigma8 today (format 6 on), as survey forecasts quote them.
  const sigma8Rows = models.some((m) => (m.parameters as Record<string, unknown>).sigma8 != null)
    ? GROWTH_SHEET_ROWS
    : [];
  models[0].redshifts.forEach((r, ri) => {
    for (const [key, label, unit] of [...SHEET_ROWS, ...sigma8Rows])
      row(
        `z = ${exact(r.z).text}: ${label}`,
        unit,
        (m) => (m.redshifts[ri] as unknown as Record<string, number | null>)[key],
        ["redshifts", ri, key],
      );
  });
  row("Age today", "Gyr", (m) => m.summary.age_Gyr, ["summary", null, "age_Gyr"]);
  if (sigma8Rows.length > 0)
    row("S8", "", (m) => quantityValue(m.summary, "S8") as number | null | undefined, ["summary", null, "S8"]);
  return {
    id: "key-numbers",
    title: "Numbers to quote",
    anchor: "key-numbers",
    spans: null,
    stub: "Quantity",
    columns,
    rows,
    notes: presentationNotes(p),
  };
}

/** Every table of a scenario page in page order: models, at a glance, each redshift table, early universe, targets, surveys. */
export function presentationTables(p: PresentedDocument): PresentationTable[] {
  const doc = p.doc;
  // Only the quantities this document's format holds: a quantity added by a later format is left out, never blank.
  const { EARLY_QUANTITIES, PARAMETERS, REDSHIFT_GROUPS, SUMMARY_QUANTITIES, TARGET_QUANTITIES, hasEarlyUniverse } =
    catalogFor(doc, p.hUnits);
  const models = doc.models;
  const columns = modelColumns(doc);
  const perModel = (label: string, unit: string, f: (m: StoredModelTables) => PresentationCell): PresentationRow => ({
    label,
    unit,
    cells: models.map(f),
  });
  const tables: Omit<PresentationTable, "notes">[] = [keyNumbers(p, columns)];
  const baseId = doc.scenario.baseline;
  /** A summary cell of model m with its difference from the baseline (absolute and relative). */
  const summaryDiff = (
    cell: PresentationCell,
    m: StoredModelTables,
    key: string,
    percentOnly = false,
  ): PresentationCell => {
    const d =
      m.id === baseId
        ? undefined
        : (
            doc.differences[m.id]?.summary as
              | Record<string, { absolute: number | null; relative: number | null }>
              | undefined
          )?.[key];
    if (!d || d.absolute === null) return cell;
    // A difference below the engine's accuracy is rounding noise of an exact conversion (c/H0 in h^-1 Mpc): zero.
    if (d.relative !== null && Math.abs(d.relative) < 1e-10)
      return { ...cell, difference: { text: `0 (${formatPercent(0)})`, notable: false } };
    if (percentOnly && d.relative !== null)
      return { ...cell, difference: { text: formatPercent(d.relative), notable: notable(d.relative) } };
    const sign = d.absolute > 0 ? "+" : "";
    return {
      ...cell,
      difference: {
        text: `${sign}${formatNumber(d.absolute)} (${formatPercent(d.relative)})`,
        notable: notable(d.relative),
      },
    };
  };
  /** A per-redshift cell of model m with its relative difference from the baseline. */
  const rowDiff = (cell: PresentationCell, m: StoredModelTables, i: number, key: string): PresentationCell => {
    if (m.id === baseId) return cell;
    const rel = (doc.differences[m.id]?.redshifts[i] as Record<string, number | null> | undefined)?.[key] ?? null;
    // Below the engine's accuracy a relative difference is rounding noise: zero.
    const shown = rel !== null && Math.abs(rel) < 1e-10 ? 0 : rel;
    return { ...cell, difference: { text: formatPercent(shown), notable: notable(shown) } };
  };
  tables.push({
    id: "models",
    title: "Models side by side",
    anchor: "models",
    spans: null,
    stub: "Parameter",
    columns,
    rows: [
      ...PARAMETERS.map((q) =>
        perModel(q.label, q.unit, (m) => {
          const v = (m.parameters as unknown as Record<string, number | null>)[q.key];
          const how = (m.provenance as Record<string, string>)[q.key] ?? "derived";
          return { ...(how === "derived" ? num(v) : exact(v)), provenance: how };
        }),
      ),
      perModel("Massive neutrinos", "eV", (m) =>
        text(m.parameters.m_nu_eV.length ? m.parameters.m_nu_eV.join(", ") : "none"),
      ),
      perModel("Radiation", "", (m) => text(m.parameters.radiation)),
      perModel("Curvature fixed by", "", (m) => text(m.parameters.curvature_from)),
      perModel("Notes", "", (m) => text(m.notes)),
    ],
  });
  tables.push({
    id: "glance",
    title: "At a glance",
    anchor: "glance",
    spans: null,
    stub: "Quantity",
    columns,
    rows: [
      perModel("Geometry", "", (m) => text(m.summary.geometry as string)),
      perModel("Fate", "", (m) => text(fateText(m.summary.fate))),
      ...SUMMARY_QUANTITIES.map((q) =>
        perModel(q.label, q.unit, (m) =>
          summaryDiff(
            banded(num(quantityValue(m.summary, q.key) as number | null), m, "summary", null, q.key),
            m,
            q.key,
          ),
        ),
      ),
    ],
  });
  // One column, one style: a model's column of a quantity is scientific when any of its rows needs it.
  const zValue = (m: StoredModelTables, i: number, key: string) =>
    quantityValue(m.redshifts[i], key as never) as number | null;
  const zStyle = new Map<string, boolean[]>();
  const zScientific = (key: string) => {
    let styles = zStyle.get(key);
    if (!styles) {
      styles = models.map((m) => columnIsScientific(m.redshifts.map((_, i) => zValue(m, i, key))));
      zStyle.set(key, styles);
    }
    return styles;
  };
  for (const g of REDSHIFT_GROUPS) {
    if (g.id === "bao" && !hasEarlyUniverse) continue;
    // The whole group in one table (a column block per quantity), then each quantity's table as the page shows it.
    tables.push({
      id: `group-${g.id}`,
      title: g.title,
      anchor: `group-${g.id}`,
      spans: g.quantities.map((q) => ({ label: q.label, unit: q.unit, columns: models.length })),
      stub: "z",
      columns: g.quantities.flatMap(() => columns),
      rows: models[0].redshifts.map((r, i) => ({
        label: exact(r.z).text,
        unit: "",
        cells: g.quantities.flatMap((q) =>
          models.map((m, mi) => banded(inStyle(zValue(m, i, q.key), zScientific(q.key)[mi]), m, "redshifts", i, q.key)),
        ),
      })),
    });
    for (const q of g.quantities) {
      tables.push({
        id: `z-${q.key}`,
        title: `${g.title}: ${q.label}`,
        anchor: `group-${g.id}`,
        spans: [{ label: q.label, unit: q.unit, columns: models.length }],
        stub: "z",
        columns,
        rows: models[0].redshifts.map((r, i) => ({
          label: exact(r.z).text,
          unit: "",
          cells: models.map((m, mi) =>
            rowDiff(
              banded(inStyle(zValue(m, i, q.key), zScientific(q.key)[mi]), m, "redshifts", i, q.key),
              m,
              i,
              q.key,
            ),
          ),
        })),
      });
    }
  }
  if (hasEarlyUniverse) {
    tables.push({
      id: "early",
      title: "Early universe",
      anchor: "early",
      spans: null,
      stub: "Quantity",
      columns: [{ label: "Method", unit: "" }, ...columns],
      rows: [
        ...EARLY_QUANTITIES.map((q) => ({
          label: q.label,
          unit: q.unit,
          cells: [
            text(q.method),
            // The early-universe rulers differ by their percentage (the absolute differences are in
            // differences.csv): a narrow column, so that six models fit a wide screen and a landscape page.
            ...models.map((m) =>
              summaryDiff(
                banded(num(quantityValue(m.summary, q.key) as number | null), m, "summary", null, q.key),
                m,
                q.key,
                true,
              ),
            ),
          ],
        })),
        // A note row only when a model has a note.
        ...(models.some((m) => m.summary.early_universe_note)
          ? [
              {
                label: "Note",
                unit: "",
                cells: [text(""), ...models.map((m) => text(m.summary.early_universe_note as string | null))],
              },
            ]
          : []),
      ],
    });
  }
  models[0].targets.forEach((t, ti) => {
    tables.push({
      id: `target-${ti + 1}`,
      title: `Target: ${t.name} (placed by ${t.placed_by})`,
      anchor: "targets",
      spans: null,
      stub: "Quantity",
      columns,
      rows: [
        // Rows of quantities the target was not given the input for (a magnitude without an absolute magnitude)
        // are left out, and the note row when no model has a note.
        ...TARGET_QUANTITIES.filter(
          (q) => !ASKED_FOR.has(q.key) || models.some((m) => (quantityValue(m.targets[ti], q.key) ?? null) !== null),
        ).map((q) =>
          perModel(q.label, q.unit, (m) =>
            banded(num(quantityValue(m.targets[ti], q.key) as number | null), m, "targets", ti, q.key),
          ),
        ),
        ...(models.some((m) => m.targets[ti].note) ? [perModel("Note", "", (m) => text(m.targets[ti].note))] : []),
      ],
    });
  });
  if (models[0].surveys.length > 0) {
    // Models as columns, as in every other table (so that eight models fit a printed page): for each shell, its
    // volume, volume per square degree, expected count and effective redshift with the growth there, the shell
    // named with its area and redshift range.
    const perDeg2 = "volume_per_deg2_Mpc3" in models[0].surveys[0];
    const rows: PresentationRow[] = [];
    models[0].surveys.forEach((s, si) => {
      const name = `${s.name} (${exact(s.area_deg2).text} deg², z ${exact(s.z_min).text} to ${exact(s.z_max).text})`;
      const value = (m: StoredModelTables, key: string) =>
        quantityValue(m.surveys[si], key as never) as number | null | undefined;
      rows.push(
        perModel(`${name}: volume`, displayUnit(p, "Gpc^3"), (m) =>
          banded(num(value(m, "volume_Gpc3")), m, "surveys", si, "volume_Gpc3"),
        ),
      );
      if (perDeg2)
        rows.push(
          perModel(`${name}: volume per deg²`, displayUnit(p, "Mpc^3"), (m) =>
            banded(num(value(m, "volume_per_deg2_Mpc3")), m, "surveys", si, "volume_per_deg2_Mpc3"),
          ),
        );
      rows.push(
        perModel(`${name}: expected count`, "", (m) =>
          banded(num(value(m, "expected_count")), m, "surveys", si, "expected_count"),
        ),
      );
      // Format 6 on: the volume-weighted effective redshift, and the growth there.
      if ("z_eff" in models[0].surveys[0]) {
        rows.push(
          perModel(`${name}: effective redshift (volume-weighted)`, "", (m) =>
            banded(num(value(m, "z_eff")), m, "surveys", si, "z_eff"),
          ),
          perModel(`${name}: growth rate f at z_eff`, "", (m) =>
            banded(num(value(m, "growth_rate_z_eff")), m, "surveys", si, "growth_rate_z_eff"),
          ),
        );
        if (models.some((m) => value(m, "f_sigma8_z_eff") != null))
          rows.push(
            perModel(`${name}: f sigma8 at z_eff`, "", (m) =>
              banded(num(value(m, "f_sigma8_z_eff")), m, "surveys", si, "f_sigma8_z_eff"),
            ),
          );
      }
    });
    tables.push({
      id: "surveys",
      title: "Survey shells",
      anchor: "surveys",
      spans: null,
      stub: "Shell",
      columns,
      rows,
    });
  }
  const notes = presentationNotes(p);
  return tables.map((table) => ({ ...table, notes }));
}

/** One model's "Geometry of space" card: its geometry in words, the sizes curvature implies, and its warnings. */
export interface GeometryCard {
  id: string;
  label: string;
  geometry: string;
  /** "finite 3-sphere", "infinite, hyperbolic" or "infinite, Euclidean". */
  kind: string;
  entries: { label: string; unit: string; text: string }[];
  warnings: string[];
}

const GEOMETRY_KIND: Record<string, string> = {
  closed: "finite 3-sphere",
  open: "infinite, hyperbolic",
  flat: "infinite, Euclidean",
};

/**
 * "Geometry of space", a card per model: the curvature and the sizes it implies (a closed model's total volume,
 * antipode and the share of it inside the particle horizon), in the units the page shows, with the model's warnings.
 */
export function geometryCards(p: PresentedDocument): GeometryCard[] {
  return p.doc.models.map((m) => {
    const s = m.summary as unknown as Record<string, number | null | undefined> & { geometry: string };
    const entry = (label: string, unit: string, x: number | null | undefined) => ({
      label,
      unit: displayUnit(p, unit),
      text: x === undefined ? "not computed" : num(x).text,
    });
    // Omega_k as the models table shows it: exactly as given when set, to six figures when derived.
    const kHow = (m.provenance as Record<string, string>).Omega_k ?? "derived";
    const entries = [
      { label: "Omega_k", unit: "", text: (kHow === "derived" ? num : exact)(m.parameters.Omega_k).text },
      entry("Curvature radius", "Mpc", s.curvature_radius_Mpc),
    ];
    if (s.geometry === "closed")
      entries.push(
        entry("Total comoving volume 2π²R³", "Gpc^3", s.closed_volume_Gpc3),
        entry("Antipode at πR", "Mpc", s.antipode_distance_Mpc),
        entry("Volume with antipodes identified", "Gpc^3", s.identified_antipodes_volume_Gpc3),
        entry("Fraction of the 3-sphere inside the particle horizon", "", s.observable_fraction),
      );
    entries.push(entry("Particle horizon", "Mpc", s.particle_horizon_Mpc));
    return {
      id: m.id,
      label: m.label,
      geometry: s.geometry,
      kind: GEOMETRY_KIND[s.geometry] ?? s.geometry,
      entries,
      warnings: p.warnings[m.id] ?? [],
    };
  });
}

/**
 * The data table under each chart (every few grid points, about twenty rows): z, then each model's value of each of
 * the chart's series, in the units the chart shows. Page only; the grid itself is in tables.json.
 */
export function chartDataTables(p: PresentedDocument): Record<string, PresentationTable> {
  const data = chartData(p);
  const n = data.z.length;
  const step = Math.max(1, Math.ceil(n / 20));
  const points = Array.from({ length: Math.ceil(n / step) }, (_, i) => i * step);
  const out: Record<string, PresentationTable> = {};
  for (const c of data.charts) {
    const series = c.keys.map((k) => data.series.find((s) => s.key === k)!);
    out[c.id] = {
      id: `chart-${c.id}`,
      title: c.title,
      anchor: "charts",
      spans: null,
      stub: "z",
      columns: data.models.flatMap((m) => series.map((s) => ({ label: `${m.label}: ${s.label}`, unit: s.unit }))),
      rows: points.map((i) => ({
        label: num(data.z[i]).text,
        unit: "",
        cells: data.models.flatMap((m) => series.map((s) => num(m.values[s.key][i]))),
      })),
      notes: [],
    };
  }
  return out;
}
