/** Statistics for parameter spreads: pure TypeScript, no I/O, no packages (like the engine). */
export { GENERATOR_NAME, Xoshiro128StarStar, fnv1a32 } from "./xoshiro128StarStar.js";
export { normalQuantile } from "./normalQuantile.js";
export { choleskyLower } from "./cholesky.js";
export {
  SPREAD_PERCENTILES,
  effectiveSampleSize,
  percentileMonteCarloError,
  percentileRank,
  SortingPermutation,
  sortWeighted,
  weightedPercentile,
} from "./weightedPercentiles.js";
