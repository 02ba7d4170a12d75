// Spreads checked against things outside the project: a closed form (matter-only age), first-order error
// propagation, the equivalence of weights and repeated rows, and the normal quantile and Cholesky factor of
// reference libraries and closed forms. Every run is seeded, so each check is deterministic.
import { describe, expect, it } from "vitest";
import normalCdf from "@stdlib/stats-base-dists-normal-cdf";
import normalQuantileReference from "@stdlib/stats-base-dists-normal-quantile";
import { loadScenario } from "../../src/scenario/loadScenario.js";
import { buildTablesDocument } from "../../src/tables/buildTablesDocument.js";
import { computeScenario } from "../helpers/computeScenario.js";
import {
  SortingPermutation,
  Xoshiro128StarStar,
  choleskyLower,
  normalQuantile,
  sortWeighted,
  weightedPercentile,
} from "../../src/statistics/index.js";
import type { ModelSpread, TablesDocument } from "../../src/contract/tablesDocument.js";
import { hubbleDistanceMpc, hubbleTimeGyr } from "../helpers/referenceScales.js";

const P = [2.5, 16, 50, 84, 97.5];

const compute = computeScenario;
const spreadOf = (doc: TablesDocument, i = 0) => doc.models[i].spread as ModelSpread;

describe("statistics building blocks", () => {
  it("the normal quantile inverts the normal CDF of @stdlib from p = 1e-300 to 1 - 1e-6", () => {
    for (const p of [1e-300, 1e-100, 1e-20, 1e-10, 1e-5, 0.001, 0.0249, 0.025, 0.16, 0.3, 0.5, 0.84, 0.975, 0.999999]) {
      const x = normalQuantile(p);
      const back = normalCdf(x, 0, 1);
      // Phi turns a relative error e of x into about x^2 e of p in the tail: allow 2e-15 (1 + x^2).
      expect(Math.abs(back - p) / p, `p = ${p}`).toBeLessThan(2e-15 * (1 + x * x));
    }
    // Central values agree with @stdlib's own quantile to 1e-15 (its range of full accuracy).
    for (const p of [0.01, 0.16, 0.5, 0.84, 0.99])
      expect(normalQuantile(p)).toBeCloseTo(normalQuantileReference(p, 0, 1), 14);
  });

  it("xoshiro128** uniforms lie in (0, 1) with mean 1/2 and variance 1/12 (closed forms of the uniform law)", () => {
    const rng = new Xoshiro128StarStar(12345);
    const n = 200_000;
    let s = 0;
    let s2 = 0;
    let outside = 0;
    for (let i = 0; i < n; i++) {
      const u = rng.nextOpenUnit();
      if (!(u > 0 && u < 1)) outside++;
      s += u;
      s2 += u * u;
    }
    expect(outside).toBe(0);
    const mean = s / n;
    // Five standard errors: sqrt(1/12/n) = 6.5e-4 for the mean.
    expect(Math.abs(mean - 0.5)).toBeLessThan(5 * Math.sqrt(1 / 12 / n));
    expect(Math.abs(s2 / n - mean * mean - 1 / 12)).toBeLessThan(5 * Math.sqrt(1 / 180 / n));
    // The same seed gives the same stream; another seed another one.
    expect(new Xoshiro128StarStar(7).nextUint32()).toBe(new Xoshiro128StarStar(7).nextUint32());
    expect(new Xoshiro128StarStar(7).nextUint32()).not.toBe(new Xoshiro128StarStar(8).nextUint32());
  });

  it("the Cholesky factor of a 3 x 3 correlation matrix reproduces it (A = L L^T) and refuses an indefinite one", () => {
    const a = [
      [1, -0.9, 0.2],
      [-0.9, 1, 0.1],
      [0.2, 0.1, 1],
    ];
    const l = choleskyLower(a)!;
    for (let i = 0; i < 3; i++)
      for (let j = 0; j < 3; j++) {
        let s = 0;
        for (let k = 0; k < 3; k++) s += l[i][k] * l[j][k];
        expect(s).toBeCloseTo(a[i][j], 14);
      }
    // Closed form for 2 x 2: L = [[1, 0], [r, sqrt(1 - r^2)]].
    expect(
      choleskyLower([
        [1, 0.6],
        [0.6, 1],
      ]),
    ).toEqual([
      [1, 0],
      [0.6, 0.8],
    ]);
    expect(
      choleskyLower([
        [1, 0.9, 0.9],
        [0.9, 1, -0.9],
        [0.9, -0.9, 1],
      ]),
    ).toBeNull();
  });

  it("the carried sorting order equals a full sort, column after column (ties, tails, reversals, constant data)", () => {
    const rng = new Xoshiro128StarStar(4);
    const shapes: ((u: number) => number)[] = [
      (u) => u,
      (u) => Math.round(u * 5), // many ties
      (u) => 1 / (u * u), // a heavy tail: most values in the first bucket
      () => 3, // constant
      (u) => (u < 0.5 ? -1e300 : 1e300) * u, // extreme range
      (u) => (u < 0.5 ? -1.7e308 : 1.7e308) * u, // a range that overflows: the last-resort sort
    ];
    const checkSorted = (values: Float64Array, order: Uint32Array) => {
      expect([...order].sort((a, b) => a - b)).toEqual([...values.keys()]); // a permutation
      expect(Float64Array.from(order, (i) => values[i])).toEqual(Float64Array.from(values).sort());
    };
    for (const shape of shapes)
      for (const n of [1, 2, 17, 1000]) {
        const sorter = new SortingPermutation(n);
        const base = Float64Array.from({ length: n }, () => shape(rng.nextOpenUnit()));
        // A column, a slightly perturbed one (the cheap path), its reverse (the fresh sort), and a new one.
        const columns = [
          base,
          base.map((x) => x * (1 + 1e-3 * (rng.nextOpenUnit() - 0.5))),
          base.map((x) => -x),
          Float64Array.from({ length: n }, () => shape(rng.nextOpenUnit())),
        ];
        for (const column of columns) {
          checkSorted(column, sorter.sort(column));
          // The same column inside a larger buffer, addressed by its offset (as the band blocks are).
          const padded = Float64Array.from([Number.NaN, -Infinity, ...column, Infinity]);
          checkSorted(column, sorter.sort(padded, 2));
        }
      }
  });

  it("weighted percentiles equal the percentiles of rows repeated by weight (Hyndman & Fan definition 1)", () => {
    const rng = new Xoshiro128StarStar(99);
    for (let trial = 0; trial < 50; trial++) {
      const n = 1 + (rng.nextUint32() % 40);
      const values = Float64Array.from({ length: n }, () => Math.round(rng.nextOpenUnit() * 20) / 4);
      const weights = Float64Array.from({ length: n }, () => rng.nextUint32() % 4);
      if (weights.every((w) => w === 0)) weights[0] = 1;
      const repeated = Float64Array.from([...values].flatMap((v, i) => Array<number>(weights[i]).fill(v)));
      const sortedW = new Float64Array(n);
      const cumulative = sortWeighted(values, weights, new Uint32Array(n), sortedW, new Float64Array(n));
      const sortedR = new Float64Array(repeated.length);
      sortWeighted(repeated, null, new Uint32Array(repeated.length), sortedR, new Float64Array(repeated.length));
      for (const p of [0, 2.5, 16, 33.3, 50, 84, 97.5, 100])
        expect(weightedPercentile(sortedW, cumulative, p), `trial ${trial}, p ${p}`).toBe(
          weightedPercentile(sortedR, null, p),
        );
    }
  });
});

