import type { BackgroundModel } from "./backgroundModel.js";
import { expansionRateSquared } from "./expansionRateSquared.js";
import { GAUSS4, NARROW_PANEL, VERY_NARROW_PANEL } from "./pastIntegrals.js";
import { GAUSS7, QuadratureError } from "./gaussKronrod.js";

/**
 * Linear growth of cold dark matter plus baryons in a smooth FLRW background: dark energy and massive neutrinos do
 * not cluster (scales well inside the horizon and below the neutrino free-streaming scale are meant), baryons fall
 * with the cold dark matter from the start.
 *
 * The growth equation for pressureless matter, (1/a^2) d/dt (a^2 d delta/dt) = 4 pi G rho_cb delta (Peebles 1980,
 * The Large-Scale Structure of the Universe, eq. 10.12), in units of H0 and with P = a^2 E dD/dln a, is the linear
 * system dD/dln a = P / (a^2 E), dP/dln a = (3/2) Omega_cb D / (a E). It is solved in s = sqrt(a), the variable of
 * the past integrals: dD/ds = t P / a^2, dP/ds = (3/2) Omega_cb t D / a with t = 2 / (s E), so that a draw of a
 * spread reuses the past integrals' values of t at their Gauss nodes.
 */
export interface LinearGrowth {
  /** D(z) / D(0), aligned with the input redshifts. */
  readonly D: Float64Array;
  /** P(z) / D(0) = a^2 E dD/dln a / D(0): the growth rate is f = P / (a^2 E D). */
  readonly P: Float64Array;
  /** The growth rate today, f(z = 0). */
  readonly rateToday: number;
}

/** Scale factor where the integration starts: radiation and matter only, to about 1e-12 of E^2, in any model. */
export const GROWTH_START_A = 1e-6;
/**
 * Wider than NARROW_PANEL (and before the highest redshift asked for), before s = LATE_GROWTH_S: 7-node pieces at most
 * this wide relative to their lower end (in s), so s at most doubles per piece; the results agree with pieces of 0.05
 * to 1e-14.
 */
export const EARLY_GROWTH_PANEL = 1;
/** Where the early pieces end: s = 0.1, a = 0.01, deep in the matter era of any model in the verified box. */
export const LATE_GROWTH_S = 0.1;
/** Pieces after LATE_GROWTH_S: at most this wide relative to their lower end (in s). */
export const LATE_GROWTH_PANEL = 0.2;

/**
 * Initial growth rate: the growing mode of matter in a radiation plus matter background, D proportional to
 * 1 + 3y/2 with y = rho_cb / rho_rest (Meszaros 1974, A&A 37, 225), so f = (3y/2) / (1 + 3y/2). Exact when the rest
 * is radiation; without radiation y is infinite and f = 1 (Einstein-de Sitter).
 */
export function meszarosGrowthRate(cbDensity: number, restDensity: number): number {
  if (!(cbDensity > 0)) return 0;
  if (!(restDensity > 0)) return 1;
  const y = cbDensity / restDensity;
  return (1.5 * y) / (1 + 1.5 * y);
}

/** A Gauss-Legendre rule as a collocation (implicit Runge-Kutta) method: nodes c and weights b on [0, 1], matrix A. */
interface Collocation {
  readonly m: number;
  readonly x: readonly number[];
  readonly b: Float64Array;
  readonly A: Float64Array;
}

/**
 * Gauss collocation coefficients A_jk = int_0^{c_j} l_k(tau) d tau, l_k the Lagrange basis on the nodes (Hairer,
 * Norsett & Wanner, Solving ODEs I, section II.7, eq. 7.7), each integral exact by the rule itself mapped to [0, c_j].
 */
function collocation(rule: { nodes: readonly number[]; weights: readonly number[] }): Collocation {
  const m = rule.nodes.length;
  const c = rule.nodes.map((x) => (1 + x) / 2);
  const lagrange = (k: number, tau: number) => {
    let p = 1;
    for (let l = 0; l < m; l++) if (l !== k) p *= (tau - c[l]) / (c[k] - c[l]);
    return p;
  };
  const A = new Float64Array(m * m);
  for (let j = 0; j < m; j++)
    for (let k = 0; k < m; k++) {
      let s = 0;
      for (let q = 0; q < m; q++) s += (rule.weights[q] / 2) * lagrange(k, c[j] * c[q]);
      A[j * m + k] = c[j] * s;
    }
  return { m, x: rule.nodes, b: Float64Array.from(rule.weights, (w) => w / 2), A };
}

