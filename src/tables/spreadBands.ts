import {
  ACCEPTED,
  REJECTIONS,
  ZERO_WEIGHT,
  layoutKeysOf,
  type DrawContext,
  type LayoutKeys,
} from "./drawEvaluation.js";

/** Why a sample of weight 0 is not among the accepted draws. */
export const ZERO_WEIGHT_REASON = "weight 0 (a sample that carries no probability)";
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
import { hPowerOfKey } from "../contract/littleHUnitNames.js";

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

/** One quantity of a draw vector: its section, the row (redshift, target, shell) or grid point, and its key. */
interface LayoutEntry {
  section: "summary" | "redshifts" | "targets" | "surveys" | "grid";
  index: number;
  key: string;
}

/** Every quantity of a layout in the order of the draw vectors (see evaluateInto). */
function layoutEntries(L: LayoutKeys, rows: number, gridPoints: number): LayoutEntry[] {
  const out: LayoutEntry[] = [];
  for (const key of L.summary) out.push({ section: "summary", index: 0, key });
  for (let i = 0; i < rows; i++) for (const key of L.rowKeys) out.push({ section: "redshifts", index: i, key });
  L.targetKeys.forEach((keys, i) => {
    for (const key of keys) out.push({ section: "targets", index: i, key });
  });
  L.surveyKeys.forEach((keys, i) => {
    for (const key of keys) out.push({ section: "surveys", index: i, key });
  });
  for (const key of L.gridKeys) for (let i = 0; i < gridPoints; i++) out.push({ section: "grid", index: i, key });
  return out;
}

type BandMaps = Pick<ModelSpread, "summary" | "redshifts" | "targets" | "surveys" | "grid">;

/**
 * The band maps of the quantities `entries` lists, entry j's percentiles being stats' quantity j. A quantity that some
 * accepted draws leave undefined has no band (counted in `undefinedIn`); a grid column with such a point has none.
 */
function bandMaps(
  entries: readonly LayoutEntry[],
  stats: { q_: Float64Array; e_: Float64Array; missing: Int32Array },
  n: number,
  shape: { rows: number; targets: number; surveys: number; gridPoints: number },
  undefinedIn: Record<string, number>,
): BandMaps {
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
  const summary: Record<string, Band | null> = {};
  const redshifts = Array.from({ length: shape.rows }, () => ({}) as Record<string, Band | null>);
  const targets = Array.from({ length: shape.targets }, () => ({}) as Record<string, Band | null>);
  const surveys = Array.from({ length: shape.surveys }, () => ({}) as Record<string, Band | null>);
  const grid: ModelSpread["grid"] = {};
  const gridColumns = new Map<string, { qs: (number | null)[][]; es: (number | null)[][]; whole: boolean }>();
  entries.forEach((e, q) => {
    if (e.section === "grid") {
      // A point where no draw has a value (D_L's distance modulus at z = 0) stays null; a point where only some
      // draws have one leaves the whole column without a band.
      let column = gridColumns.get(e.key);
      if (!column) {
        column = {
          qs: SPREAD_PERCENTILES.map(() => new Array<number | null>(shape.gridPoints)),
          es: SPREAD_PERCENTILES.map(() => new Array<number | null>(shape.gridPoints)),
          whole: true,
        };
        gridColumns.set(e.key, column);
      }
      const b = band(q, `grid.${e.key}`);
      if (b === null) column.whole = false;
      for (let j = 0; j < P; j++) {
        column.qs[j][e.index] = b === null || b === "all" ? null : b.q[j];
        column.es[j][e.index] = b === null || b === "all" ? null : b.mc_error[j];
      }
      return;
    }
    const name = e.section === "summary" ? `summary.${e.key}` : `${e.section}[${e.index}].${e.key}`;
    const b = band(q, name);
    const value = b === "all" ? null : b;
    if (e.section === "summary") summary[e.key] = value;
    else if (e.section === "redshifts") redshifts[e.index][e.key] = value;
    else if (e.section === "targets") targets[e.index][e.key] = value;
    else surveys[e.index][e.key] = value;
  });
  for (const [key, c] of gridColumns) grid[key] = c.whole ? { q: c.qs, mc_error: c.es } : null;
  return { summary, redshifts, targets, surveys, grid };
}

