// The bookkeeping of spreads, each part against a known answer: which quantities get bands (exactly the model's
// numeric ones), which draws are rejected and why, quantities that some draws leave undefined, the description and
// form of a spread, correlated draws against their correlation, samples that vary, Kish's effective size, and the
// guards of the numerical building blocks (normal quantile, Cholesky factor, FNV-1a of a model id).
import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { computeScenario } from "../helpers/computeScenario.js";
import { spreadDescription, spreadDraws } from "../../src/tables/spreadBands.js";
import { computeClaimedBands } from "../../src/tables/bandStatistics.js";
import {
  SPREAD_PERCENTILES,
  choleskyLower,
  effectiveSampleSize,
  fnv1a32,
  normalQuantile,
} from "../../src/statistics/index.js";
import type { ResolvedSpread } from "../../src/scenario/resolvedScenario.js";
import { ROOT } from "../helpers/buildDemoSite.js";
import { hubbleTimeGyr } from "../helpers/referenceScales.js";
import { relErr } from "../helpers/modelOf.js";

const compute = computeScenario;

/** The keys of a record whose values are numbers or null (the quantities a spread bands). */
const numericKeys = (record: object, except: string[] = []) =>
  Object.entries(record)
    .filter(([k, v]) => (typeof v === "number" || v === null) && !except.includes(k))
    .map(([k]) => k)
    .sort();

describe("which quantities get bands", () => {
  it("exactly the model's numeric quantities, in every section, and the grid's columns", () => {
    const doc = compute(`title: t
redshifts: [0.5, 2]
grid: { z_max: 5, points: 30 }
draws: { count: 40, seed: 2 }
models:
  - { id: m, H0: 70, Omega_m: 0.3, omega_b: 0.0224, spread: { normal: { H0: 1 } } }
targets:
  - { name: by z, z: 1, size_kpc: 10 }
  - { name: by time, lookback_Gyr: 5 }
surveys:
  - { name: s, area_deg2: 100, z_min: 0.2, z_max: 0.4, density_per_Mpc3: 1.0e-4 }
`);
    const m = doc.models[0];
    const s = m.spread!;
    expect(Object.keys(s.summary).sort()).toEqual(numericKeys(m.summary));
    m.redshifts.forEach((r, i) => expect(Object.keys(s.redshifts[i]).sort()).toEqual(numericKeys(r, ["z"])));
    // A target placed by z keeps z fixed (no band); one placed by time gets a band for its solved z.
    expect(Object.keys(s.targets[0]).sort()).toEqual(numericKeys(m.targets[0], ["z"]));
    expect(Object.keys(s.targets[1]).sort()).toEqual(numericKeys(m.targets[1]));
    expect(Object.keys(s.surveys[0]).sort()).toEqual(numericKeys(m.surveys[0], ["z_min", "z_max"]));
    expect(Object.keys(s.grid).sort()).toEqual(
      Object.keys(m.grid)
        .filter((k) => k !== "z")
        .sort(),
    );
    const dl = s.grid.luminosity_distance_Mpc!;
    expect(dl.q.length).toBe(SPREAD_PERCENTILES.length);
    expect(dl.q[2].length).toBe(30);
    // The form, the parameters and the description say what was drawn.
    expect(s.form).toBe("normal");
    expect(s.parameters).toEqual(["H0"]);
    expect(s.description).toBe("independent normal (H0 +/- 1)");
  });

  it("a quantity that some draws leave undefined has no band and is counted in undefined_in", () => {
    // w0 spread across -1: draws with w0 < -1 rip (a finite time to the rip), the others do not (null; closed
    // form: constant w < -1 is a big rip, Caldwell, Kamionkowski & Weinberg 2003).
    const doc = compute(`title: t
redshifts: [1]
draws: { count: 200, seed: 5 }
models:
  - { id: m, H0: 70, Omega_m: 0.3, Omega_de: 0.7, w0: -1.0, radiation: none, spread: { normal: { w0: 0.05 } } }
`);
    const s = doc.models[0].spread!;
    expect(s.summary.time_to_rip_Gyr).toBeNull();
    const nulls = s.undefined_in["summary.time_to_rip_Gyr"];
    expect(nulls).toBeGreaterThan(50);
    expect(nulls).toBeLessThan(150);
    expect(s.summary.age_Gyr).not.toBeNull();
  });
});

