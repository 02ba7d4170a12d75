import type { BackgroundModel } from "./backgroundModel.js";
import { dominantTermEarly, dominantTermLate } from "./dominantTerm.js";
import { brentRoot } from "./brentRoot.js";
import { positiveReach } from "./scanForSign.js";
import { FD_ENERGY_MASSLESS, FD_NUMBER, lnEnergyRatio } from "./fermiDiracEnergy.js";

// ln a ranges scanned for E^2 = 0. The scan works with E^2 divided by the magnitude of its asymptotically dominant
// term (same sign as E^2), so it neither overflows nor underflows however far it goes.
const LN_A_EARLIEST = -700;
const LN_A_LATEST = 700;
const NEAR = 12;
const STEP_NEAR = 0.005;
const STEP_FAR = 0.05;

interface Scaled {
  /** The terms of a^n E^2 exp(-x a) at a = e^u: radiation, matter, curvature, dark energy, massive neutrinos. */
  terms(u: number, out: Float64Array): void;
  /** ln a beyond which every other term's share of the dominant one only shrinks. */
  settled: number;
  /** The power n of the scaling. */
  power: number;
}

/**
 * a^n E^2(a) exp(-x a), term by term (Friedmann equation; CPL term in log form, Chevallier & Polarski 2001),
 * with n the power of the dominant term and x = 3 wa when a super-exponential CPL term dominates late.
 */
function scaled(model: BackgroundModel, late: boolean): Scaled {
  const { Omega_r: r, Omega_cb: m, Omega_k: k, Omega_de: de, w0, wa } = model;
  const nus = model.massiveNeutrinos;
  const dom = late ? dominantTermLate(model) : dominantTermEarly(model);
  const n = Number.isFinite(dom.power) ? dom.power : 2;
  const x = late && wa > 0 && de !== 0 ? 3 * wa : 0;
  const p = -3 * (1 + w0 + wa);
  const pDe = 3 * (1 + w0 + wa);
  // Power-law terms have monotonic ratios; a CPL term with wa != 0 settles once 3|wa| a is small (early) or
  // large (late) against the power differences.
  let settled = 0;
  if (wa !== 0 && de !== 0) {
    const spread = Math.abs(pDe - n) + 4;
    settled = late ? Math.log(spread / (3 * Math.abs(wa))) : Math.log(0.01 / (3 * Math.abs(wa)));
  }
  return {
    settled,
    power: n,
    terms(u, out) {
      const a = Math.exp(u);
      const xa = x * a;
      out[0] = r === 0 ? 0 : r * Math.exp((n - 4) * u - xa);
      out[1] = m === 0 ? 0 : m * Math.exp((n - 3) * u - xa);
      out[2] = k === 0 ? 0 : k * Math.exp((n - 2) * u - xa);
      out[3] = de === 0 ? 0 : de * Math.exp((p + n) * u - 3 * wa * (1 - a) - xa);
      let nu = 0;
      for (const v of nus) nu += v.Omega_rel * Math.exp((n - 4) * u + lnEnergyRatio(v.lnY0 + u) - xa);
      out[4] = nu;
    },
  };
}

/**
 * First ln a (walking from 0 towards `far`) where E^2 <= 0, refined by Brent's method; null when E^2 stays positive.
 * Grid scan plus bracketed root (common practice). The walk stops early once the dominant term is positive, more
 * than four times all the others together and past the point where their shares can only shrink.
 */
