import { quantityValue, type StoredModelTables, type StoredTablesDocument } from "../contract/tablesDocument.js";
import { catalogFor, fateText } from "../contract/quantityCatalog.js";
import { littleHUnit, wantsLittleHUnits } from "../contract/littleHUnitNames.js";
import { intervalOf, type IntervalText } from "../contract/formatInterval.js";
import {
  columnIsScientific,
  exactParts,
  numberParts,
  numberPartsIn,
  partsText,
  type NumberParts,
} from "../contract/formatNumber.js";

/** One cell: the raw value (full precision, for CSV and JSON) and what the page prints (number parts or text). */
export interface ExportCell {
  kind: "number" | "text";
  value: number | string | null;
  parts: NumberParts | null;
  text: string;
  /** For a model with a spread: the median of its draws and the central 68 % interval (absent otherwise). */
  interval?: IntervalText;
}
export interface ExportRow {
  label: string;
  unit: string;
  cells: ExportCell[];
}

/** A table as the page shows it, ready for every export format. Units sit in the row labels or in `spans`. */
export interface ExportTable {
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
  /** tex: the model's LaTeX label (label_tex), used by the LaTeX export instead of the escaped plain label. */
  columns: { label: string; unit: string; tex?: string }[];
  rows: ExportRow[];
}

const num = (x: number | null | undefined): ExportCell => {
  const parts = numberParts(x);
  return { kind: "number", value: x ?? null, parts, text: partsText(parts) };
};
const inStyle = (x: number | null | undefined, scientific: boolean): ExportCell => {
  const parts = numberPartsIn(x, scientific);
  return { kind: "number", value: x ?? null, parts, text: partsText(parts) };
};
const exact = (x: number | null | undefined): ExportCell => {
  const parts = exactParts(x);
  return { kind: "number", value: x ?? null, parts, text: partsText(parts) };
};
const text = (s: string | null | undefined): ExportCell => ({
  kind: "text",
  value: s ?? null,
  parts: null,
  text: s ?? "",
});

