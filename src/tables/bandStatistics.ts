import {
  OrderStatistics,
  SPREAD_PERCENTILES,
  percentileMonteCarloError,
  percentileRank,
  sortWeighted,
  weightedPercentile,
} from "../statistics/index.js";

const P = SPREAD_PERCENTILES.length;

/**
 * The percentiles of every quantity of a spread over its accepted draws, for threads to share: quantity q's
 * percentiles go to q_[q * 5 ...] and their Monte Carlo errors to e_[q * 5 ...]; missing[q] counts the accepted
 * draws that leave it undefined (then no percentiles are computed). Buffers may be shared between threads.
 */
export interface BandJob {
  /** Draw vectors: draw i's quantity q at values[i * Q + q] (NaN: undefined). */
  values: Float64Array;
  Q: number;
  /** The accepted draws, in draw order. */
  accepted: Int32Array;
  /** Their weights (null when equal). */
  weights: Float64Array | null;
  effective: number;
  q_: Float64Array;
  e_: Float64Array;
  missing: Int32Array;
  /** The next unclaimed quantity. */
  next: Int32Array;
}

/** Quantities claimed at a time. */
const CHUNK = 64;

/**
 * Computes the bands of the quantities it claims, until none is left. Equal weights: the 15 order statistics
 * behind the five percentiles and their Monte Carlo errors, by selection; weights: a sort and the weighted rule.
 */
export function computeClaimedBands(job: BandJob): void {
  const n = job.accepted.length;
  const { values, Q, accepted, weights } = job;
  const column = new Float64Array(n);
  const sorted = new Float64Array(n);
  const cumulative = new Float64Array(n);
  const order = new Uint32Array(n);
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
  const wanted = [...new Set(ranksOf.flatMap((r) => [r.at, r.lo, r.hi]))].sort((a, b) => a - b);
  const slot = (rank: number) => wanted.indexOf(rank);
  const rankSlots = ranksOf.map((r) => ({ at: slot(r.at), lo: slot(r.lo), hi: slot(r.hi) }));
  const selector = new OrderStatistics(n);
  const picked = new Array<number>(wanted.length).fill(0);
  for (;;) {
    const start = Atomics.add(job.next, 0, CHUNK);
    if (start >= Q) return;
    const end = Math.min(Q, start + CHUNK);
    for (let q = start; q < end; q++) {
      let missing = 0;
      for (let d = 0; d < n; d++) {
        const v = values[accepted[d] * Q + q];
        column[d] = v;
        if (Number.isNaN(v)) missing++;
      }
      job.missing[q] = missing;
      if (n === 0 || missing > 0) continue;
      if (weights === null) {
        selector.select(column, wanted, picked);
        for (let j = 0; j < P; j++) {
          const r = rankSlots[j];
          job.q_[q * P + j] = picked[r.at];
          job.e_[q * P + j] = (picked[r.hi] - picked[r.lo]) / 2;
        }
      } else {
        const c = sortWeighted(column, weights, order, sorted, cumulative);
        for (let j = 0; j < P; j++) {
          job.q_[q * P + j] = weightedPercentile(sorted, c, SPREAD_PERCENTILES[j]);
          job.e_[q * P + j] = percentileMonteCarloError(sorted, c, job.effective, SPREAD_PERCENTILES[j]);
        }
      }
    }
  }
}
