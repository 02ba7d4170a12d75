import type { BackgroundModel } from "./backgroundModel.js";
import { expansionRateSquared } from "./expansionRateSquared.js";
import { dominantTermEarly } from "./dominantTerm.js";
import { GAUSS7, borrowIntegrator, releaseIntegrator, type GaussKronrodIntegrator } from "./gaussKronrod.js";
import { NeumaierSum } from "./neumaierSum.js";

/** Relative tolerance asked of every panel integral (the engine promises 1e-10 on the results). */
export const PANEL_REL_TOL = 1e-13;

/**
 * The two integrals behind every past-light-cone quantity, in units of the Hubble time t_H = 1/H0 and the Hubble
 * distance D_H = c/H0, aligned with the input redshifts:
 *   lookback   = int_a^1 da / (a E)       comoving = int_a^1 da / (a^2 E)
 *   age        = int_0^a da / (a E)       conformalAge = int_0^a da / (a^2 E)
 * (Hogg 1999, astro-ph/9905116, eqs. 15 and 30). Infinity where an integral from a = 0 diverges.
 */
export interface PastIntegrals {
  readonly lookback: Float64Array;
  readonly comoving: Float64Array;
  readonly age: Float64Array;
  readonly conformalAge: Float64Array;
  /** Age today in t_H (Infinity when a -> 0 only as t -> -infinity). */
  readonly age0: number;
  /** Conformal age today in D_H, i.e. the comoving particle horizon (Infinity when it diverges). */
  readonly conformalAge0: number;
}

/** Whether int_0 da/(a E) and int_0 da/(a^2 E) converge: E^2 ~ a^-p gives integrands a^(p/2 - 1) and a^(p/2 - 2). */
export function earlyIntegralsConverge(model: BackgroundModel): { age: boolean; conformal: boolean } {
  const p = dominantTermEarly(model).power;
  return { age: p > 0, conformal: p > 2 };
}

/**
 * Integrand in s = sqrt(a) (a = s^2, da = 2 s ds), which removes the a^(-1/2) end-point behaviour of a matter era
 * and keeps the radiation era smooth: out[0] = 2 / (s E), out[1] = 2 / (s^3 E).
 */
function pastIntegrand(model: BackgroundModel): (s: number, out: Float64Array) => void {
  const e2 = expansionRateSquared(model);
  return (s, out) => {
    const a = s * s;
    const t = 2 / (s * Math.sqrt(e2(a)));
    out[0] = t;
    out[1] = t / a;
  };
}

/**
 * A panel at most this wide relative to its lower end (in s = sqrt(a)) is one Gauss rule when asked for: the
 * integrands are analytic with no singularity closer than s = 0, so an m-point rule's error is of order
 * (width / 2s)^(2m): below 1e-18 for the 7-point rule here, far below PANEL_REL_TOL.
 */
export const NARROW_PANEL = 0.1;
/** At most this wide (relative), the 4-point rule is enough: (0.015)^8 < 1e-14. */
export const VERY_NARROW_PANEL = 0.03;

/** 4-point Gauss-Legendre rule on [-1, 1] (Abramowitz & Stegun 1964, table 25.4). */
export const GAUSS4 = {
  nodes: [-0.8611363115940526, -0.3399810435848563, 0.3399810435848563, 0.8611363115940526],
  weights: [0.3478548451374538, 0.6521451548625461, 0.6521451548625461, 0.3478548451374538],
} as const;

export interface PastIntegralOptions {
  /**
   * Narrow panels by one Gauss rule (4 or 7 points by width; no error estimate): for spreads, whose draws need no
   * 1e-13 panels.
   */
  narrowPanelsByGauss?: boolean;
  /** The indices of the redshifts in ascending order, when the caller has them already (every draw of a spread). */
  ascending?: ArrayLike<number>;
  /**
   * When given (7 slots per redshift), the integrand's first component t = 2 / (s E) at the nodes of each panel
   * taken by one Gauss rule, panel k (ending at the k-th smallest redshift) in slots 7k..; NaN in slot 7k for a
   * panel integrated adaptively. The linear growth (linearGrowth.ts) reuses them.
   */
  nodeValues?: Float64Array;
}

/**
 * Lookback time, comoving distance, age and conformal age at many redshifts, integrated cumulatively panel to panel
 * between consecutive sorted redshifts (O(N) integrand work). Each panel is adaptive Gauss-Kronrod to PANEL_REL_TOL
 * (or, when asked, one Gauss rule on a narrow panel); the panels are summed with Neumaier compensation. Redshifts
 * must be finite and >= 0; any order.
 */