describe("which draws are rejected, and why", () => {
  it("draws outside the accepted range are rejected by name; accepted plus rejected is every draw", () => {
    // Omega_m = 0.05 +/- 0.1 puts a third of the draws below 0 (outside the schema's range).
    const doc = compute(`title: t
redshifts: [1]
draws: { count: 300, seed: 3 }
models:
  - { id: m, H0: 70, Omega_m: 0.05, spread: { normal: { Omega_m: 0.1 } } }
`);
    const s = doc.models[0].spread!;
    expect(s.rejected_because["outside the accepted range"]).toBeGreaterThan(60);
    expect(s.accepted + s.rejected).toBe(300);
    expect(Object.values(s.rejected_because).reduce((a, b) => a + b, 0)).toBe(s.rejected);
  });

  it("draws that are no valid model are rejected by name", () => {
    // Three 1 eV neutrinos make Omega_nu about 0.066 at h = 0.7 (sum m / 93.14 eV / h^2): draws of Omega_m below
    // that leave no room for cold matter, which is no valid model.
    const invalid = compute(`title: t
redshifts: [1]
draws: { count: 200, seed: 5 }
models:
  - { id: m, H0: 70, Omega_m: 0.09, m_nu_eV: [1, 1, 1], spread: { normal: { Omega_m: 0.02 } } }
`).models[0].spread!;
    expect(invalid.rejected_because["not a valid model"]).toBeGreaterThan(10);
    expect(Object.keys(invalid.rejected_because)).toEqual(["not a valid model"]);
  });

  it("two varied parameters: every draw evaluated, and correlated draws have their correlation", () => {
    const spread = {
      form: "normal",
      from: "model",
      correlation: [
        [1, -0.8],
        [-0.8, 1],
      ],
      parameters: [
        { key: "H0", center: 70, plus: 2, minus: 2 },
        { key: "Omega_m", center: 0.3, plus: 0.01, minus: 0.01 },
      ],
    } as unknown as ResolvedSpread;
    const n = 20_000;
    const d = spreadDraws(spread, "corr", n, 9, undefined);
    expect(d.values.length).toBe(2 * n);
    let sx = 0;
    let sy = 0;
    for (let i = 0; i < n; i++) {
      sx += d.values[2 * i];
      sy += d.values[2 * i + 1];
    }
    const mx = sx / n;
    const my = sy / n;
    let cxx = 0;
    let cyy = 0;
    let cxy = 0;
    for (let i = 0; i < n; i++) {
      const x = d.values[2 * i] - mx;
      const y = d.values[2 * i + 1] - my;
      cxx += x * x;
      cyy += y * y;
      cxy += x * y;
    }
    // The sample correlation of a bivariate normal has standard error (1 - rho^2) / sqrt(n) (common practice).
    expect(Math.abs(cxy / Math.sqrt(cxx * cyy) - -0.8)).toBeLessThan((5 * (1 - 0.64)) / Math.sqrt(n));
    expect(relErr(Math.sqrt(cxx / n), 2)).toBeLessThan(0.03);
    expect(relErr(Math.sqrt(cyy / n), 0.01)).toBeLessThan(0.03);
    expect(spreadDescription(spread)).toBe("correlated normal (H0 +/- 2, Omega_m +/- 0.01)");
    const asymmetric = {
      form: "normal",
      from: "published",
      correlation: null,
      parameters: [{ key: "H0", center: 70, plus: 1.5, minus: 3 }],
    } as unknown as ResolvedSpread;
    expect(spreadDescription(asymmetric)).toBe(
      "independent normal (H0 +1.5 -3, the published marginal 68 % uncertainties)",
    );
    const doc = compute(`title: t
redshifts: [1]
draws: { count: 60, seed: 4 }
models:
  - id: m
    H0: 70
    Omega_m: 0.3
    spread: { normal: { H0: 1, Omega_m: 0.01 }, correlation: [[1, -0.5], [-0.5, 1]] }
`);
    expect(doc.models[0].spread!.form).toBe("multivariate_normal");
    expect(doc.models[0].spread!.accepted).toBe(60);
    expect(doc.models[0].spread!.parameters).toEqual(["H0", "Omega_m"]);
  });

  it("samples that vary give bands at their own order statistics (matter only: t_H scales as 1/H0)", () => {
    // 20 samples H0 = 61 ... 80, Omega_m = 1, no radiation: the Hubble time 1/H0 of each is known in closed form, and
    // its percentiles (type 1) are those of the samples' 1/H0.
    const rows = Array.from({ length: 20 }, (_, i) => `${61 + i},1`);
    const doc = compute(
      "title: t\nredshifts: [1]\ndraws: { count: 20 }\nmodels:\n  - { id: m, H0: 70, Omega_m: 1, radiation: none, spread: { samples: c.csv } }\n",
      { "c.csv": `H0,Omega_m\n${rows.join("\n")}\n` },
    );
    const b = doc.models[0].spread!.summary.hubble_time_Gyr!;
    const times = Array.from({ length: 20 }, (_, i) => hubbleTimeGyr(61 + i)).sort((x, y) => x - y);
    const rank = (p: number) => Math.min(20, Math.max(1, Math.ceil((p / 100) * 20 - 1e-9))) - 1;
    SPREAD_PERCENTILES.forEach((p, j) => expect(relErr(b.q[j], times[rank(p)]), `p ${p}`).toBeLessThan(1e-12));
    expect(doc.models[0].spread!.description).toMatch(
      /^20 samples of H0, Omega_m from c\.csv \(sha256 [0-9a-f]{12}\)$/,
    );
  });
});

