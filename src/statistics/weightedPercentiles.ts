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
 * Order statistics by bucket selection: values are counted into 256 buckets of equal width between their minimum
 * and maximum (a monotone map, so a bucket holds a contiguous stretch of the sorted order), and only the buckets
 * that hold a wanted rank are gathered and sorted. Exact, like a full sort, at a few passes over the data (the
 * distributive partitioning of Dobosiewicz 1978, used for selection; common practice). One instance is reused for
 * every quantity of a spread.
 */
export class OrderStatistics {
  private static readonly BUCKETS = 256;
  private readonly bucketOf: Uint8Array;
  private readonly scratch: Float64Array;
  private readonly counts = new Int32Array(OrderStatistics.BUCKETS + 1);
  private readonly filled = new Int32Array(OrderStatistics.BUCKETS);
  private readonly needed = new Uint8Array(OrderStatistics.BUCKETS);

  constructor(private readonly n: number) {
    this.bucketOf = new Uint8Array(n);
    this.scratch = new Float64Array(n);
  }

  /** Writes to out[j] the value of 0-based rank ranks[j] among values[0..n-1] (finite numbers). */
  select(values: ArrayLike<number>, ranks: readonly number[], out: number[]): void {
    const n = this.n;
    const B = OrderStatistics.BUCKETS;
    let min = values[0];
    let max = values[0];
    for (let i = 1; i < n; i++) {
      const x = values[i];
      if (x < min) min = x;
      else if (x > max) max = x;
    }
    if (!(max > min)) {
      for (let j = 0; j < ranks.length; j++) out[j] = min;
      return;
    }
    const scale = B / (max - min);
    const counts = this.counts;
    counts.fill(0);
    for (let i = 0; i < n; i++) {
      const b = Math.min(B - 1, Math.floor((values[i] - min) * scale));
      this.bucketOf[i] = b;
      counts[b + 1]++;
    }
    for (let b = 0; b < B; b++) counts[b + 1] += counts[b]; // counts[b] is now where bucket b starts
    this.needed.fill(0);
    for (const r of ranks) {
      let b = 0;
      while (counts[b + 1] <= r) b++;
      this.needed[b] = 1;
    }
    const filled = this.filled;
    for (let b = 0; b < B; b++) filled[b] = counts[b];
    const scratch = this.scratch;
    for (let i = 0; i < n; i++) {
      const b = this.bucketOf[i];
      if (this.needed[b]) scratch[filled[b]++] = values[i];
    }
    for (let b = 0; b < B; b++) {
      if (!this.needed[b]) continue;
      const lo = counts[b];
      const hi = counts[b + 1];
      if (hi - lo > 32) scratch.subarray(lo, hi).sort();
      else
        for (let i = lo + 1; i < hi; i++) {
          const x = scratch[i];
          let j = i - 1;
          while (j >= lo && scratch[j] > x) {
            scratch[j + 1] = scratch[j];
            j--;
          }
          scratch[j + 1] = x;
        }
    }
    for (let j = 0; j < ranks.length; j++) out[j] = scratch[ranks[j]];
  }
}