function scanForZero(model: BackgroundModel, far: number): number | null {
  const late = far > 0;
  const s = scaled(model, late);
  const dom = late ? dominantTermLate(model) : dominantTermEarly(model);
  const t = new Float64Array(5);
  const g = (u: number) => {
    s.terms(u, t);
    return t[0] + t[1] + t[2] + t[3] + t[4];
  };
  // Lower bound of the scaled neutrino term when it shares the dominant power: R(y) >= 1 (early, a^-4) and
  // R(y) >= y (3 zeta(3)/2)/F(0) (late, a^-3), since sqrt(x^2 + y^2) >= max(x, y).
  let nuFloor = 0;
  for (const v of model.massiveNeutrinos) {
    if (!late && dom.power === 4) nuFloor += v.Omega_rel;
    if (late && dom.power === 3) nuFloor += v.Omega_rel * (FD_NUMBER / FD_ENERGY_MASSLESS) * Math.exp(v.lnY0);
  }
  const dir = late ? 1 : -1;
  const gridPoint = (i: number) =>
    i * STEP_NEAR <= NEAR ? dir * i * STEP_NEAR : dir * (NEAR + (i - NEAR / STEP_NEAR) * STEP_FAR);
  // Going back in time, grid points where E^2 > 0 is already proven are skipped (see provenBeyond below); the
  // last of them is still evaluated, so a sign change is always bracketed by neighbouring grid points as before.
  const slope = late ? 0 : earlyLogSlopeBound(model, s.power);
  let proven = 0;
  let uPrev = 0;
  for (let i = 1; ; i++) {
    const u = gridPoint(i);
    if (dir * u > dir * far) return null;
    if (dir * gridPoint(i + 1) < dir * proven) continue;
    s.terms(u, t);
    const v = t[0] + t[1] + t[2] + t[3] + t[4];
    if (!(v > 0)) return v === 0 ? u : Number.isNaN(v) ? null : brentRoot(g, uPrev, u, 0);
    uPrev = u;
    if (!late) {
      proven = u + dir * provenBeyond(t, slope);
      if (dir * proven >= dir * far) return null; // positive all the way: no zero ahead
      // Jump close to the last grid point before `proven` (the check above skips the rest one by one).
      const x = dir * proven;
      const before = x <= NEAR ? Math.floor(x / STEP_NEAR) : NEAR / STEP_NEAR + Math.floor((x - NEAR) / STEP_FAR);
      if (before - 3 > i) i = before - 3;
    }
    if (dom.coefficient > 0 && dir * u > dir * s.settled) {
      // E^2 >= (terms of the dominant power, constant in this scaling) - |negative other terms|, and the negative
      // terms' shares only shrink from here: once the first is four times the second, no zero lies ahead.
      let domPart = nuFloor;
      let negative = 0;
      const powers = [4, 3, 2, NaN];
      for (let j = 0; j < 4; j++) {
        const isDom = j < 3 ? powers[j] === dom.power : isDarkEnergyDominant(model, dom.power, late);
        if (isDom) domPart += t[j];
        else if (t[j] < 0) negative -= t[j];
      }
      if (domPart > 4 * negative) return null;
    }
  }
}

/**
 * A bound A on |d ln|term| / d ln a| of every scaled term at a <= 1 going back in time: power terms |n - p|, the CPL
 * term |p_de + n| + 3|wa| (its exponent's slope is p_de + n + 3 wa a), massive neutrinos between |n - 4| and |n - 3|
 * (the slope of ln R(y) lies between 0 and 1; a margin of 0.01 covers its interpolation).
 */
function earlyLogSlopeBound(model: BackgroundModel, n: number): number {
  let A = 0;
  if (model.Omega_r !== 0) A = Math.max(A, Math.abs(n - 4));
  if (model.Omega_cb !== 0) A = Math.max(A, Math.abs(n - 3));
  if (model.Omega_k !== 0) A = Math.max(A, Math.abs(n - 2));
  if (model.Omega_de !== 0) A = Math.max(A, Math.abs(-3 * (1 + model.w0 + model.wa) + n) + 3 * Math.abs(model.wa));
  if (model.massiveNeutrinos.length > 0) A = Math.max(A, Math.abs(n - 4) + 0.01, Math.abs(n - 3) + 0.01);
  return A;
}

/** How far back in ln a from a point E^2 provably stays positive, given its scaled terms there (positiveReach). */
function provenBeyond(t: Float64Array, slope: number): number {
  let P = 0;
  let N = 0;
  for (let j = 0; j < 5; j++) {
    if (t[j] > 0) P += t[j];
    else N -= t[j];
  }
  return positiveReach(P, N, slope);
}

function isDarkEnergyDominant(model: BackgroundModel, power: number, late: boolean): boolean {
  if (model.Omega_de === 0) return false;
  if (late) {
    if (model.wa > 0) return !Number.isFinite(power);
    if (model.wa < 0) return false;
  }
  const p = late ? 3 * (1 + model.w0) : 3 * (1 + model.w0 + model.wa);
  return Math.abs(p - power) <= 1e-12;
}

/**
 * The scale factor a < 1 at which E^2 reaches zero going back in time (the model bounced and has no big bang),
 * or null when E^2 > 0 for all 0 < a <= 1. Friedmann equation: H^2 = H0^2 E^2(a) must stay positive.
 */
export function bounceScaleFactor(model: BackgroundModel): number | null {
  const known = bounceMemo.get(model);
  if (known !== undefined) return known;
  const u = scanForZero(model, LN_A_EARLIEST);
  // E^2 negative as a -> 0 but no zero found above a = e^-700: the turn-around is earlier still.
  const a = u !== null ? Math.exp(u) : dominantTermEarly(model).coefficient < 0 ? Math.exp(LN_A_EARLIEST) : null;
  bounceMemo.set(model, a);
  return a;
}

// Models are immutable, so the scan is done once per model object.
const bounceMemo = new WeakMap<BackgroundModel, number | null>();

/**
 * The scale factor a > 1 at which E^2 reaches zero in the future (maximum expansion before a recollapse),
 * or null when the model expands forever. Friedmann equation: expansion halts where H^2 = 0.
 */
export function maximumScaleFactor(model: BackgroundModel): number | null {
  const u = scanForZero(model, LN_A_LATEST);
  if (u !== null) return Math.exp(u);
  if (dominantTermLate(model).coefficient < 0) {
    throw new RangeError("E^2 turns negative only beyond a = e^700, outside the range this engine can follow");
  }
  return null;
}
