import {
  NoBigBangError,
  NoSuchRedshiftError,
  QuadratureError,
  backgroundSummary,
  baoRatios,
  curvatureRadiusMpc,
  earlyUniverse,
  hubbleDistanceMpc,
  pastIntegrals,
  redshiftTable,
  transverseComovingDistance,
  type BackgroundModel,
  type BaoColumns,
  type LinearGrowth,
  type PastIntegrals,
  linearGrowth,
  s8Parameter,
  type RedshiftColumns,
} from "../engine/index.js";
import { backgroundOf, outsideSchemaBounds } from "../scenario/modelBackground.js";
import { inputsWithDraw } from "../scenario/resolveSpread.js";
import type { ResolvedModelInputs, ResolvedSurvey, ResolvedTarget, SpreadKey } from "../scenario/resolvedScenario.js";
import type { ModelTables } from "../contract/tablesDocument.js";
import { surveyRows } from "./surveyRows.js";
import { targetRows } from "./targetRows.js";

/** What a draw is evaluated at: the scenario's table redshifts, chart grid, targets and survey shells. */
export interface DrawContext {
  redshifts: readonly number[];
  grid: readonly number[];
  targets: readonly ResolvedTarget[];
  surveys: readonly ResolvedSurvey[];
}

/** The keys of a model's numeric quantities, in the order of its vector: summary, rows, targets, shells, grid. */
export interface LayoutKeys {
  summary: string[];
  rowKeys: string[];
  targetKeys: string[][];
  surveyKeys: string[][];
  gridKeys: string[];
  size: number;
}

/** Why a draw was rejected (status code 2 + index); 0 is accepted, 1 a sample of weight 0 (carries nothing). */
export const REJECTIONS = [
  "outside the accepted range",
  "no big bang",
  "a target not reached",
  "not computable to the engine's accuracy",
  "not a valid model",
] as const;
export const ACCEPTED = 0;
export const ZERO_WEIGHT = 1;

function rejectionCode(e: unknown): number {
  if (e instanceof NoBigBangError) return 2 + 1;
  if (e instanceof NoSuchRedshiftError) return 2 + 2;
  if (e instanceof QuadratureError) return 2 + 3;
  if (e instanceof RangeError) return 2 + 4;
  throw e;
}

const numericKeys = (o: object) =>
  Object.entries(o)
    .filter(([, v]) => typeof v === "number" || v === null)
    .map(([k]) => k);
const num = (v: unknown) => (typeof v === "number" && Number.isFinite(v) ? v : Number.NaN);

/** The vector layout of a model's tables (the nominal model's, which every draw shares). */
export function layoutKeysOf(nominal: ModelTables, gridPoints: number): LayoutKeys {
  const summary = numericKeys(nominal.summary);
  const rowKeys = nominal.redshifts.length ? numericKeys(nominal.redshifts[0]).filter((k) => k !== "z") : [];
  const targetKeys = nominal.targets.map((t) => numericKeys(t).filter((k) => k !== "z" || t.placed_by !== "z"));
  const surveyKeys = nominal.surveys.map((s) => numericKeys(s).filter((k) => k !== "z_min" && k !== "z_max"));
  const gridKeys = Object.keys(nominal.grid).filter((k) => k !== "z");
  const size =
    summary.length +
    nominal.redshifts.length * rowKeys.length +
    targetKeys.reduce((n, k) => n + k.length, 0) +
    surveyKeys.reduce((n, k) => n + k.length, 0) +
    gridKeys.length * gridPoints;
  return { summary, rowKeys, targetKeys, surveyKeys, gridKeys, size };
}

/**
 * Writes a drawn background's quantities into out[at ...] in the layout's order, by the engine calls behind a
 * model's own tables (src/tables/buildTablesDocument.ts) without building row objects; NaN where a value is null.
 * The per-redshift integrals take narrow panels by one 4- or 7-point Gauss rule (pastIntegrals' option): a draw
 * needs no 1e-13 panels, and on a dense grid they still meet the mpmath fixtures to 1e-10
 * (test/engine/mpmathFixtures). D_M(z*) and today's age come from the same pass; r_drag's integral continues from r*.
 */
