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