const COLLOCATION4 = collocation(GAUSS4);
const COLLOCATION7 = collocation(GAUSS7);

/** Options: the ascending order of the redshifts, and the past integrals' values of t at their Gauss nodes. */
export interface GrowthOptions {
  ascending?: ArrayLike<number>;
  /**
   * Seven slots per panel in ascending order (panel k ends at the k-th smallest redshift): t = 2 / (s E) at the
   * nodes of the Gauss rule the past integrals used on it, or NaN in the first slot when they used none.
   */
  nodeValues?: Float64Array;
}

/** Work space of one integration: the state (D, P), t at the nodes, per-node factors and the stage values. */
interface Work {
  D: number;
  P: number;
  readonly t: Float64Array;
  readonly cu: Float64Array;
  readonly cv: Float64Array;
  readonly Ds: Float64Array;
  readonly Ps: Float64Array;
}

/** Stage iterations at most; the contraction per round is about (h lambda)^2, below 0.1 on every panel used here. */
const MAX_STAGE_ROUNDS = 80;

/**
 * One Gauss collocation step of the linear system from s0 to s0 + h, with t at the nodes in work.t. The stage
 * values D_j = D0 + sum_k A_jk cu_k P_k, P_j = P0 + sum_k A_jk cv_k D_k (cu = h t / a^2, cv = (3/2) Omega_cb h t / a)
 * are found by fixed-point iteration until they no longer change (4 nodes: narrow panels, where each round gains
 * about four digits) or by one linear solve (7 nodes), then D1 = D0 + sum_j b_j cu_j P_j and
 * P1 = P0 + sum_j b_j cv_j D_j.
 */
function collocationStep(rule: Collocation, s0: number, h: number, cb: number, w: Work): void {
  const m = rule.m;
  const A = rule.A;
  const { t, cu, cv, Ds, Ps } = w;
  const D0 = w.D;
  const P0 = w.P;
  const half = h / 2;
  const mid = s0 + half;
  for (let j = 0; j < m; j++) {
    const s = mid + half * rule.x[j];
    const a = s * s;
    const ht = h * t[j];
    cu[j] = ht / (a * a);
    cv[j] = (1.5 * cb * ht) / a;
    Ds[j] = D0;
    Ps[j] = P0;
  }
  if (m === 7) stagesBySolve(A, w, D0, P0);
  else {
    // Block Gauss-Seidel: all D stages from the P stages, then all P stages from the new D stages; each round
    // shrinks the error by about (h lambda)^2.
    for (let j = 0; j < m; j++)
      for (let k = 0; k < m; k++) {
        AU[j * m + k] = A[j * m + k] * cu[k];
        AV[j * m + k] = A[j * m + k] * cv[k];
      }
    for (let round = 0; ; round++) {
      // A model the growth cannot follow to the engine's accuracy (as a quadrature that does not converge): refused
      // like one, never a crash.
      if (round === MAX_STAGE_ROUNDS)
        throw new QuadratureError("the linear growth did not converge on a panel (stage values did not settle)");
      let moved = false;
      for (let j = 0; j < m; j++) {
        let d = D0;
        for (let k = 0; k < m; k++) d += AU[j * m + k] * Ps[k];
        // Settled when no stage moves by more than a few units in the last place (a change of one or two may
        // flip back and forth); the next round would change nothing that counts.
        if (Math.abs(d - Ds[j]) > 4e-16 * Math.abs(d)) moved = true;
        Ds[j] = d;
      }
      for (let j = 0; j < m; j++) {
        let p = P0;
        for (let k = 0; k < m; k++) p += AV[j * m + k] * Ds[k];
        if (Math.abs(p - Ps[j]) > 4e-16 * Math.abs(p)) moved = true;
        Ps[j] = p;
      }
      if (!moved) break;
    }
  }
  let dD = 0;
  let dP = 0;
  for (let j = 0; j < m; j++) {
    dD += rule.b[j] * cu[j] * Ps[j];
    dP += rule.b[j] * cv[j] * Ds[j];
  }
  w.D = D0 + dD;
  w.P = P0 + dP;
  if (!Number.isFinite(w.D) || !Number.isFinite(w.P))
    throw new QuadratureError("the linear growth did not converge on a panel (a stage value is not finite)");
}