export function evaluateInto(
  bg: BackgroundModel,
  layout: LayoutKeys,
  where: DrawContext,
  out: Float64Array,
  at: number,
  sigma8: number | null = null,
): void {
  let p = at;
  // One pass of the past integrals serves everything: the table redshifts, then the grid, then z* when there is one
  // (for D_M(z*)); today's age and conformal age come out of the same pass.
  const pass = passRedshiftsOf(where);
  const n = pass.redshifts.length - 1;
  let past: PastIntegrals | null = null;
  let growth: LinearGrowth | null = null;
  // The linear growth reuses the past integrals' values of 1/E at their Gauss nodes (linearGrowth.ts).
  const nodes = pass.nodeValues;
  const early = earlyUniverse(bg, {
    onwardFromRecombination: true,
    transverseComovingDistanceMpc: (zStar) => {
      pass.redshifts[n] = zStar;
      const ascending = pass.ascendingWith(zStar);
      past = pastIntegrals(bg, pass.redshifts, { narrowPanelsByGauss: true, ascending, nodeValues: nodes });
      growth = linearGrowth(bg, pass.redshifts, { ascending, nodeValues: nodes });
      return transverseComovingDistance(
        hubbleDistanceMpc(bg.H0_km_s_Mpc) * past.comoving[n],
        bg.geometry,
        curvatureRadiusMpc(bg),
      );
    },
  }).values as unknown as Record<string, unknown>;
  let integrals: PastIntegrals;
  if (past === null) {
    const zs = pass.redshifts.subarray(0, n);
    integrals = pastIntegrals(bg, zs, { narrowPanelsByGauss: true, ascending: pass.ascending, nodeValues: nodes });
    growth = linearGrowth(bg, zs, { ascending: pass.ascending, nodeValues: nodes });
  } else integrals = past;
  const grown = growth as LinearGrowth;
  const summary = backgroundSummary(bg, { past: integrals }).summary as unknown as Record<string, unknown>;
  const growthSummary: Record<string, unknown> = {
    growth_rate_0: grown.rateToday,
    S8: sigma8 === null ? null : s8Parameter(sigma8, bg.Omega_m),
  };
  for (const k of layout.summary)
    out[p++] = num(k in early ? early[k] : k in growthSummary ? growthSummary[k] : summary[k]);
  const rDrag = early.sound_horizon_drag_Mpc as number | null;
  // Rows 0 .. R-1 of the columns are the table redshifts, R .. R+G-1 the grid.
  const c = redshiftTable(bg, pass.redshifts.subarray(0, n), {
    past: integrals,
    into: pass.columns,
    growth: grown,
    sigma8,
  });
  pass.columns = c; // made by the first draw, written over by the next
  const bao = baoRatios(c, rDrag, pass.bao);
  pass.bao = bao;
  const columnOf = (k: string) =>
    (k in bao ? bao[k as keyof typeof bao] : c[k as keyof typeof c]) as Float64Array | undefined;
  const R = where.redshifts.length;
  if (layout.rowKeys.length > 0) {
    const K = layout.rowKeys.length;
    for (let kk = 0; kk < K; kk++) {
      const column = columnOf(layout.rowKeys[kk])!;
      for (let i = 0; i < R; i++) {
        const v = column[i];
        out[p + i * K + kk] = Number.isFinite(v) ? v : Number.NaN;
      }
    }
    p += R * K;
  }
  // Plain loops, and none without targets or shells: calling forEach on row arrays of changing shapes made the
  // optimised code of this function bail out on about one draw in ten.
  if (where.targets.length > 0) {
    const rows = targetRows(bg, where.targets, sigma8) as unknown as Record<string, unknown>[];
    for (let i = 0; i < rows.length; i++) for (const k of layout.targetKeys[i]) out[p++] = num(rows[i][k]);
  }
  if (where.surveys.length > 0) {
    const rows = surveyRows(bg, where.surveys, sigma8) as unknown as Record<string, unknown>[];
    for (let i = 0; i < rows.length; i++) for (const k of layout.surveyKeys[i]) out[p++] = num(rows[i][k]);
  }
  const points = where.grid.length;
  for (const k of layout.gridKeys) {
    const column = columnOf(k)!; // a plain loop: cheaper than a subarray view and a block copy for 200 values
    for (let i = 0; i < points; i++) {
      const v = column[R + i];
      out[p + i] = Number.isFinite(v) ? v : Number.NaN;
    }
    p += points;
  }
}