export function pastIntegrals(
  model: BackgroundModel,
  redshifts: ArrayLike<number>,
  options: PastIntegralOptions = {},
): PastIntegrals {
  const vec = borrowIntegrator(2);
  try {
    // Always a Float64Array inside: callers pass arrays, typed arrays and views, and each new kind of array met by
    // already optimised code would throw that code away.
    return pastIntegralsWith(vec, model, asFloat64Array(redshifts), options);
  } finally {
    releaseIntegrator(vec);
  }
}

/** The same numbers as a Float64Array (itself when it is one). */
export function asFloat64Array(values: ArrayLike<number>): Float64Array {
  return values instanceof Float64Array ? values : Float64Array.from(values);
}

function pastIntegralsWith(
  vec: GaussKronrodIntegrator,
  model: BackgroundModel,
  redshifts: Float64Array,
  options: PastIntegralOptions,
): PastIntegrals {
  const n = redshifts.length;
  let sorted = true;
  for (let i = 0; i < n; i++) {
    const z = redshifts[i];
    if (!(z >= 0) || !Number.isFinite(z)) throw new RangeError(`redshift must be finite and >= 0, got ${z}`);
    if (i > 0 && z < redshifts[i - 1]) sorted = false;
  }
  let order: ArrayLike<number>;
  if (options.ascending) {
    order = options.ascending;
    for (let k = 1; k < n; k++)
      if (!(redshifts[order[k]] >= redshifts[order[k - 1]])) throw new RangeError("the given order is not ascending");
  } else {
    const o = new Uint32Array(n);
    for (let i = 0; i < n; i++) o[i] = i;
    if (!sorted) o.sort((i, j) => redshifts[i] - redshifts[j]);
    order = o;
  }

  const f = pastIntegrand(model);
  const value = new Float64Array(2);
  const error = new Float64Array(2);
  const panelT = new Float64Array(n);
  const panelC = new Float64Array(n);
  const lookback = new Float64Array(n);
  const comoving = new Float64Array(n);
  const age = new Float64Array(n);
  const conformalAge = new Float64Array(n);

  // Panels from s = 1 (today) down to each redshift in turn.
  let sHi = 1;
  const sumT = new NeumaierSum();
  const sumC = new NeumaierSum();
  for (let k = 0; k < n; k++) {
    const i = order[k];
    const s = 1 / Math.sqrt(1 + redshifts[i]);
    if (options.narrowPanelsByGauss && sHi - s <= NARROW_PANEL * s) {
      const half = (sHi - s) / 2;
      const mid = (sHi + s) / 2;
      const rule = sHi - s <= VERY_NARROW_PANEL * s ? GAUSS4 : GAUSS7;
      let t = 0;
      let c = 0;
      const keep = options.nodeValues;
      for (let j = 0; j < rule.nodes.length; j++) {
        f(mid + half * rule.nodes[j], value);
        if (keep) keep[7 * k + j] = value[0];
        t += rule.weights[j] * value[0];
        c += rule.weights[j] * value[1];
      }
      value[0] = t * half;
      value[1] = c * half;
    } else {
      if (options.nodeValues) options.nodeValues[7 * k] = Number.NaN;
      vec.integrate(f, s, sHi, PANEL_REL_TOL, 0, value, error);
    }
    panelT[k] = value[0];
    panelC[k] = value[1];
    sumT.add(value[0]);
    sumC.add(value[1]);
    lookback[i] = sumT.value;
    comoving[i] = sumC.value;
    sHi = s;
  }

  // The base piece from the big bang (s = 0) up to the highest redshift, for the quantities that converge there.
  const converge = earlyIntegralsConverge(model);
  const sLow = sHi;
  let baseT = Infinity;
  let baseC = Infinity;
  if (converge.age && converge.conformal) {
    vec.integrate(f, 0, sLow, PANEL_REL_TOL, 0, value, error);
    baseT = value[0];
    baseC = value[1];
  } else if (converge.age) {
    const one = borrowIntegrator(1);
    const v1 = new Float64Array(1);
    const e1 = new Float64Array(1);
    try {
      one.integrate(
        (s, out) => {
          f(s, value);
          out[0] = value[0];
        },
        0,
        sLow,
        PANEL_REL_TOL,
        0,
        v1,
        e1,
      );
    } finally {
      releaseIntegrator(one);
    }
    baseT = v1[0];
  }
  const upT = new NeumaierSum();
  const upC = new NeumaierSum();
  upT.add(baseT);
  upC.add(baseC);
  for (let k = n - 1; k >= 0; k--) {
    const i = order[k];
    age[i] = Number.isFinite(baseT) ? upT.value : Infinity;
    conformalAge[i] = Number.isFinite(baseC) ? upC.value : Infinity;
    upT.add(panelT[k]);
    upC.add(panelC[k]);
  }
  const age0 = Number.isFinite(baseT) ? upT.value : Infinity;
  const conformalAge0 = Number.isFinite(baseC) ? upC.value : Infinity;
  return { lookback, comoving, age, conformalAge, age0, conformalAge0 };
}