const AU = new Float64Array(16);
const AV = new Float64Array(16);
const M7 = new Float64Array(49);
const U7 = new Float64Array(49);
const V7 = new Float64Array(49);

/**
 * The 7 stage values of a wider step solved at once: with U_jk = A_jk cu_k and V_jk = A_jk cv_k,
 * (I - U V) D = D0 1 + P0 U 1 (Gaussian elimination with partial pivoting), then P = P0 1 + V D.
 */
function stagesBySolve(A: Float64Array, w: Work, D0: number, P0: number): void {
  const m = 7;
  const { cu, cv, Ds, Ps } = w;
  for (let j = 0; j < m; j++)
    for (let k = 0; k < m; k++) {
      U7[j * m + k] = A[j * m + k] * cu[k];
      V7[j * m + k] = A[j * m + k] * cv[k];
    }
  for (let j = 0; j < m; j++) {
    let r = D0;
    for (let k = 0; k < m; k++) {
      r += P0 * U7[j * m + k];
      let uv = 0;
      for (let l = 0; l < m; l++) uv += U7[j * m + l] * V7[l * m + k];
      M7[j * m + k] = (j === k ? 1 : 0) - uv;
    }
    Ds[j] = r;
  }
  for (let col = 0; col < m; col++) {
    let pivot = col;
    for (let r = col + 1; r < m; r++) if (Math.abs(M7[r * m + col]) > Math.abs(M7[pivot * m + col])) pivot = r;
    if (pivot !== col) {
      for (let c = 0; c < m; c++) {
        const x = M7[col * m + c];
        M7[col * m + c] = M7[pivot * m + c];
        M7[pivot * m + c] = x;
      }
      const x = Ds[col];
      Ds[col] = Ds[pivot];
      Ds[pivot] = x;
    }
    const d = M7[col * m + col];
    for (let r = col + 1; r < m; r++) {
      const f = M7[r * m + col] / d;
      for (let c = col; c < m; c++) M7[r * m + c] -= f * M7[col * m + c];
      Ds[r] -= f * Ds[col];
    }
  }
  for (let r = m - 1; r >= 0; r--) {
    let x = Ds[r];
    for (let c = r + 1; c < m; c++) x -= M7[r * m + c] * Ds[c];
    Ds[r] = x / M7[r * m + r];
  }
  for (let j = 0; j < m; j++) {
    let p = P0;
    for (let k = 0; k < m; k++) p += V7[j * m + k] * Ds[k];
    Ps[j] = p;
  }
}

/** t = 2 / (s E) at the nodes of a rule on [s0, s0 + h], computed as the past integrand computes it. */
function fillNodes(rule: Collocation, s0: number, h: number, e2: (a: number) => number, t: Float64Array): void {
  const half = h / 2;
  const mid = s0 + half;
  for (let j = 0; j < rule.m; j++) {
    const s = mid + half * rule.x[j];
    t[j] = 2 / (s * Math.sqrt(e2(s * s)));
  }
}

/**
 * From s0 to s1 in 7-node pieces: at most EARLY_GROWTH_PANEL wide (relative to their lower end) while
 * s < LATE_GROWTH_S, where radiation and matter make the solution nearly a power of a, and at most
 * LATE_GROWTH_PANEL wide after it, where curvature and dark energy bend it. Each stretch is split evenly in ln s.
 */
function widePanel(s0: number, s1: number, cb: number, e2: (a: number) => number, w: Work): void {
  const split = Math.min(Math.max(LATE_GROWTH_S, s0), s1);
  evenPieces(s0, split, EARLY_GROWTH_PANEL, cb, e2, w);
  evenPieces(split, s1, LATE_GROWTH_PANEL, cb, e2, w);
}

function evenPieces(s0: number, s1: number, width: number, cb: number, e2: (a: number) => number, w: Work): void {
  if (!(s1 > s0)) return;
  const pieces = Math.max(1, Math.ceil(Math.log(s1 / s0) / Math.log1p(width)));
  const ratio = (s1 / s0) ** (1 / pieces);
  let lo = s0;
  for (let p = 0; p < pieces; p++) {
    const hi = p === pieces - 1 ? s1 : lo * ratio;
    fillNodes(COLLOCATION7, lo, hi - lo, e2, w.t);
    collocationStep(COLLOCATION7, lo, hi - lo, cb, w);
    lo = hi;
  }
}

