import type { BackgroundModel } from "./backgroundModel.js";
import { expansionRateSquared } from "./expansionRateSquared.js";
import { dominantTermLate } from "./dominantTerm.js";
import { borrowIntegrator, releaseIntegrator, type GaussKronrodIntegrator } from "./gaussKronrod.js";
import { PANEL_REL_TOL } from "./pastIntegrals.js";
import { energyRatioSlope, lnEnergyRatio } from "./fermiDiracEnergy.js";

/** Integrals from today to the future, in units of t_H and D_H. */
export interface FutureIntegrals {
  /** int_1^a_end da/(a E): time from now to maximum expansion (Infinity when the model expands forever). */
  readonly timeToTurnaround: number;
  /** int_1^a_end da/(a^2 E): comoving distance light covers until maximum expansion, or until t -> infinity. */
  readonly conformalToTurnaround: number;
  /**
   * int_1^inf da/(a E): time from now until the scale factor diverges. Finite only for a big rip (dark energy whose
   * density grows without bound: E^2 ~ a^-p late with p < 0, or CPL with wa > 0); Infinity otherwise.
   */
  readonly timeToRip: number;
}

/**
 * Future integrals. Expanding forever: int_1^inf da/(a^2 E) with u = 1/a and u = v^k, k = 2/(2 - p) where
 * E^2 ~ a^-p late (removes the u^(-p/2) end-point behaviour); finite only when p < 2 (Infinity otherwise).
 * Every end point is handled by a change of variable; the range is never truncated.
 * Recollapse at a_max: [1, a_max/2] in ln a, then [a_max/2, a_max] with a = a_max - v^2, which turns the
 * 1/sqrt(a_max - a) end-point behaviour into a smooth integrand (Friedmann equation near H = 0).
 */
export function futureIntegrals(model: BackgroundModel, maxScaleFactor: number | null): FutureIntegrals {
  const vec = borrowIntegrator(2);
  const one = borrowIntegrator(1);
  try {
    return futureIntegralsWith(vec, one, model, maxScaleFactor);
  } finally {
    releaseIntegrator(vec);
    releaseIntegrator(one);
  }
}

function futureIntegralsWith(
  vec: GaussKronrodIntegrator,
  one: GaussKronrodIntegrator,
  model: BackgroundModel,
  maxScaleFactor: number | null,
): FutureIntegrals {
  const e2 = expansionRateSquared(model);
  const value = new Float64Array(2);
  const error = new Float64Array(2);
  if (maxScaleFactor === null) {
    const late = dominantTermLate(model);
    if (!(late.power < 2)) return { timeToTurnaround: Infinity, conformalToTurnaround: Infinity, timeToRip: Infinity };
    const v1 = new Float64Array(1);
    const err1 = new Float64Array(1);
    if (!Number.isFinite(late.power)) {
      // CPL with wa > 0: E grows faster than any power, so int_0^1 du / E(1/u) has a smooth integrand.
      one.integrate(
        (u, out) => {
          const E2 = e2(1 / u);
          out[0] = Number.isFinite(E2) ? 1 / Math.sqrt(E2) : 0;
        },
        0,
        1,
        PANEL_REL_TOL,
        0,
        v1,
        err1,
      );
      const conformal = v1[0];
      // Time to the rip: int_0^1 du / (u E(1/u)); the integrand vanishes faster than any power as u -> 0.
      one.integrate(
        (u, out) => {
          const E2 = e2(1 / u);
          out[0] = u > 0 && Number.isFinite(E2) ? 1 / (u * Math.sqrt(E2)) : 0;
        },
        0,
        1,
        PANEL_REL_TOL,
        0,
        v1,
        err1,
      );
      return { timeToTurnaround: Infinity, conformalToTurnaround: conformal, timeToRip: v1[0] };
    }
    // Power-law terms only (wa = 0): E^2(1/u) = u^p S(u), S(u) = sum_i c_i u^(p_i - p) -> late coefficient as u -> 0.
    // With u = v^k the integrand du / E = k v^(k - 1 - k p/2) dv / sqrt(S), and k = 2/(2 - p) (p > 0) or 1 (p <= 0)
    // leaves a bounded power of v; S is summed term by term so nothing overflows or underflows.
    const p = late.power;
    const k = p > 0 ? 2 / (2 - p) : 1;
    const vPower = k - 1 - (k * p) / 2;
    const terms: [number, number][] = [
      [model.Omega_r, 4],
      [model.Omega_cb, 3],
      [model.Omega_k, 2],
      [model.Omega_de, 3 * (1 + model.w0)],
    ];
    const live = nonzeroTerms(terms, (pi) => (pi - p) * k);
    one.integrate(
      (v, out) => {
        const lnv = Math.log(v);
        let S = 0;
        for (let i = 0; i < live.c.length; i++) {
          const c = live.c[i];
          const q = live.power[i];
          S += q === 0 ? c : c * Math.exp(q * lnv);
        }
        // Massive neutrinos: Omega_rel u^(4-p) R(y0/u), summed in logarithms.
        for (const nu of model.massiveNeutrinos)
          S += nu.Omega_rel * Math.exp((4 - p) * k * lnv + lnEnergyRatio(nu.lnY0 - k * lnv));
        out[0] = (vPower === 0 ? k : k * Math.exp(vPower * lnv)) / Math.sqrt(S);
      },
      0,
      1,
      PANEL_REL_TOL,
      0,
      v1,
      err1,
    );
    const conformal = v1[0];
    if (!(p < 0)) return { timeToTurnaround: Infinity, conformalToTurnaround: conformal, timeToRip: Infinity };
    // Big rip with a power law (constant w < -1): time int_0^1 du / (u E(1/u)) = int u^(-1 - p/2) du / sqrt(S); with
    // u = v^m, m = -2/p, the integrand m / sqrt(S(v^m)) dv is bounded at v = 0 (Caldwell et al. 2003 for the idea).
    const m = -2 / p;
    const liveT = nonzeroTerms(terms, (pi) => (pi - p) * m);
    one.integrate(
      (v, out) => {
        const lnv = Math.log(v);
        let S = 0;
        for (let i = 0; i < liveT.c.length; i++) {
          const c = liveT.c[i];
          const q = liveT.power[i];
          S += q === 0 ? c : c * Math.exp(q * lnv);
        }
        for (const nu of model.massiveNeutrinos)
          S += nu.Omega_rel * Math.exp((4 - p) * m * lnv + lnEnergyRatio(nu.lnY0 - m * lnv));
        out[0] = m / Math.sqrt(S);
      },
      0,
      1,
      PANEL_REL_TOL,
      0,
      v1,
      err1,
    );
    return { timeToTurnaround: Infinity, conformalToTurnaround: conformal, timeToRip: v1[0] };
  }
  const aMax = maxScaleFactor;
  const e2Below = expansionRateSquaredBelowTurnaround(model, aMax);
  let t = 0;
  let c = 0;
  const aMid = aMax <= 2 ? 1 : aMax / 2;
  if (aMid > 1) {
    vec.integrate(
      (u, out) => {
        const a = Math.exp(u);
        const E = Math.sqrt(e2(a));
        out[0] = 1 / E;
        out[1] = 1 / (a * E);
      },
      0,
      Math.log(aMid),
      PANEL_REL_TOL,
      0,
      value,
      error,
    );
    t += value[0];
    c += value[1];
  }
  vec.integrate(
    (v, out) => {
      const a = aMax - v * v;
      const g = (2 * v) / (a * Math.sqrt(e2Below(v)));
      out[0] = g;
      out[1] = g / a;
    },
    0,
    Math.sqrt(aMax - aMid),
    PANEL_REL_TOL,
    0,
    value,
    error,
  );
  t += value[0];
  c += value[1];
  return { timeToTurnaround: t, conformalToTurnaround: c, timeToRip: Infinity };
}