describe("building blocks at their edges", () => {
  it("Kish's effective size: (sum w)^2 / sum w^2, n for equal weights, 0 for none", () => {
    // Weights 1, 2, 1: 16 / 6 (Kish 1965).
    expect(effectiveSampleSize(Float64Array.of(1, 2, 1), 3)).toBeCloseTo(16 / 6, 14);
    expect(effectiveSampleSize(null, 7)).toBe(7);
    expect(effectiveSampleSize(Float64Array.of(0, 0), 2)).toBe(0);
  });

  it("the normal quantile refuses p outside (0, 1); the Cholesky factor refuses a singular matrix", () => {
    for (const p of [0, 1, -0.1, 1.5, Number.NaN]) expect(() => normalQuantile(p), String(p)).toThrow(RangeError);
    // Either side of the central region's edge |p - 1/2| = 0.425 the two rational approximations agree (AS 241).
    for (const p of [0.075, 0.925]) expect(normalQuantile(p + 1e-12) - normalQuantile(p - 1e-12)).toBeGreaterThan(0);
    expect(
      choleskyLower([
        [1, 1],
        [1, 1],
      ]),
    ).toBeNull();
    // A 3 x 3 factor reproduces its matrix (L L^T = C).
    const c = [
      [1, 0.5, -0.2],
      [0.5, 1, 0.3],
      [-0.2, 0.3, 1],
    ];
    const l = choleskyLower(c)!;
    for (let i = 0; i < 3; i++)
      for (let j = 0; j < 3; j++) {
        let s = 0;
        for (let k = 0; k < 3; k++) s += l[i][k] * l[j][k];
        expect(Math.abs(s - c[i][j])).toBeLessThan(1e-15);
      }
  });

  it("FNV-1a of a model id matches the independent script's vectors", () => {
    const fixture = JSON.parse(readFileSync(join(ROOT, "test/fixtures/xoshiro/xoshiro128starstar.json"), "utf8")) as {
      fnv1a32: { text: string; fnv1a32: number }[];
    };
    for (const v of fixture.fnv1a32) expect(fnv1a32(v.text), v.text).toBe(v.fnv1a32);
  });

  it("weighted bands put each quantity's percentiles and errors at its own place", () => {
    // Two quantities over five draws with weights 1, 1, 2, 1, 1: quantity 1 is quantity 0 times 10.
    const P = SPREAD_PERCENTILES.length;
    const job = {
      values: Float64Array.of(5, 50, 3, 30, 1, 10, 4, 40, 2, 20),
      Q: 2,
      accepted: Int32Array.of(0, 1, 2, 3, 4),
      weights: Float64Array.of(1, 1, 2, 1, 1),
      effective: effectiveSampleSize(Float64Array.of(1, 1, 2, 1, 1), 5),
      q_: new Float64Array(2 * P),
      e_: new Float64Array(2 * P),
      missing: new Int32Array(2),
      next: new Int32Array(1),
    };
    computeClaimedBands(job);
    // Sorted 1 (w 2), 2, 3, 4, 5 (w 1 each), cumulative 2, 3, 4, 5, 6 of 6: 2.5 % -> 1; 16 % (0.96) -> 1;
    // 50 % (3) -> 2; 84 % (5.04) -> 5; 97.5 % -> 5.
    expect([...job.q_.subarray(0, P)]).toEqual([1, 1, 2, 5, 5]);
    expect([...job.q_.subarray(P, 2 * P)]).toEqual([10, 10, 20, 50, 50]);
    for (let j = 0; j < P; j++) expect(job.e_[P + j]).toBeCloseTo(10 * job.e_[j], 12);
    expect(job.e_.subarray(0, P).some((e) => e > 0)).toBe(true);
  });
});
