// The statistics of spreads against known answers from outside the code under test: the generator against an
// independent implementation written from its authors' description (test/fixtures/xoshiro/runner.py), the split
// normal against its closed-form quantiles, the percentile rule against samples worked by hand, and the Monte Carlo
// error against the scatter of medians over many seeds and the asymptotic standard error of a median.
import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { join } from "node:path";
import normalQuantileReference from "@stdlib/stats-base-dists-normal-quantile";
import {
  SPREAD_PERCENTILES,
  Xoshiro128StarStar,
  normalQuantile,
  percentileMonteCarloError,
  weightedPercentile,
} from "../../src/statistics/index.js";
import { computeClaimedBands } from "../../src/tables/bandStatistics.js";
import { spreadDraws } from "../../src/tables/spreadBands.js";
import type { ResolvedSpread } from "../../src/scenario/resolvedScenario.js";
import { ROOT } from "../helpers/buildDemoSite.js";

describe("xoshiro128** and its seeding, against an independent implementation", () => {
  const fixture = JSON.parse(readFileSync(join(ROOT, "test/fixtures/xoshiro/xoshiro128starstar.json"), "utf8")) as {
    cases: { seed: number; uint32: number[]; open_unit: string[] }[];
  };
  it("gives the script's 32-bit outputs and uniform deviates for every seed", () => {
    expect(fixture.cases.length).toBeGreaterThan(5);
    for (const c of fixture.cases) {
      const g = new Xoshiro128StarStar(c.seed);
      expect(
        c.uint32.map(() => g.nextUint32()),
        `seed ${c.seed}`,
      ).toEqual(c.uint32);
      const u = new Xoshiro128StarStar(c.seed);
      expect(
        c.open_unit.map(() => u.nextOpenUnit()),
        `seed ${c.seed}`,
      ).toEqual(c.open_unit.map(Number));
    }
  });
});

/** The p-quantile of a sample (type 1, by sorting: written here, not the code under test). */
const quantileOf = (xs: Float64Array, p: number) => {
  const s = Float64Array.from(xs).sort();
  return s[Math.min(s.length, Math.max(1, Math.ceil(p * s.length))) - 1];
};

describe("asymmetric uncertainties are drawn as a split normal", () => {
  it("the 2.5, 16, 84 and 97.5 percentiles of the draws follow the closed form on each side", () => {
    // Half-widths applied on their own sides, each side with probability 1/2 (the median is the centre): the
    // p-quantile is c - minus z_(1-p) below the median and c + plus z_p above it, z_p the standard normal quantile
    // (closed form of the construction; Barlow 2003, physics/0306138, for asymmetric errors). Swapped halves would
    // put the wide side below.
    const spread = {
      form: "normal",
      correlation: null,
      from: "model",
      parameters: [{ key: "H0", center: 70, plus: 3, minus: 1 }],
    } as unknown as ResolvedSpread;
    const n = 200_000;
    const draws = spreadDraws(spread, "split", n, 12345, undefined);
    const z = (p: number) => normalQuantileReference(p, 0, 1);
    for (const p of [0.025, 0.16, 0.5, 0.84, 0.975]) {
      const expected = p < 0.5 ? 70 - 1 * z(1 - p) : 70 + 3 * z(p);
      // The standard error of a sample quantile is sqrt(p (1-p) / n) / density there (common practice); 5 of them.
      const half = p < 0.5 ? 1 : 3;
      // Each side is half of a half-normal of width s: density phi(z) / s there.
      const density = Math.exp(-0.5 * z(p) ** 2) / Math.sqrt(2 * Math.PI) / half;
      const tolerance = (5 * Math.sqrt((p * (1 - p)) / n)) / density;
      expect(Math.abs(quantileOf(draws.values, p) - expected), `p = ${p}`).toBeLessThan(tolerance);
    }
  });
});

