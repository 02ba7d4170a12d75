import { createHash } from "node:crypto";
import {
  CONSTANTS,
  DEFAULT_N_EFF,
  DEFAULT_T_CMB_K,
  ENGINE_TOLERANCE,
  ENGINE_VERSION,
  FLATNESS_THRESHOLD,
  REDSHIFT_COLUMN_KEYS,
  BAO_KEYS,
  NoBigBangError,
  NoSuchRedshiftError,
  QuadratureError,
  backgroundSummary,
  physicalBaryonDensity,
  baoRatios,
  earlyUniverse,
  redshiftAtComovingDistance,
  redshiftTable,
  slowestPastExpansion,
  linearGrowth,
  s8Parameter,
  type BaoColumns,
  type RedshiftColumns,
} from "../engine/index.js";
import type { ResolvedModel, ResolvedScenario } from "../scenario/resolvedScenario.js";
import { DEFAULT_W0, DEFAULT_WA } from "../scenario/resolveScenario.js";
import { gridRedshifts } from "./gridRedshifts.js";
import { ModelComputeError, nullNonFinite } from "./modelComputeError.js";
import { targetRows } from "./targetRows.js";
import { surveyRows } from "./surveyRows.js";
import { differencesFromBaseline } from "../contract/differences.js";
import { cautions } from "./cautions.js";
import { primeSpreadHelper, spreadBands, spreadDraws } from "./spreadBands.js";
import type { DrawContext } from "./drawEvaluation.js";
import { GENERATOR_NAME, SPREAD_PERCENTILES } from "../statistics/index.js";
import type { ModelTables, Num, RedshiftGrid, RedshiftRow, TablesDocument } from "../contract/tablesDocument.js";
import { TABLES_FORMAT } from "../contract/formats.js";
import { inputsSha256 } from "../contract/inputsHash.js";
import { frozenInputs } from "../contract/versionRecord.js";

const sha256 = (text: string) => createHash("sha256").update(text, "utf8").digest("hex");

/** Every key of a redshift row: the engine's per-redshift quantities, then the BAO ratios. */
export const ROW_KEYS = [...REDSHIFT_COLUMN_KEYS, ...BAO_KEYS] as const;
type Columns = RedshiftColumns & BaoColumns;

function rows(columns: Columns): RedshiftRow[] {
  const n = columns.z.length;
  const out: RedshiftRow[] = new Array(n);
  for (let i = 0; i < n; i++) {
    const row = {} as Record<(typeof ROW_KEYS)[number], Num>;
    for (const key of ROW_KEYS) {
      const v = columns[key][i];
      row[key] = Number.isFinite(v) ? v : null;
    }
    out[i] = row satisfies RedshiftRow;
  }
  return out;
}

function gridColumns(columns: Columns): RedshiftGrid {
  const out = {} as Record<(typeof ROW_KEYS)[number], Num[]>;
  for (const key of ROW_KEYS) {
    const column = columns[key];
    // A plain loop, not Array.from: Array.from walks a typed array through its iterator, several times slower in
    // the cold code of a short run. An all-finite column stays an array of unboxed doubles.
    const values: Num[] = [];
    for (let i = 0; i < column.length; i++) {
      const v = column[i];
      values.push(Number.isFinite(v) ? v : null);
    }
    out[key] = values;
  }
  return out satisfies RedshiftGrid;
}

/** The plausibility warnings of model i's own inputs (written at its keys), in the words `check` prints. */
const inputWarnings = (s: ResolvedScenario, i: number): string[] =>
  s.plausibility.filter((w) => w.path.startsWith(`models[${i}].`)).map((w) => w.message);