/**
 * D(z)/D(0) and P(z)/D(0) at each redshift (z >= 0, any order): the growing mode from GROWTH_START_A (or earlier,
 * before the highest redshift), carried panel by panel between consecutive redshifts by Gauss collocation, with the
 * panels and nodes of the past integrals (pastIntegrals.ts): 4 points on a panel at most VERY_NARROW_PANEL wide
 * relative to its lower end, 7 points up to NARROW_PANEL, wider panels split into 7-point pieces (EARLY_GROWTH_PANEL).
 */
export function linearGrowth(
  model: BackgroundModel,
  redshifts: ArrayLike<number>,
  options: GrowthOptions = {},
): LinearGrowth {
  const n = redshifts.length;
  for (let i = 0; i < n; i++)
    if (!(redshifts[i] >= 0) || !Number.isFinite(redshifts[i]))
      throw new RangeError(`redshift must be finite and >= 0, got ${redshifts[i]}`);
  const order =
    options.ascending ?? Uint32Array.from({ length: n }, (_, i) => i).sort((i, j) => redshifts[i] - redshifts[j]);
  const e2 = expansionRateSquared(model);
  const cb = model.Omega_cb;
  const given = options.nodeValues;
  const w: Work = {
    D: 1,
    P: 0,
    t: new Float64Array(7),
    cu: new Float64Array(7),
    cv: new Float64Array(7),
    Ds: new Float64Array(7),
    Ps: new Float64Array(7),
  };

  // The start: the growing mode where only radiation and matter count.
  const sTop = n > 0 ? 1 / Math.sqrt(1 + redshifts[order[n - 1]]) : 1;
  const sStart = Math.min(Math.sqrt(GROWTH_START_A), sTop / 2);
  const aStart = sStart * sStart;
  const E2 = e2(aStart);
  const cbDensity = cb / (aStart * aStart * aStart);
  w.P = aStart * aStart * Math.sqrt(E2) * meszarosGrowthRate(cbDensity, E2 - cbDensity);
  widePanel(sStart, sTop, cb, e2, w);

  const outD = new Float64Array(n);
  const outP = new Float64Array(n);
  // Upward through the redshifts, highest first; panel k lies between the k-th and (k-1)-th smallest (s = 1 for k = 0).
  const panel = (k: number, lo: number, hi: number) => {
    const width = hi - lo;
    if (width <= NARROW_PANEL * lo) {
      const rule = width <= VERY_NARROW_PANEL * lo ? COLLOCATION4 : COLLOCATION7;
      if (given && !Number.isNaN(given[7 * k])) for (let j = 0; j < rule.m; j++) w.t[j] = given[7 * k + j];
      else fillNodes(rule, lo, width, e2, w.t);
      collocationStep(rule, lo, width, cb, w);
    } else widePanel(lo, hi, cb, e2, w);
  };
  let sLow = sTop;
  for (let k = n - 1; k >= 0; k--) {
    const i = order[k];
    const s = 1 / Math.sqrt(1 + redshifts[i]);
    // The panel below (from sLow up to s) is panel k + 1 of the past integrals.
    if (k < n - 1 && s > sLow) panel(k + 1, sLow, s);
    outD[i] = w.D;
    outP[i] = w.P;
    sLow = s;
  }
  if (sLow < 1) panel(0, sLow, 1);

  const D0 = w.D;
  for (let i = 0; i < n; i++) {
    outD[i] /= D0;
    outP[i] /= D0;
  }
  return { D: outD, P: outP, rateToday: w.P / D0 };
}

/** The growth rate f = dln D / dln a = P / (a^2 E D) at redshift z, with E = H/H0 there. */
export function growthRate(P: number, D: number, z: number, E: number): number {
  const onePlusZ = 1 + z;
  return (P * onePlusZ * onePlusZ) / (E * D);
}

/** S8 = sigma8 (Omega_m / 0.3)^(1/2), the combination weak-lensing surveys constrain (Hildebrandt et al. 2017, MNRAS 465, 1454, sec. 6). */
export function s8Parameter(sigma8: number, Omega_m: number): number {
  return sigma8 * Math.sqrt(Omega_m / 0.3);
}