describe("the percentile rule, worked by hand (Hyndman & Fan 1996, definition 1: the inverse empirical CDF)", () => {
  it("unweighted: the smallest value whose share of the sample reaches p", () => {
    // n = 5: k = ceil(p n): 2.5 % -> 1st, 16 % -> ceil(0.8) = 1st, 50 % -> ceil(2.5) = 3rd, 84 % -> ceil(4.2) = 5th.
    const five = Float64Array.of(1, 2, 3, 4, 5);
    expect(SPREAD_PERCENTILES.map((p) => weightedPercentile(five, null, p))).toEqual([1, 1, 3, 5, 5]);
    // n = 10: 16 % -> ceil(1.6) = 2nd, 50 % -> 5th exactly (a share of exactly p counts), 84 % -> 9th.
    const ten = Float64Array.from({ length: 10 }, (_, i) => 10 * (i + 1));
    expect(SPREAD_PERCENTILES.map((p) => weightedPercentile(ten, null, p))).toEqual([10, 20, 50, 90, 100]);
  });

  it("weighted: the smallest value whose cumulative weight reaches p of the total", () => {
    // Values 1, 2, 3 with weights 1, 2, 1 (cumulative 1, 3, 4 of 4): 16 % -> 0.64 -> 1; 25 % -> 1 -> 1 (reached
    // exactly); 50 % -> 2 -> 2; 75 % -> 3 -> 2; 84 % -> 3.36 -> 3. As the values 1, 2, 2, 3 repeated by weight.
    const sorted = Float64Array.of(1, 2, 3);
    const cumulative = Float64Array.of(1, 3, 4);
    expect([16, 25, 50, 75, 84].map((p) => weightedPercentile(sorted, cumulative, p))).toEqual([1, 1, 2, 2, 3]);
    const repeated = Float64Array.of(1, 2, 2, 3);
    expect([16, 25, 50, 75, 84].map((p) => weightedPercentile(repeated, null, p))).toEqual([1, 1, 2, 2, 3]);
  });

  it("the bands of the draws take the same order statistics (unsorted input, two quantities)", () => {
    // Draw d's quantities at values[2d], values[2d + 1]: quantity 0 is 5, 3, 1, 4, 2 and quantity 1 is its negative.
    const values = Float64Array.of(5, -5, 3, -3, 1, -1, 4, -4, 2, -2);
    const P = SPREAD_PERCENTILES.length;
    const job = {
      values,
      Q: 2,
      accepted: Int32Array.of(0, 1, 2, 3, 4),
      weights: null,
      effective: 5,
      q_: new Float64Array(2 * P),
      e_: new Float64Array(2 * P),
      missing: new Int32Array(2),
      next: new Int32Array(1),
    };
    computeClaimedBands(job);
    expect([...job.q_.subarray(0, P)]).toEqual([1, 1, 3, 5, 5]);
    expect([...job.q_.subarray(P, 2 * P)]).toEqual([-5, -5, -3, -1, -1]);
    // Only the accepted draws count: without draws 0 and 3 (5 and 4) the values are 3, 1, 2.
    const some = { ...job, accepted: Int32Array.of(1, 2, 4), effective: 3, next: new Int32Array(1) };
    computeClaimedBands(some);
    expect([...some.q_.subarray(0, P)]).toEqual([1, 1, 2, 3, 3]);
  });
});

describe("the Monte Carlo error of a percentile is honest", () => {
  it("matches the scatter of medians over 200 seeds and the asymptotic standard error of a median", () => {
    // For n standard normal draws the median's standard error tends to sqrt(pi / 2) / sqrt(n) (Laplace's asymptotic
    // variance of the sample median, 1 / (4 n f(0)^2); common practice).
    const n = 400;
    const medians: number[] = [];
    const errors: number[] = [];
    const bandErrors: number[] = [];
    const P = SPREAD_PERCENTILES.length;
    for (let seed = 1; seed <= 200; seed++) {
      const g = new Xoshiro128StarStar(seed * 7919);
      const draws = Float64Array.from({ length: n }, () => normalQuantile(g.nextOpenUnit()));
      const xs = Float64Array.from(draws).sort();
      medians.push(weightedPercentile(xs, null, 50));
      errors.push(percentileMonteCarloError(xs, null, n, 50));
      // The draws' own band path (order statistics of unsorted draws, one quantity).
      const job = {
        values: draws,
        Q: 1,
        accepted: Int32Array.from({ length: n }, (_, i) => i),
        weights: null,
        effective: n,
        q_: new Float64Array(P),
        e_: new Float64Array(P),
        missing: new Int32Array(1),
        next: new Int32Array(1),
      };
      computeClaimedBands(job);
      expect(job.q_[2]).toBe(medians.at(-1));
      bandErrors.push(job.e_[2]);
    }
    const mean = medians.reduce((a, b) => a + b, 0) / medians.length;
    const scatter = Math.sqrt(medians.reduce((a, b) => a + (b - mean) ** 2, 0) / (medians.length - 1));
    const estimate = errors.reduce((a, b) => a + b, 0) / errors.length;
    const asymptotic = Math.sqrt(Math.PI / 2) / Math.sqrt(n);
    // 200 seeds measure a standard deviation to about 5 %; the estimate is a ratio of order statistics.
    expect(Math.abs(scatter / asymptotic - 1)).toBeLessThan(0.2);
    expect(Math.abs(estimate / asymptotic - 1)).toBeLessThan(0.2);
    expect(Math.abs(estimate / scatter - 1)).toBeLessThan(0.25);
    const bandEstimate = bandErrors.reduce((a, b) => a + b, 0) / bandErrors.length;
    expect(Math.abs(bandEstimate / scatter - 1)).toBeLessThan(0.25);
  });
});