function modelTables(m: ResolvedModel, scenario: ResolvedScenario, grid: number[], index: number): ModelTables {
  const bg = m.background;
  const sigma8 = m.inputs.sigma8 ?? null;
  const { summary, warnings } = backgroundSummary(bg);
  const allWarnings = [...m.warnings, ...warnings];
  if (
    summary.antipode_distance_Mpc !== null &&
    summary.particle_horizon_Mpc !== null &&
    summary.particle_horizon_Mpc > summary.antipode_distance_Mpc
  ) {
    const zAnti = redshiftAtComovingDistance(bg, summary.antipode_distance_Mpc);
    allWarnings.push(
      `light from beyond z = ${zAnti.toPrecision(6)} has passed the antipode: D_M is negative there (sign convention: D_M = R sin(D_C/R); images are inverted), and D_M, D_A, D_L and the distance modulus there are ill-conditioned: the integral's relative error is multiplied by about |chi cot chi| (chi = D_C/R), so their accuracy is about 1e-10 |chi cot chi| rather than 1e-10`,
    );
  }
  const early = earlyUniverse(bg);
  const rDrag = early.values.sound_horizon_drag_Mpc;
  const withBao = (c: RedshiftColumns): Columns => ({ ...c, ...baoRatios(c, rDrag) });
  const derived =
    m.inputs.curvature_key === "Omega_k" ? "Omega_de" : m.inputs.curvature_key === "flat" ? "Omega_de" : "Omega_k";
  const provenance: ModelTables["provenance"] = {
    H0: m.provenance.H0,
    Omega_m: m.provenance.Omega_m,
    w0: m.provenance.w0,
    wa: m.provenance.wa,
    radiation: m.provenance.radiation,
    T_cmb: m.provenance.T_cmb,
    N_eff: m.provenance.N_eff,
    curvature_from: m.provenance.curvature_key,
    [m.inputs.curvature_key === "flat"
      ? "Omega_k"
      : m.inputs.curvature_key === "Omega_Lambda"
        ? "Omega_de"
        : m.inputs.curvature_key]: m.provenance.curvature_value,
    [derived]: "derived",
    Omega_r: "derived",
    Omega_gamma: "derived",
    Omega_nu: "derived",
    Omega_cb: "derived",
    Omega_nu_massive: "derived",
    T_nu: "derived",
    m_nu_eV: m.provenance.m_nu_eV,
    Omega_b: m.inputs.baryon_key === "Omega_b" ? m.provenance.baryon_value : "derived",
    omega_b: m.inputs.baryon_key === "omega_b" ? m.provenance.baryon_value : "derived",
    ...(m.provenance.sigma8 ? { sigma8: m.provenance.sigma8 } : {}),
  };
  if (m.inputs.curvature_key === "flat") provenance.Omega_k = m.provenance.curvature_key;
  return {
    id: m.id,
    label: m.label,
    label_tex: m.label_tex ?? null,
    extends: m.extends,
    notes: m.notes,
    warnings: allWarnings,
    input_warnings: inputWarnings(scenario, index),
    parameters: {
      H0: bg.H0_km_s_Mpc,
      Omega_m: bg.Omega_m,
      Omega_de: bg.Omega_de,
      Omega_k: bg.Omega_k,
      Omega_r: bg.Omega_r,
      Omega_gamma: bg.Omega_gamma,
      Omega_nu: bg.Omega_nu,
      w0: bg.w0,
      wa: bg.wa,
      T_cmb: m.inputs.T_cmb,
      N_eff: m.inputs.N_eff,
      radiation: m.inputs.radiation,
      curvature_from: m.inputs.curvature_key,
      Omega_b: bg.Omega_b,
      omega_b: bg.Omega_b === null ? null : physicalBaryonDensity(bg.Omega_b, bg.H0_km_s_Mpc),
      Omega_cb: bg.Omega_cb,
      Omega_nu_massive: bg.Omega_nu_massive,
      T_nu: bg.T_nu_K,
      m_nu_eV: m.inputs.m_nu_eV,
      sigma8: sigma8,
    },
    provenance,
    summary: {
      ...summary,
      ...early.values,
      early_universe_note: early.note,
      growth_rate_0: linearGrowth(bg, []).rateToday,
      S8: sigma8 === null ? null : s8Parameter(sigma8, bg.Omega_m),
    },
    redshifts: rows(withBao(redshiftTable(bg, scenario.redshifts, { sigma8 }))),
    grid: gridColumns(withBao(redshiftTable(bg, grid, { sigma8 }))),
    targets: targetRows(bg, scenario.targets, sigma8),
    surveys: surveyRows(bg, scenario.surveys, sigma8),
  };
}

