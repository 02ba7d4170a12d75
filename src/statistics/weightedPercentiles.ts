/** The percentiles every spread reports: the median and the central 68 % and 95 % intervals. */
export const SPREAD_PERCENTILES = [2.5, 16, 50, 84, 97.5] as const;

/**
 * Percentiles of weighted values by the inverse of the weighted empirical distribution function (Hyndman & Fan
 * 1996, definition 1, with weights): the q-th percentile is the smallest value whose cumulative weight reaches
 * q/100 of the total. Integer weights give exactly what the same values repeated by weight give. `sorted` holds
 * the values in ascending order and `cumulative` the running sum of their weights (null when every weight is 1).
 */
export function weightedPercentile(
  sorted: ArrayLike<number>,
  cumulative: ArrayLike<number> | null,
  percent: number,
): number {
  const n = sorted.length;
  const total = cumulative === null ? n : cumulative[n - 1];
  const target = (percent / 100) * total;
  if (cumulative === null) {
    // The smallest k with k >= target (1-based); a relative slack of 1e-12 absorbs rounding in percent/100 * n.
    const k = Math.max(1, Math.ceil(target * (1 - 1e-12)));
    return sorted[Math.min(n, k) - 1];
  }
  // Binary search for the first cumulative weight that reaches the target (with the same slack).
  let lo = 0;
  let hi = n - 1;
  const goal = target * (1 - 1e-12);
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (cumulative[mid] >= goal && cumulative[mid] > 0) hi = mid;
    else lo = mid + 1;
  }
  return sorted[lo];
}

/** Sorts values (with their weights) ascending and returns the running sums of the weights (null if unweighted). */
export function sortWeighted(
  values: Float64Array,
  weights: Float64Array | null,
  order: Uint32Array,
  sortedOut: Float64Array,
  cumulativeOut: Float64Array,
): Float64Array | null {
  const n = values.length;
  if (weights === null) {
    sortedOut.set(values);
    sortedOut.sort();
    return null;
  }
  for (let i = 0; i < n; i++) order[i] = i;
  order.sort((a, b) => values[a] - values[b]);
  let c = 0;
  for (let k = 0; k < n; k++) {
    sortedOut[k] = values[order[k]];
    c += weights[order[k]];
    cumulativeOut[k] = c;
  }
  return cumulativeOut;
}

/**
 * Monte Carlo error of a percentile from the order statistics around it: with N effective draws the rank of the
 * q-quantile has standard deviation sqrt(N q (1 - q)), so half the distance between the (q -/+ sqrt(q(1-q)/N))
 * quantiles estimates its standard error (the binomial interval for a quantile, e.g. Conover 1999, Practical
 * Nonparametric Statistics, section 3.2; recalled from memory). N is Kish's effective number (sum w)^2 / sum w^2.
 */
export function percentileMonteCarloError(
  sorted: ArrayLike<number>,
  cumulative: ArrayLike<number> | null,
  effectiveDraws: number,
  percent: number,
): number {
  const q = percent / 100;
  const d = Math.sqrt((q * (1 - q)) / effectiveDraws);
  const lo = weightedPercentile(sorted, cumulative, Math.max(0, q - d) * 100);
  const hi = weightedPercentile(sorted, cumulative, Math.min(1, q + d) * 100);
  return (hi - lo) / 2;
}

/** Kish's effective sample size of a set of weights, (sum w)^2 / sum w^2 (Kish 1965, Survey Sampling). */
export function effectiveSampleSize(weights: ArrayLike<number> | null, n: number): number {
  if (weights === null) return n;
  let s = 0;
  let s2 = 0;
  for (let i = 0; i < n; i++) {
    s += weights[i];
    s2 += weights[i] * weights[i];
  }
  return s2 > 0 ? (s * s) / s2 : 0;
}

/** The 0-based rank of the p-th percentile of n equally weighted values (definition 1, as weightedPercentile). */
export function percentileRank(n: number, percent: number): number {
  const k = Math.max(1, Math.ceil((percent / 100) * n * (1 - 1e-12)));
  return Math.min(n, k) - 1;
}

/**
 * Ascending order of a sequence of columns of n values, kept from one column to the next: each column is put in
 * order by insertion sort starting from the previous column's order, which costs about n steps when neighbouring
 * columns rank the draws alike (a quantity at adjacent grid redshifts); a column ranked very differently is sorted
 * afresh by distribution into n equal-width buckets (Dobosiewicz 1978), then insertion within buckets, and
 * Array.prototype.sort as the last resort. Exact, like any full sort (common practice). Finite values only.
 */
export class SortingPermutation {
  /** order[k] is the index of the k-th smallest value of the last column sorted. */
  readonly order: Uint32Array;
  private readonly counts: Int32Array;
  private readonly start: Int32Array;
  private readonly keys: Float64Array;

  constructor(private readonly n: number) {
    this.keys = new Float64Array(n);
    this.order = Uint32Array.from({ length: n }, (_, i) => i);
    this.counts = new Int32Array(n + 1);
    this.start = new Int32Array(n + 1);
  }

  /** Reorders `order` so that values[at + order[0]] <= values[at + order[1]] <= ...; returns it. */
  sort(values: ArrayLike<number>, at = 0): Uint32Array {
    if (!this.insertion(values, at, 4 * this.n)) {
      if (!this.distribute(values, at) || !this.insertion(values, at, 16 * this.n))
        this.order.sort((i, j) => values[at + i] - values[at + j]);
    }
    return this.order;
  }

  /** Insertion sort of `order` by the values; gives up (false) after `budget` moves, leaving a permutation. */
  private insertion(values: ArrayLike<number>, at: number, budget: number): boolean {
    const { order, keys, n } = this;
    for (let k = 0; k < n; k++) keys[k] = values[at + order[k]]; // moved with the indices: sequential comparisons
    let moves = 0;
    for (let i = 1; i < n; i++) {
      const x = keys[i];
      if (keys[i - 1] <= x) continue;
      const p = order[i];
      let j = i - 1;
      do {
        keys[j + 1] = keys[j];
        order[j + 1] = order[j];
        j--;
      } while (j >= 0 && keys[j] > x);
      keys[j + 1] = x;
      order[j + 1] = p;
      moves += i - 1 - j;
      if (moves > budget) return false;
    }
    return true;
  }

  /**
   * Orders the indices by bucket (n equal-width buckets between the minimum and maximum, a monotone map); false
   * when the range overflows (then nothing is changed).
   */
  private distribute(values: ArrayLike<number>, at: number): boolean {
    const n = this.n;
    let min = values[at];
    let max = values[at];
    for (let i = 1; i < n; i++) {
      const x = values[at + i];
      if (x < min) min = x;
      else if (x > max) max = x;
    }
    if (!(max > min)) return true; // all equal: any order is sorted
    if (!Number.isFinite(max - min)) return false;
    const scale = n / (max - min);
    const { counts, start, order } = this;
    counts.fill(0);
    for (let i = 0; i < n; i++) counts[Math.min(n - 1, Math.floor((values[at + i] - min) * scale)) + 1]++;
    for (let b = 0; b < n; b++) counts[b + 1] += counts[b];
    start.set(counts);
    for (let i = 0; i < n; i++) order[start[Math.min(n - 1, Math.floor((values[at + i] - min) * scale))]++] = i;
    return true;
  }
}
