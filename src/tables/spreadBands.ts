import { ACCEPTED, REJECTIONS, layoutKeysOf, type DrawContext, type LayoutKeys } from "./drawEvaluation.js";
import { computeBands, evaluateDraws, primeHelper } from "./drawPool.js";
import type { ResolvedModel, ResolvedSpread, SamplesTable, SpreadKey } from "../scenario/resolvedScenario.js";
import {
  SPREAD_PERCENTILES,
  Xoshiro128StarStar,
  choleskyLower,
  effectiveSampleSize,
  fnv1a32,
  normalQuantile,
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

/** Before the spreads of a scenario are computed: the helper thread meets one draw of each (drawPool.primeHelper). */
export function primeSpreadHelper(
  spreads: { model: ResolvedModel; nominal: ModelTables; draws: SpreadDraws }[],
  where: DrawContext,
): void {
  primeHelper(
    spreads.map(({ model, nominal, draws }) =>
      drawJobOf(model, draws, where, layoutKeysOf(nominal, where.grid.length)),
    ),
    where.redshifts.length + where.grid.length,
  );
}

/** The draws of one model's spread as a job for the draw pool. */
function drawJobOf(model: ResolvedModel, draws: SpreadDraws, where: DrawContext, layout: LayoutKeys) {
  return {
    inputs: model.inputs,
    keys: draws.keys,
    values: draws.values,
    weights: draws.weights,
    count: draws.count,
    where,
    layout,
  };
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
  const L = layoutKeysOf(nominal, where.grid.length);
  const Q = L.size;
  const { out: values, status } = evaluateDraws(
    drawJobOf(model, draws, where, L),
    where.redshifts.length + where.grid.length,
  );
  const acceptedIndex: number[] = [];
  const rejected: Record<string, number> = {};
  for (let i = 0; i < draws.count; i++) {
    if (status[i] === ACCEPTED) acceptedIndex.push(i);
    else if (status[i] >= 2) {
      const why = REJECTIONS[status[i] - 2];
      rejected[why] = (rejected[why] ?? 0) + 1;
    }
  }
  const n = acceptedIndex.length;
  const weights = draws.weights === null ? null : Float64Array.from(acceptedIndex, (i) => draws.weights![i]);
  const effective = effectiveSampleSize(weights, n);
  const undefinedIn: Record<string, number> = {};
  const stats = computeBands({
    values,
    Q,
    accepted: Int32Array.from(acceptedIndex),
    weights,
    effective,
  });
  const P = SPREAD_PERCENTILES.length;
  /** The band of quantity q; null when some draw leaves it undefined ("all" when every draw does). */
  const band = (q: number, name: string): Band | "all" | null => {
    const missing = stats.missing[q];
    if (n === 0 || missing === n) return "all";
    if (missing > 0) {
      undefinedIn[name] = missing;
      return null;
    }
    return {
      q: Array.from(stats.q_.subarray(q * P, q * P + P)),
      mc_error: Array.from(stats.e_.subarray(q * P, q * P + P)),
    };
  };
  const scalar = (q: number, name: string): Band | null => {
    const b = band(q, name);
    return b === "all" ? null : b;
  };
  let q = 0;
  const summary: Record<string, Band | null> = {};
  const gridPoints = where.grid.length;
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
    const qs = SPREAD_PERCENTILES.map(() => new Array<number | null>(gridPoints));
    const es = SPREAD_PERCENTILES.map(() => new Array<number | null>(gridPoints));
    let whole = true;
    for (let i = 0; i < gridPoints; i++) {
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