/** Why the engine gave up on a model, with how close it comes to a static or loitering one (smallest H^2). */
function nearCriticalNote(m: ResolvedModel, e: unknown): string {
  const cannot = `the engine cannot compute this model to its relative accuracy ${ENGINE_TOLERANCE}`;
  if (e instanceof NoBigBangError) return cannot;
  const past = slowestPastExpansion(m.background);
  if (past.E2 <= 0)
    return `this model has no big bang: going back in time (H/H0)^2 falls to ${past.E2.toPrecision(2)} near z = ${past.z.toPrecision(4)}, so its expansion turned around there, within a hair of the static model; lower Omega_de, raise Omega_m or add radiation`;
  if (past.E2 < 1e-3)
    return `${cannot}: it is very close to a static or loitering model (going back in time, (H/H0)^2 falls to ${past.E2.toPrecision(2)} at z = ${past.z.toPrecision(4)}; 0 there would be a static point). Move Omega_de or Omega_m away from that critical model`;
  const ahead = slowestPastExpansion(m.background, true);
  if (ahead.a > 1 && Math.abs(ahead.E2) < 1e-3)
    return `${cannot}: it is very close to a model that approaches a static state ahead (in the future (H/H0)^2 ${ahead.E2 < 0 ? "turns negative" : "falls to"} ${ahead.E2.toPrecision(2)} near a = ${ahead.a.toPrecision(4)}; exactly 0 there would be an Einstein static state). Move Omega_de or Omega_m away from that critical model`;
  return cannot;
}

/** Resolved scenario -> tables document (pure apart from hashing; deterministic: the same input gives the same bytes). */
export interface BuildOptions {
  /** false: no chart grid (for `quote`, whose document is never written). */
  chartGrid?: boolean;
  /**
   * A model's own tables through the caller, which may give back what it kept from an earlier call on the same
   * model (the pages' what-if engine keeps the models a reader's changes do not touch); computes them by default.
   */
  modelTablesOf?: (index: number, compute: () => ModelTables) => ModelTables;
}

