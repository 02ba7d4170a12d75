import {
  NoBigBangError,
  NoSuchRedshiftError,
  QuadratureError,
  backgroundSummary,
  baoRatios,
  earlyUniverse,
  redshiftTable,
  type BackgroundModel,
} from "../engine/index.js";
import { surveyRows } from "./surveyRows.js";
import { targetRows } from "./targetRows.js";
import { backgroundOf, outsideSchemaBounds } from "../scenario/modelBackground.js";
import { inputsWithDraw } from "../scenario/resolveSpread.js";
import type {
  ResolvedModel,
  ResolvedSpread,
  ResolvedSurvey,
  ResolvedTarget,
  SamplesTable,
  SpreadKey,
} from "../scenario/resolvedScenario.js";
import {
  SPREAD_PERCENTILES,
  Xoshiro128StarStar,
  choleskyLower,
  effectiveSampleSize,
  fnv1a32,
  normalQuantile,
  percentileMonteCarloError,
  percentileRank,
  OrderStatistics,
  sortWeighted,
  weightedPercentile,
} from "../statistics/index.js";
import type { Band, ModelSpread, ModelTables } from "../contract/tablesDocument.js";

/** The parameter values of every draw of a spread (row-major: draw by parameter), and their weights. */
export interface SpreadDraws {
  keys: SpreadKey[];
  values: Float64Array;
  weights: Float64Array | null;
  count: number;
}

/**
 * The draws of a spread. Normal: for each draw, one standard normal deviate per parameter (xoshiro128** uniforms
 * through the inverse normal CDF, in parameter order), correlated by the Cholesky factor of the correlation matrix
 * (x = L u; e.g. Gentle 2003, Random Number Generation and Monte Carlo Methods, section 5.3.1), then scaled by the
 * upper or lower half-width as the deviate is positive or negative (a split normal; Barlow 2003, physics/0306138,
 * for asymmetric errors). Each model has its own stream, seeded by the scenario's seed and its id.
 */
export function spreadDraws(
  spread: ResolvedSpread,
  modelId: string,
  count: number,
  seed: number,
  samples: SamplesTable | undefined,
): SpreadDraws {
  if (spread.form === "samples") {
    if (!samples) throw new Error(`samples of model ${modelId} are missing`);
    const n = samples.values[0]?.length ?? 0;
    const k = samples.columns.length;
    const values = new Float64Array(n * k);
    for (let i = 0; i < n; i++) for (let j = 0; j < k; j++) values[i * k + j] = samples.values[j][i];
    return { keys: [...samples.columns], values, weights: samples.weights, count: n };
  }
  const k = spread.parameters.length;
  const rng = new Xoshiro128StarStar((seed ^ fnv1a32(modelId)) >>> 0);
  const lower = spread.correlation ? choleskyLower(spread.correlation) : null;
  if (spread.correlation && !lower) throw new Error(`correlation of model ${modelId} is not positive definite`);
  const values = new Float64Array(count * k);
  const u = new Float64Array(k);
  for (let i = 0; i < count; i++) {
    for (let j = 0; j < k; j++) u[j] = normalQuantile(rng.nextOpenUnit());
    for (let j = 0; j < k; j++) {
      let z = u[j];
      if (lower) {
        z = 0;
        for (let l = 0; l <= j; l++) z += lower[j][l] * u[l];
      }
      const p = spread.parameters[j];
      values[i * k + j] = p.center + z * (z >= 0 ? p.plus : p.minus);
    }
  }
  return { keys: spread.parameters.map((p) => p.key), values, weights: null, count };
}

/** Why a draw was rejected, in a few words (the keys of `rejected_because`). */
function rejection(e: unknown): string {
  if (e instanceof NoBigBangError) return "no big bang";
  if (e instanceof NoSuchRedshiftError) return "a target not reached";
  if (e instanceof QuadratureError) return "not computable to the engine's accuracy";
  if (e instanceof RangeError) return "not a valid model";
  throw e;
}

/** What a draw is evaluated at: the scenario's table redshifts, chart grid, targets and survey shells. */
export interface DrawContext {
  redshifts: readonly number[];
  grid: readonly number[];
  targets: readonly ResolvedTarget[];
  surveys: readonly ResolvedSurvey[];
}

const numericKeys = (o: object) =>
  Object.entries(o)
    .filter(([, v]) => typeof v === "number" || v === null)
    .map(([k]) => k);
const num = (v: unknown) => (typeof v === "number" && Number.isFinite(v) ? v : Number.NaN);

/**
 * The quantities of a model as one vector, in the order of its tables (summary, each redshift row, targets, survey
 * shells, the grid column by column), and how to evaluate a drawn background straight into it: the same engine
 * calls as the model's own tables (src/tables/buildTablesDocument.ts), without building row objects.
 */