/**
 * E^2 at a = a_max - v^2 written as E^2(a) - E^2(a_max), term by term with log1p/expm1, so that it keeps full
 * relative precision as v -> 0 instead of cancelling terms of order one (Friedmann equation; E^2(a_max) = 0).
 */
function expansionRateSquaredBelowTurnaround(model: BackgroundModel, aMax: number): (v: number) => number {
  const { Omega_r, Omega_cb, Omega_k, Omega_de, w0, wa } = model;
  const powers: [number, number][] = [
    [Omega_r, 4],
    [Omega_cb, 3],
    [Omega_k, 2],
  ];
  const lnAMax = Math.log(aMax);
  const nus = model.massiveNeutrinos.map((n) => {
    const x = n.lnY0 + lnAMax;
    return { x, atMax: n.Omega_rel * Math.exp(lnEnergyRatio(x) - 4 * lnAMax) };
  });
  const live = nonzeroTerms(
    powers,
    (p) => p,
    (c, p) => c * aMax ** -p,
  );
  const fMax = Omega_de === 0 ? 0 : Omega_de * Math.exp(-3 * (1 + w0 + wa) * Math.log(aMax) - 3 * wa * (1 - aMax));
  return (v) => {
    const v2 = v * v;
    const L = Math.log1p(-v2 / aMax); // ln(a / a_max)
    let sum = 0;
    for (let i = 0; i < live.c.length; i++) sum += live.c[i] * Math.expm1(-live.power[i] * L);
    if (fMax !== 0) sum += fMax * Math.expm1(-3 * (1 + w0 + wa) * L - 3 * wa * v2);
    for (const n of nus) {
      // ln R(x + L) - ln R(x); for tiny L the midpoint slope avoids the cancellation (error O(L^3)).
      const dLnR = Math.abs(L) < 1e-4 ? L * energyRatioSlope(n.x + L / 2) : lnEnergyRatio(n.x + L) - lnEnergyRatio(n.x);
      sum += n.atMax * Math.expm1(-4 * L + dLnR);
    }
    return sum;
  };
}

/**
 * The terms [coefficient, power] with a nonzero coefficient, as two typed arrays (coefficient and power mapped):
 * arrays of pairs took the shape of their numbers (small integers or doubles), and each new shape met by optimised
 * code threw that code away.
 */
function nonzeroTerms(
  terms: readonly (readonly [number, number])[],
  power: (p: number) => number,
  coefficient: (c: number, p: number) => number = (c) => c,
): { c: Float64Array; power: Float64Array } {
  let n = 0;
  for (const [c] of terms) if (c !== 0) n++;
  const out = { c: new Float64Array(n), power: new Float64Array(n) };
  let i = 0;
  for (const [c, p] of terms)
    if (c !== 0) {
      out.c[i] = coefficient(c, p);
      out.power[i++] = power(p);
    }
  return out;
}