describe("spreads against closed forms and first-order propagation", () => {
  it("matter only, flat: age = (2/3)/H0 is monotone in H0, so its percentiles are the transform of H0's (closed form)", () => {
    const mu = 70;
    const sigma = 3;
    const doc = compute(
      [
        "title: matter only",
        "redshifts: [1]",
        "grid: { points: 20 }",
        "draws: { count: 4000, seed: 11 }",
        "models:",
        "  - id: eds",
        `    H0: ${mu}`,
        "    Omega_m: 1",
        "    radiation: none",
        `    spread: { normal: { H0: ${sigma} } }`,
        "",
      ].join("\n"),
    );
    const band = spreadOf(doc).summary.age_Gyr!;
    P.forEach((p, j) => {
      // The p-th percentile of the age is (2/3) t_H at the (100 - p)-th percentile of H0 = mu + sigma Phi^-1(q).
      const h0 = mu + sigma * normalQuantileReference(1 - p / 100, 0, 1);
      const expected = (2 / 3) * hubbleTimeGyr(h0);
      expect(
        Math.abs(band.q[j] - expected),
        `p${p}: ${band.q[j]} vs ${expected} (mc error ${band.mc_error[j]})`,
      ).toBeLessThan(3 * band.mc_error[j]);
    });
    // At z = 1 the comoving distance is 2 (c/H0) (1 - 1/sqrt(2)) (closed form), decreasing in H0 too.
    const dc = spreadOf(doc).redshifts[0].comoving_distance_Mpc!;
    const h0 = mu + sigma * normalQuantileReference(0.5, 0, 1);
    expect(Math.abs(dc.q[2] - 2 * hubbleDistanceMpc(h0) * (1 - Math.SQRT1_2))).toBeLessThan(3 * dc.mc_error[2]);
  });

  it("small uncertainties: the 68 % half-width of D_L(z = 1) is first-order propagation through numerical derivatives", () => {
    const center = { H0: 68, Omega_m: 0.31 };
    const sigma = { H0: 0.068, Omega_m: 0.00031 }; // 0.1 %: second-order terms are 1e-3 of the first
    const doc = compute(
      [
        "title: linear",
        "redshifts: [1]",
        "grid: { points: 20 }",
        "draws: { count: 4000, seed: 5 }",
        "models:",
        "  - id: m",
        `    H0: ${center.H0}`,
        `    Omega_m: ${center.Omega_m}`,
        `    spread: { normal: { H0: ${sigma.H0}, Omega_m: ${sigma.Omega_m} } }`,
        "",
      ].join("\n"),
    );
    // Central differences of the engine's D_L with a step of one tenth of sigma (independent of the draws).
    const dl = (H0: number, Om: number) =>
      buildTablesDocument(
        loadScenario(
          `title: d\nredshifts: [1]\ngrid: { points: 2 }\nmodels:\n  - { id: m, H0: ${H0}, Omega_m: ${Om} }\n`,
          "d.yaml",
        ),
      ).models[0].redshifts[0].luminosity_distance_Mpc as number;
    const dH = (dl(center.H0 + 0.1 * sigma.H0, center.Omega_m) - dl(center.H0 - 0.1 * sigma.H0, center.Omega_m)) / 0.2;
    const dOm =
      (dl(center.H0, center.Omega_m + 0.1 * sigma.Omega_m) - dl(center.H0, center.Omega_m - 0.1 * sigma.Omega_m)) / 0.2;
    const linear = Math.hypot(dH, dOm); // per unit sigma of each, independent
    const band = spreadOf(doc).redshifts[0].luminosity_distance_Mpc!;
    const halfWidth = (band.q[3] - band.q[1]) / 2;
    // The 16th-84th half-width of a normal is 0.9945 sigma (Phi^-1(0.84), not 1); its Monte Carlo error combines both ends.
    const expected = linear * normalQuantileReference(0.84, 0, 1);
    const mc = Math.hypot(band.mc_error[1], band.mc_error[3]) / 2;
    expect(Math.abs(halfWidth - expected), `${halfWidth} vs ${expected}, mc ${mc}`).toBeLessThan(3 * mc);
  });

  it("a weighted samples file gives the percentiles of the same file with rows repeated by weight", () => {
    const rng = new Xoshiro128StarStar(2026);
    const rows: [number, number, number][] = [];
    for (let i = 0; i < 150; i++)
      rows.push([65 + 10 * rng.nextOpenUnit(), 0.25 + 0.1 * rng.nextOpenUnit(), 1 + (rng.nextUint32() % 3)]);
    const weighted = ["H0,Omega_m,weight", ...rows.map((r) => r.join(","))].join("\n");
    const repeated = ["H0,Omega_m", ...rows.flatMap((r) => Array<string>(r[2]).fill(`${r[0]},${r[1]}`))].join("\n");
    const yaml = (file: string) =>
      `title: chain\nredshifts: [0.5, 2]\ngrid: { points: 30 }\nmodels:\n  - { id: m, H0: 70, Omega_m: 0.3, spread: { samples: ${file} } }\n`;
    const a = spreadOf(compute(yaml("w.csv"), { "w.csv": weighted }));
    const b = spreadOf(compute(yaml("r.csv"), { "r.csv": repeated }));
    expect(a.accepted).toBe(150);
    expect(b.accepted).toBe(rows.reduce((n, r) => n + r[2], 0));
    const qs = (s: ModelSpread) =>
      JSON.stringify([s.summary, s.redshifts, s.grid], (k, v) => (k === "mc_error" ? undefined : v));
    expect(qs(a)).toBe(qs(b));
    // Kish's effective number: (sum w)^2 / sum w^2 for the weighted file, the row count for the repeated one.
    const sw = rows.reduce((n, r) => n + r[2], 0);
    const sw2 = rows.reduce((n, r) => n + r[2] * r[2], 0);
    expect(a.effective_draws).toBeCloseTo((sw * sw) / sw2, 10);
    expect(b.effective_draws).toBe(sw);
  });

  it("correlations narrow a derived quantity as they should: H0 and Omega_m anti-correlated at fixed Omega_m h^2", () => {
    // With Omega_m h^2 fixed (a perfect anti-correlation of ln H0 and ln Omega_m, slope -2), the age varies far less
    // than with independent draws of the same marginals (common practice: the CMB fixes omega_m, not H0 and Omega_m).
    const model = (corr: string) =>
      `title: c\nredshifts: [1]\ngrid: { points: 10 }\ndraws: { count: 2000, seed: 3 }\nmodels:\n  - id: m\n    H0: 67.4\n    Omega_m: 0.315\n    spread:\n      normal: { H0: 0.5, Omega_m: 0.0047 }\n${corr}`;
    const free = spreadOf(compute(model(""))).summary.age_Gyr!;
    const tied = spreadOf(compute(model("      correlation: [[1, -0.99], [-0.99, 1]]\n"))).summary.age_Gyr!;
    expect(tied.q[3] - tied.q[1]).toBeLessThan(0.5 * (free.q[3] - free.q[1]));
    expect(spreadOf(compute(model("      correlation: [[1, -0.99], [-0.99, 1]]\n"))).form).toBe("multivariate_normal");
  });
});