/**
 * Each draw's quantities that scale with h, converted with that draw's own h = H0/100 (the drawn H0 when the spread
 * varies it, else the model's): the vectors of the h-unit bands, quantity j being entries[picked[j]].
 */
function inLittleHUnitsPerDraw(
  values: Float64Array,
  Q: number,
  picked: readonly number[],
  powers: readonly number[],
  draws: SpreadDraws,
  modelH0: number,
): Float64Array {
  const k = draws.keys.length;
  const at = draws.keys.indexOf("H0");
  const bytes = draws.count * picked.length * 8;
  const out = new Float64Array(
    values.buffer instanceof SharedArrayBuffer ? new SharedArrayBuffer(bytes) : new ArrayBuffer(bytes),
  );
  for (let i = 0; i < draws.count; i++) {
    const h = (at >= 0 ? draws.values[i * k + at] : modelH0) / 100;
    for (let j = 0; j < picked.length; j++) out[i * picked.length + j] = values[i * Q + picked[j]] * h ** powers[j];
  }
  return out;
}

/**
 * The spread of every numeric quantity of a model: each draw is resolved and computed exactly as the model itself
 * (`evaluate`), draws the resolver or the engine refuses are counted by reason, and each quantity gets the
 * percentiles SPREAD_PERCENTILES of the accepted draws with their Monte Carlo errors. With `hUnits`, the quantities
 * that scale with h get a second set of bands in h units (`h_scaled`), each draw converted with its own h before
 * the percentiles are taken: with H0 varied, the h^-1 Mpc interval is not the Mpc interval times one h.
 */
export function spreadBands(
  model: ResolvedModel,
  nominal: ModelTables,
  draws: SpreadDraws,
  where: DrawContext,
  hUnits = false,
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
    else if (status[i] === ZERO_WEIGHT || status[i] >= 2) {
      // A sample of weight 0 carries nothing; it is counted as what it is, not left out of every count.
      const why = status[i] === ZERO_WEIGHT ? ZERO_WEIGHT_REASON : REJECTIONS[status[i] - 2];
      rejected[why] = (rejected[why] ?? 0) + 1;
    }
  }
  const n = acceptedIndex.length;
  const weights = draws.weights === null ? null : Float64Array.from(acceptedIndex, (i) => draws.weights![i]);
  const effective = effectiveSampleSize(weights, n);
  const undefinedIn: Record<string, number> = {};
  const accepted = Int32Array.from(acceptedIndex);
  const stats = computeBands({ values, Q, accepted, weights, effective });
  const shape = {
    rows: nominal.redshifts.length,
    targets: L.targetKeys.length,
    surveys: L.surveyKeys.length,
    gridPoints: where.grid.length,
  };
  const entries = layoutEntries(L, shape.rows, shape.gridPoints);
  const maps = bandMaps(entries, stats, n, shape, undefinedIn);
  let hScaled: BandMaps | null = null;
  if (hUnits) {
    const picked: number[] = [];
    const powers: number[] = [];
    entries.forEach((e, q) => {
      const p = hPowerOfKey(e.key);
      if (p !== 0) {
        picked.push(q);
        powers.push(p);
      }
    });
    const hValues = inLittleHUnitsPerDraw(values, Q, picked, powers, draws, model.inputs.H0);
    const hStats = computeBands({ values: hValues, Q: picked.length, accepted, weights, effective });
    hScaled = bandMaps(
      picked.map((q) => entries[q]),
      hStats,
      n,
      shape,
      {},
    );
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
    ...maps,
    ...(hScaled ? { h_scaled: hScaled } : {}),
  };
}
