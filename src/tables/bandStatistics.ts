import {
  SortingPermutation,
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

/** Quantities claimed at a time (gathered together, so that each draw's stretch of them is read at once). */
const CHUNK = 64;

/**
 * Computes the bands of the quantities it claims, until none is left. Equal weights: the order of the draws by the
 * quantity (carried from one quantity to the next, see SortingPermutation) and the 15 order statistics behind the
 * five percentiles and their Monte Carlo errors; weights: a sort and the weighted rule.
 */
export function computeClaimedBands(job: BandJob): void {
  const n = job.accepted.length;
  const { values, Q, accepted, weights } = job;
  const block = new Float64Array(CHUNK * n);
  const nans = new Int32Array(CHUNK);
  const sorted = new Float64Array(n);
  const cumulative = new Float64Array(n);
  const order = new Uint32Array(n);
  // The ranks behind each percentile and its Monte Carlo error (as percentileMonteCarloError takes them): percentile
  // j's rank at ranks[3j], the ranks of its error's bracket at ranks[3j + 1] (low) and ranks[3j + 2] (high). Integers
  // in a typed array, so that the optimised code of this loop never meets a second shape for them.
  const ranks = new Int32Array(3 * P);
  SPREAD_PERCENTILES.forEach((p, j) => {
    const q = p / 100;
    const d = Math.sqrt((q * (1 - q)) / Math.max(1, n));
    ranks[3 * j] = percentileRank(n, p);
    ranks[3 * j + 1] = percentileRank(n, Math.max(0, q - d) * 100);
    ranks[3 * j + 2] = percentileRank(n, Math.min(1, q + d) * 100);
  });
  const permutation = new SortingPermutation(n);
  for (;;) {
    const start = Atomics.add(job.next, 0, CHUNK);
    if (start >= Q) return;
    const end = Math.min(Q, start + CHUNK);
    const width = end - start;
    // Quantity-major copy of the claimed stretch: block[j * n + d] is draw d's quantity start + j; NaNs counted.
    nans.fill(0);
    for (let d = 0; d < n; d++) {
      const from = accepted[d] * Q + start;
      for (let j = 0; j < width; j++) {
        const v = values[from + j];
        block[j * n + d] = v;
        if (Number.isNaN(v)) nans[j]++;
      }
    }
    for (let q = start; q < end; q++) {
      const at = (q - start) * n;
      const missing = nans[q - start];
      job.missing[q] = missing;
      if (n === 0 || missing > 0) continue;
      if (weights === null) {
        const byValue = permutation.sort(block, at);
        for (let j = 0; j < P; j++) {
          job.q_[q * P + j] = block[at + byValue[ranks[3 * j]]];
          job.e_[q * P + j] = (block[at + byValue[ranks[3 * j + 2]]] - block[at + byValue[ranks[3 * j + 1]]]) / 2;
        }
      } else {
        const column = block.subarray(at, at + n);
        const c = sortWeighted(column, weights, order, sorted, cumulative);
        for (let j = 0; j < P; j++) {
          job.q_[q * P + j] = weightedPercentile(sorted, c, SPREAD_PERCENTILES[j]);
          job.e_[q * P + j] = percentileMonteCarloError(sorted, c, job.effective, SPREAD_PERCENTILES[j]);
        }
      }
    }
  }
}