describe("draws are counted and reproducible", () => {
  const nearTheEdge = (seed: number) =>
    [
      "title: edge",
      "redshifts: [0.5]",
      "grid: { points: 10 }",
      `draws: { count: 300, seed: ${seed} }`,
      "models:",
      "  - id: closed",
      "    H0: 70",
      "    Omega_m: 0.3",
      "    Omega_de: 1.6",
      "    spread: { normal: { Omega_de: 0.4, Omega_m: 0.2 } }",
      "",
    ].join("\n");

  it("samples of weight 0 are counted as such: accepted plus rejected is every row", () => {
    // 30 rows, every third of weight 0 (made up for the test): 10 carry no probability.
    const rows = Array.from({ length: 30 }, (_, i) => `${68 + 0.1 * i},0.3,${i % 3 === 0 ? 0 : 1}`);
    const doc = compute(
      "title: t\ndraws: { count: 20 }\nmodels:\n  - { id: m, H0: 70, Omega_m: 0.3, spread: { samples: c.csv } }\n",
      { "c.csv": `H0,Omega_m,weight\n${rows.join("\n")}\n` },
    );
    const s = doc.models[0].spread!;
    expect(s.draws).toBe(30);
    expect(s.accepted).toBe(20);
    expect(s.rejected).toBe(10);
    expect(s.rejected_because).toEqual({ "weight 0 (a sample that carries no probability)": 10 });
  });

  it("draws without a big bang or outside the accepted range are rejected and counted, never kept", () => {
    const doc = compute(nearTheEdge(1));
    const s = spreadOf(doc);
    expect(s.rejected).toBeGreaterThan(0);
    expect(s.accepted + s.rejected).toBe(300);
    expect(Object.values(s.rejected_because).reduce((a, b) => a + b, 0)).toBe(s.rejected);
    expect(Object.keys(s.rejected_because)).toEqual(expect.arrayContaining(["no big bang"]));
    expect(doc.models[0].warnings.join("\n")).toMatch(/draws rejected .*no big bang/);
  });

  it("the same inputs give byte-identical documents; another seed gives other draws", () => {
    const a = JSON.stringify(compute(nearTheEdge(1)));
    expect(JSON.stringify(compute(nearTheEdge(1)))).toBe(a);
    const b = compute(nearTheEdge(2));
    expect(JSON.stringify(b)).not.toBe(a);
    expect(b.draws).toMatchObject({ count: 300, seed: 2, percentiles: P });
  });
});