type BandSection = "summary" | "redshifts" | "targets" | "surveys";
/** A cell with the model's 68 % interval of the same quantity, when the model has a spread and the quantity a band. */
const banded = (
  cell: ExportCell,
  m: StoredModelTables,
  where: BandSection,
  row: number | null,
  key: string,
): ExportCell => {
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

/**
 * "Numbers to quote": the key-number sheet at the top of a scenario page, models side by side. Every target as it
 * was placed (its redshift when solved, then its angular or physical size, magnitude or flux as given), then the
 * headline quantities at each table redshift, then the age today. Read from the document, never recomputed.
 */
/** The key-number sheet alone (the page renders it; its exports come with the other tables). */
export function keyNumbersTable(doc: StoredTablesDocument): ExportTable {
  return keyNumbers(doc, modelColumns(doc));
}

function modelColumns(doc: StoredTablesDocument): ExportTable["columns"] {
  return doc.models.map((m) => {
    const tex = "label_tex" in m ? m.label_tex : null; // format 3 on
    return tex ? { label: m.label, unit: "", tex } : { label: m.label, unit: "" };
  });
}

function keyNumbers(doc: StoredTablesDocument, columns: ExportTable["columns"]): ExportTable {
  const models = doc.models;
  const rows: ExportRow[] = [];
  const h = wantsLittleHUnits(doc);
  // Each number with its 68 % interval when the model has a spread (where: the band's section, row and key).
  const row = (
    label: string,
    unit: string,
    value: (m: StoredModelTables) => number | null | undefined,
    where: [BandSection, number | null, string],
  ) =>
    rows.push({
      label,
      unit: h ? littleHUnit(unit) : unit,
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
  models[0].redshifts.forEach((r, ri) => {
    for (const [key, label, unit] of SHEET_ROWS)
      row(
        `z = ${exact(r.z).text}: ${label}`,
        unit,
        (m) => (m.redshifts[ri] as unknown as Record<string, number | null>)[key],
        ["redshifts", ri, key],
      );
  });
  row("Age today", "Gyr", (m) => m.summary.age_Gyr, ["summary", null, "age_Gyr"]);
  return {
    id: "key-numbers",
    title: "Numbers to quote",
    anchor: "key-numbers",
    spans: null,
    stub: "Quantity",
    columns,
    rows,
  };
}

/** Every table of a scenario page in page order: models, at a glance, each redshift table, early universe, targets, surveys. */
export function exportTables(doc: StoredTablesDocument): ExportTable[] {
  // Only the quantities this document's format holds: a quantity added by a later format is left out, never blank.
  const { EARLY_QUANTITIES, PARAMETERS, REDSHIFT_GROUPS, SUMMARY_QUANTITIES, TARGET_QUANTITIES, hasEarlyUniverse } =
    catalogFor(doc);
  const models = doc.models;
  const columns = modelColumns(doc);
  const perModel = (label: string, unit: string, f: (m: StoredModelTables) => ExportCell): ExportRow => ({
    label,
    unit,
    cells: models.map(f),
  });
  const tables: ExportTable[] = [keyNumbers(doc, columns)];
  tables.push({
    id: "models",
    title: "Models side by side",
    anchor: "models",
    spans: null,
    stub: "Parameter",
    columns,
    rows: [
      ...PARAMETERS.map((p) =>
        perModel(p.label, p.unit, (m) => {
          const v = (m.parameters as unknown as Record<string, number | null>)[p.key];
          return ((m.provenance as Record<string, string>)[p.key] ?? "derived") === "derived" ? num(v) : exact(v);
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
          banded(num(quantityValue(m.summary, q.key) as number | null), m, "summary", null, q.key),
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
            banded(inStyle(zValue(m, i, q.key), zScientific(q.key)[mi]), m, "redshifts", i, q.key),
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
            ...models.map((m) =>
              banded(num(quantityValue(m.summary, q.key) as number | null), m, "summary", null, q.key),
            ),
          ],
        })),
        {
          label: "Note",
          unit: "",
          cells: [text(""), ...models.map((m) => text(m.summary.early_universe_note as string | null))],
        },
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
        ...TARGET_QUANTITIES.map((q) =>
          perModel(q.label, q.unit, (m) =>
            banded(num(quantityValue(m.targets[ti], q.key) as number | null), m, "targets", ti, q.key),
          ),
        ),
        perModel("Note", "", (m) => text(m.targets[ti].note)),
      ],
    });
  });
  if (models[0].surveys.length > 0) {
    const perDeg2 = "volume_per_deg2_Mpc3" in models[0].surveys[0];
    const hUnit = (unit: string) => (wantsLittleHUnits(doc) ? littleHUnit(unit) : unit);
    // One column, one style (as on the page): a model's column is scientific when any of its shells needs it.
    const columnOf = (key: string) =>
      models.map((m) => columnIsScientific(m.surveys.map((s) => (s as Record<string, unknown>)[key] as number | null)));
    const styles = {
      volume: columnOf("volume_Gpc3"),
      perDeg2: columnOf("volume_per_deg2_Mpc3"),
      count: columnOf("expected_count"),
    };
    tables.push({
      id: "surveys",
      title: "Survey shells",
      anchor: "surveys",
      spans: null,
      stub: "Shell",
      columns: [
        { label: "Area", unit: "deg^2" },
        { label: "z min", unit: "" },
        { label: "z max", unit: "" },
        ...models.flatMap((m) => [
          { label: `${m.label}: volume`, unit: hUnit("Gpc^3") },
          ...(perDeg2 ? [{ label: `${m.label}: volume per deg^2`, unit: hUnit("Mpc^3") }] : []),
          { label: `${m.label}: expected count`, unit: "" },
        ]),
      ],
      rows: models[0].surveys.map((s, si) => ({
        label: s.name,
        unit: "",
        cells: [
          exact(s.area_deg2),
          exact(s.z_min),
          exact(s.z_max),
          ...models.flatMap((m, mi) => [
            banded(inStyle(m.surveys[si].volume_Gpc3, styles.volume[mi]), m, "surveys", si, "volume_Gpc3"),
            ...(perDeg2
              ? [inStyle(quantityValue(m.surveys[si], "volume_per_deg2_Mpc3") as number | null, styles.perDeg2[mi])]
              : []),
            banded(inStyle(m.surveys[si].expected_count, styles.count[mi]), m, "surveys", si, "expected_count"),
          ]),
        ],
      })),
    });
  }
  return tables;
}