function layoutOf(nominal: ModelTables, where: DrawContext) {
  const summary = numericKeys(nominal.summary);
  const rowKeys = nominal.redshifts.length ? numericKeys(nominal.redshifts[0]).filter((k) => k !== "z") : [];
  const targetKeys = nominal.targets.map((t) => numericKeys(t).filter((k) => k !== "z" || t.placed_by !== "z"));
  const surveyKeys = nominal.surveys.map((s) => numericKeys(s).filter((k) => k !== "z_min" && k !== "z_max"));
  const gridKeys = Object.keys(nominal.grid).filter((k) => k !== "z");
  const gridPoints = where.grid.length;
  const size =
    summary.length +
    nominal.redshifts.length * rowKeys.length +
    targetKeys.reduce((n, k) => n + k.length, 0) +
    surveyKeys.reduce((n, k) => n + k.length, 0) +
    gridKeys.length * gridPoints;
  const evaluate = (bg: BackgroundModel, out: Float64Array, at: number) => {
    let p = at;
    const early = earlyUniverse(bg).values;
    const s = { ...backgroundSummary(bg).summary, ...early } as Record<string, unknown>;
    for (const k of summary) out[p++] = num(s[k]);
    const rDrag = early.sound_horizon_drag_Mpc;
    const columns = (zs: readonly number[]) => {
      const c = redshiftTable(bg, zs);
      return { ...c, ...baoRatios(c, rDrag) } as unknown as Record<string, ArrayLike<number>>;
    };
    if (rowKeys.length > 0) {
      const z = columns(where.redshifts);
      const K = rowKeys.length;
      for (let kk = 0; kk < K; kk++) {
        const column = z[rowKeys[kk]];
        for (let i = 0; i < where.redshifts.length; i++) out[p + i * K + kk] = num(column[i]);
      }
      p += where.redshifts.length * K;
    }
    targetRows(bg, where.targets).forEach((row, i) => {
      const r = row as unknown as Record<string, unknown>;
      for (const k of targetKeys[i]) out[p++] = num(r[k]);
    });
    surveyRows(bg, where.surveys).forEach((row, i) => {
      const r = row as unknown as Record<string, unknown>;
      for (const k of surveyKeys[i]) out[p++] = num(r[k]);
    });
    if (gridPoints > 0) {
      const g = columns(where.grid);
      for (const k of gridKeys) {
        const column = g[k];
        for (let i = 0; i < gridPoints; i++) out[p++] = num(column[i]);
      }
    }
  };
  return { size, evaluate, summary, rowKeys, targetKeys, surveyKeys, gridKeys, gridPoints };
}

/** In words, for pages and the assumptions paragraph. */
export function spreadDescription(spread: ResolvedSpread): string {
  if (spread.form === "samples")
    return `${spread.rows} ${spread.weighted ? "weighted " : ""}samples of ${spread.columns.join(", ")} from ${spread.path} (sha256 ${spread.sha256.slice(0, 12)})`;
  const sigmas = spread.parameters
    .map((p) => (p.plus === p.minus ? `${p.key} +/- ${p.plus}` : `${p.key} +${p.plus} -${p.minus}`))
    .join(", ");
  const kind = spread.correlation ? "correlated normal" : "independent normal";
  const origin = spread.from === "published" ? ", the published marginal 68 % uncertainties" : "";
  return `${kind} (${sigmas}${origin})`;
}

/**
 * The spread of every numeric quantity of a model: each draw is resolved and computed exactly as the model itself
 * (`evaluate`), draws the resolver or the engine refuses are counted by reason, and each quantity gets the
 * percentiles SPREAD_PERCENTILES of the accepted draws with their Monte Carlo errors.
 */