export function buildTablesDocument(s: ResolvedScenario, options: BuildOptions = {}): TablesDocument {
  // `quote` needs no chart curves: without them its document is not a complete contract document, never written.
  const grid = options.chartGrid === false ? [] : gridRedshifts(s.grid);
  const inputs = frozenInputs(s);
  // Every model's own tables first, then the spreads: the draws' hot code is then optimised after the engine has
  // met every kind of model in the scenario, and is not thrown away and compiled again at each new kind (the same
  // numbers either way). A model that cannot be computed is still reported in model order.
  const central: ({ tables: ModelTables } | { error: unknown })[] = s.models.map((m, i) => {
    try {
      const compute = () => modelTables(m, s, grid, i);
      return { tables: options.modelTablesOf ? options.modelTablesOf(i, compute) : compute() };
    } catch (e) {
      return { error: e };
    }
  });
  // Spreads go with the chart grid: `quote` (no grid) answers with the central values only.
  const where: DrawContext = { redshifts: s.redshifts, grid, targets: s.targets, surveys: s.surveys };
  const drawsOf = s.models.map((m, i) =>
    m.spread && s.draws && options.chartGrid !== false && "tables" in central[i]
      ? spreadDraws(m.spread, m.id, s.draws.count, s.draws.seed, s.samples?.[m.id])
      : null,
  );
  primeSpreadHelper(
    s.models.flatMap((model, i) => {
      const draws = drawsOf[i];
      const computed = central[i];
      return draws && "tables" in computed ? [{ model, nominal: computed.tables, draws }] : [];
    }),
    where,
  );
  const models = s.models.map((m, i) => {
    const computed = central[i];
    if ("error" in computed) {
      const e = computed.error;
      // The engine throws rather than return an unconverged number; the model is then refused where it is written.
      if (
        e instanceof QuadratureError ||
        e instanceof NoBigBangError ||
        e instanceof RangeError ||
        e instanceof NoSuchRedshiftError
      ) {
        throw new ModelComputeError(i, m.id, `${(e as Error).message}; ${nearCriticalNote(m, e)}`);
      }
      throw e;
    }
    const tables: ModelTables = computed.tables;
    if (m.published) tables.published = m.published;
    const draws = drawsOf[i];
    if (draws) {
      tables.spread = spreadBands(m, tables, draws, where, s.h_units === true);
      if (tables.spread.accepted === 0)
        throw new ModelComputeError(
          i,
          m.id,
          `every one of the ${tables.spread.draws} draws of its spread was rejected (${Object.entries(
            tables.spread.rejected_because,
          )
            .map(([why, count]) => `${count} ${why}`)
            .join(", ")}), so no band can be given; narrow the spread`,
        );
      if (tables.spread.rejected > 0)
        tables.warnings.push(
          `${tables.spread.rejected} of ${tables.spread.draws} draws rejected (${Object.entries(
            tables.spread.rejected_because,
          )
            .map(([why, count]) => `${count} ${why}`)
            .join(", ")}); the bands describe the ${tables.spread.accepted} accepted draws`,
        );
    }
    // A number beyond double precision (an extreme but valid input) is stored as null, with a note; never Infinity.
    const overflowed = nullNonFinite(tables);
    if (overflowed > 0)
      tables.warnings.push(
        `${overflowed} value${overflowed === 1 ? "" : "s"} beyond double precision (infinite or undefined) reported as null`,
      );
    return tables;
  });
  const baseline = models.find((m) => m.id === s.baseline)!;
  const differences: TablesDocument["differences"] = {};
  for (const m of models) if (m.id !== s.baseline) differences[m.id] = differencesFromBaseline(m, baseline);
  const constants: TablesDocument["engine"]["constants"] = {};
  for (const [name, c] of Object.entries(CONSTANTS))
    constants[name] = { value: c.value, unit: c.unit, source: c.source };
  return {
    format: TABLES_FORMAT,
    scenario: {
      id: s.id,
      title: s.title,
      description: s.description,
      author: s.author,
      tags: s.tags,
      baseline: s.baseline,
      source_path: s.source.name,
      source_sha256: sha256(s.source.text),
      inputs_sha256: inputsSha256(ENGINE_VERSION, inputs),
      defaults_applied: s.defaults_applied,
      redshifts: s.redshifts,
      grid: s.grid,
      source_text: s.source.text,
    },
    inputs,
    engine: {
      version: ENGINE_VERSION,
      tolerance: ENGINE_TOLERANCE,
      constants,
      defaults: {
        w0: DEFAULT_W0,
        wa: DEFAULT_WA,
        T_cmb: DEFAULT_T_CMB_K,
        N_eff: DEFAULT_N_EFF,
        radiation: "thermal",
        curvature: "flat",
        flatness_threshold: FLATNESS_THRESHOLD,
      },
    },
    cautions: cautions(
      s.models.some((m) => m.background.Omega_b !== null),
      s.models.some((m) => m.background.massiveNeutrinos.length > 0),
      s.models.some((m) => m.spread !== undefined) && options.chartGrid !== false,
      s.models.some((m) => (m.published?.length ?? 0) > 0),
    ),
    ...(s.draws && options.chartGrid !== false
      ? {
          draws: {
            count: s.draws.count,
            seed: s.draws.seed,
            generator: `${GENERATOR_NAME}; normal deviates by the inverse CDF (Wichura 1988, AS 241)`,
            percentiles: [...SPREAD_PERCENTILES],
          },
        }
      : {}),
    models,
    differences,
  };
}