interface PassRedshifts {
  /** The table redshifts, the grid, and one more slot for z*. */
  redshifts: Float64Array;
  /** The ascending order of the first n. */
  ascending: Uint32Array;
  /** The ascending order of all n + 1, with z at index n (made in place; valid until the next call). */
  ascendingWith: (z: number) => Uint32Array;
  /** The columns of the draws' tables, written over by each draw on this thread. */
  columns?: RedshiftColumns;
  bao?: BaoColumns;
  /** The past integrals' values at their Gauss nodes, 7 per redshift of the pass (z* included). */
  nodeValues: Float64Array;
}

const passes = new WeakMap<DrawContext, PassRedshifts>();

/** The redshift list of a draw's single pass, made once per context (and thread). */
function passRedshiftsOf(where: DrawContext): PassRedshifts {
  const known = passes.get(where);
  if (known) return known;
  const merged = [...where.redshifts, ...where.grid];
  const n = merged.length;
  const redshifts = new Float64Array(n + 1);
  redshifts.set(merged);
  const ascending = Uint32Array.from(merged.keys()).sort((i, j) => merged[i] - merged[j]);
  const withExtra = new Uint32Array(n + 1);
  const pass: PassRedshifts = {
    redshifts,
    nodeValues: new Float64Array(7 * (n + 1)),
    ascending,
    ascendingWith: (z) => {
      let lo = 0; // the first position whose redshift exceeds z
      let hi = n;
      while (lo < hi) {
        const mid = (lo + hi) >>> 1;
        if (merged[ascending[mid]] <= z) lo = mid + 1;
        else hi = mid;
      }
      withExtra.set(ascending.subarray(0, lo), 0);
      withExtra[lo] = n;
      withExtra.set(ascending.subarray(lo), lo + 1);
      return withExtra;
    },
  };
  passes.set(where, pass);
  return pass;
}

/** Everything a thread needs to evaluate draws of one model (structured-clone safe; buffers may be shared). */
export interface DrawJob {
  inputs: ResolvedModelInputs;
  keys: SpreadKey[];
  /** Parameter values, draw by parameter. */
  values: Float64Array;
  weights: Float64Array | null;
  count: number;
  where: DrawContext;
  layout: LayoutKeys;
  /** Results: draw i's vector at out[i * layout.size ...], its status at status[i]. */
  out: Float64Array;
  status: Int8Array;
  /** The next unclaimed draw (claimed with Atomics.add, so threads share the work without a fixed split). */
  next: Int32Array;
}

/** Draws claimed at a time: small enough to balance two threads, large enough that claiming costs nothing. */
const CHUNK = 8;

/**
 * Evaluates draws of a job, claiming them a chunk at a time until none is left; adds the number it evaluated to
 * `tally` when given (the helper thread's count, which tests read to see that the work was shared).
 */
export function evaluateClaimedDraws(job: DrawJob, tally?: Int32Array): void {
  const k = job.keys.length;
  const Q = job.layout.size;
  const row = new Float64Array(k);
  for (;;) {
    const start = Atomics.add(job.next, 0, CHUNK);
    if (start >= job.count) return;
    const end = Math.min(job.count, start + CHUNK);
    if (tally) Atomics.add(tally, 0, end - start);
    for (let i = start; i < end; i++) {
      if (job.weights !== null && job.weights[i] === 0) {
        job.status[i] = ZERO_WEIGHT;
        continue;
      }
      for (let j = 0; j < k; j++) row[j] = job.values[i * k + j];
      let bad = false;
      for (let j = 0; j < k && !bad; j++) bad = outsideSchemaBounds(job.keys[j], row[j]) !== null;
      if (bad) {
        job.status[i] = 2;
        continue;
      }
      try {
        const drawn = inputsWithDraw(job.inputs, job.keys, row);
        evaluateInto(backgroundOf(drawn), job.layout, job.where, job.out, i * Q, drawn.sigma8 ?? null);
        job.status[i] = ACCEPTED;
      } catch (e) {
        job.status[i] = rejectionCode(e);
      }
    }
  }
}