export function spreadBands(
  model: ResolvedModel,
  nominal: ModelTables,
  draws: SpreadDraws,
  where: DrawContext,
): ModelSpread {
  const spread = model.spread!;
  const L = layoutOf(nominal, where);
  const Q = L.size;
  const k = draws.keys.length;
  const values = new Float64Array(draws.count * Q);
  const acceptedIndex: number[] = [];
  const rejected: Record<string, number> = {};
  const reject = (why: string) => {
    rejected[why] = (rejected[why] ?? 0) + 1;
  };
  const row = new Float64Array(k);
  for (let i = 0; i < draws.count; i++) {
    for (let j = 0; j < k; j++) row[j] = draws.values[i * k + j];
    if (draws.weights !== null && draws.weights[i] === 0) continue; // a zero-weight sample carries nothing
    let bad: string | null = null;
    for (let j = 0; j < k && bad === null; j++) bad = outsideSchemaBounds(draws.keys[j], row[j]);
    if (bad !== null) {
      reject("outside the accepted range");
      continue;
    }
    try {
      const inputs = inputsWithDraw(model.inputs, draws.keys, row);
      L.evaluate(backgroundOf(inputs), values, acceptedIndex.length * Q);
    } catch (e) {
      reject(rejection(e));
      continue;
    }
    acceptedIndex.push(i);
  }
  const n = acceptedIndex.length;
  const weights = draws.weights === null ? null : Float64Array.from(acceptedIndex, (i) => draws.weights![i]);
  const effective = effectiveSampleSize(weights, n);
  const column = new Float64Array(n);
  const sorted = new Float64Array(n);
  const cumulative = new Float64Array(n);
  const order = new Uint32Array(n);
  const undefinedIn: Record<string, number> = {};
  // The ranks behind each percentile and its Monte Carlo error (as percentileMonteCarloError takes them).
  const ranksOf = SPREAD_PERCENTILES.map((p) => {
    const q = p / 100;
    const d = Math.sqrt((q * (1 - q)) / Math.max(1, n));
    return {
      at: percentileRank(n, p),
      lo: percentileRank(n, Math.max(0, q - d) * 100),
      hi: percentileRank(n, Math.min(1, q + d) * 100),
    };
  });
  const wantedRanks = [...new Set(ranksOf.flatMap((r) => [r.at, r.lo, r.hi]))].sort((a, b) => a - b);
  const selector = new OrderStatistics(n);
  const picked = new Array<number>(wantedRanks.length).fill(0);
  /** The band of quantity q; null when some draw leaves it undefined ("all" when every draw does). */
  const band = (q: number, name: string): Band | "all" | null => {
    let missing = 0;
    for (let d = 0; d < n; d++) {
      const v = values[d * Q + q];
      column[d] = v;
      if (Number.isNaN(v)) missing++;
    }
    if (n === 0 || missing === n) return "all";
    if (missing > 0) {
      undefinedIn[name] = missing;
      return null;
    }
    if (weights === null) {
      // Equal weights: only 15 order statistics are needed, found by selection rather than a full sort.
      selector.select(column, wantedRanks, picked);
      const at = (rank: number) => picked[wantedRanks.indexOf(rank)];
      return {
        q: ranksOf.map((r) => at(r.at)),
        mc_error: ranksOf.map((r) => (at(r.hi) - at(r.lo)) / 2),
      };
    }
    const c = sortWeighted(column, weights, order, sorted, cumulative);
    return {
      q: SPREAD_PERCENTILES.map((p) => weightedPercentile(sorted, c, p)),
      mc_error: SPREAD_PERCENTILES.map((p) => percentileMonteCarloError(sorted, c, effective, p)),
    };
  };
  const scalar = (q: number, name: string): Band | null => {
    const b = band(q, name);
    return b === "all" ? null : b;
  };
  let q = 0;
  const summary: Record<string, Band | null> = {};
  for (const key of L.summary) summary[key] = scalar(q++, `summary.${key}`);
  const redshifts = nominal.redshifts.map((_, i) => {
    const out: Record<string, Band | null> = {};
    for (const key of L.rowKeys) out[key] = scalar(q++, `redshifts[${i}].${key}`);
    return out;
  });
  const targets = L.targetKeys.map((keys, i) => {
    const out: Record<string, Band | null> = {};
    for (const key of keys) out[key] = scalar(q++, `targets[${i}].${key}`);
    return out;
  });
  const surveys = L.surveyKeys.map((keys, i) => {
    const out: Record<string, Band | null> = {};
    for (const key of keys) out[key] = scalar(q++, `surveys[${i}].${key}`);
    return out;
  });
  const grid: ModelSpread["grid"] = {};
  for (const key of L.gridKeys) {
    // A point where no draw has a value (D_L's distance modulus at z = 0) stays null; a point where only some
    // draws have one leaves the whole column without a band.
    const qs = SPREAD_PERCENTILES.map(() => new Array<number | null>(L.gridPoints));
    const es = SPREAD_PERCENTILES.map(() => new Array<number | null>(L.gridPoints));
    let whole = true;
    for (let i = 0; i < L.gridPoints; i++) {
      const b = band(q++, `grid.${key}`);
      if (b === null) whole = false;
      for (let j = 0; j < SPREAD_PERCENTILES.length; j++) {
        qs[j][i] = b === null || b === "all" ? null : b.q[j];
        es[j][i] = b === null || b === "all" ? null : b.mc_error[j];
      }
    }
    grid[key] = whole ? { q: qs, mc_error: es } : null;
  }
  const form = spread.form === "samples" ? "samples" : spread.correlation ? "multivariate_normal" : "normal";
  return {
    form,
    parameters: [...draws.keys],
    description: spreadDescription(spread),
    draws: draws.count,
    accepted: n,
    rejected: Object.values(rejected).reduce((a, b) => a + b, 0),
    rejected_because: rejected,
    effective_draws: effective,
    undefined_in: undefinedIn,
    summary,
    redshifts,
    targets,
    surveys,
    grid,
  };
}
