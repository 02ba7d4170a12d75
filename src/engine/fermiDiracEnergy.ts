import { integrateScalar } from "./gaussKronrod.js";

/** F(0) = int_0^inf x^3 / (e^x + 1) dx = 7 pi^4 / 120 (Fermi-Dirac integral; e.g. Kolb & Turner 1990, ch. 3). */
export const FD_ENERGY_MASSLESS = (7 * Math.PI ** 4) / 120;
/** int_0^inf x^2 / (e^x + 1) dx = 3 zeta(3) / 2: the non-relativistic number-density integral. */
export const FD_NUMBER = 1.5 * 1.2020569031595942;
const ZETA5 = 1.0369277551433699;
const ZETA7 = 1.0083492773819228;

// Table range in ln y; outside it the small-y series and the large-y expansion are exact to better than 1e-11.
const LN_Y_MIN = Math.log(1e-3);
const LN_Y_MAX = Math.log(1e3);
/**
 * Step of the tables in ln y (energy, pressure, matter-like part): the cubic Hermite error scales as STEP^4, and at 0.02 it reached 2.4e-10 near
 * y = 3 (mpmath fixture test/fixtures/mpmath/neutrinoMatter.json); at 0.01 it is below 2e-11.
 */
const STEP = 0.01;

/** F(y) = int_0^inf x^2 sqrt(x^2 + y^2) / (e^x + 1) dx by adaptive quadrature (the energy density of one fermion species). */
export function fermiDiracEnergyIntegral(y: number): number {
  // 1/(e^x + 1) written as e^-x / (1 + e^-x); beyond x = 60 the integrand is below 1e-20 of the integral.
  return integrateScalar(
    (x) => {
      const e = Math.exp(-x);
      return (x * x * Math.sqrt(x * x + y * y) * e) / (1 + e);
    },
    0,
    60,
    1e-12,
  ).value;
}

/** dF/dy = int_0^inf x^2 y / sqrt(x^2 + y^2) / (e^x + 1) dx. */
function fermiDiracEnergySlope(y: number): number {
  return integrateScalar(
    (x) => {
      const e = Math.exp(-x);
      return (x * x * y * e) / (Math.sqrt(x * x + y * y) * (1 + e));
    },
    0,
    60,
    1e-12,
  ).value;
}

/**
 * P(y) = int_0^inf x^4 / sqrt(x^2 + y^2) / (e^x + 1) dx: three times the pressure of one fermion species in the
 * units of F (3p = P, rho = F; Kolb & Turner 1990, ch. 3), so 3p/rho = P/F exactly, without differentiating F.
 */
export function fermiDiracPressureIntegral(y: number): number {
  return integrateScalar(
    (x) => {
      const e = Math.exp(-x);
      return (x * x * x * x * e) / (Math.sqrt(x * x + y * y) * (1 + e));
    },
    0,
    60,
    1e-12,
  ).value;
}

/** dP/dy = -int_0^inf x^4 y / (x^2 + y^2)^(3/2) / (e^x + 1) dx. */
function fermiDiracPressureSlope(y: number): number {
  return -integrateScalar(
    (x) => {
      const e = Math.exp(-x);
      const E2 = x * x + y * y;
      return (x * x * x * x * y * e) / (E2 * Math.sqrt(E2) * (1 + e));
    },
    0,
    60,
    1e-12,
  ).value;
}

/** A quantity tabulated in ln y: ln(X/F(0)) and d ln X / d ln y at every node of the grid (cubic Hermite nodes). */
interface LogTable {
  value: Float64Array;
  slope: Float64Array;
}

/** Tabulates ln(X(y)/F(0)) and its log-slope y X'(y) / X(y) from the exact integrals, once (on first use). */
function logTable(integral: (y: number) => number, derivative: (y: number) => number): LogTable {
  const n = Math.round((LN_Y_MAX - LN_Y_MIN) / STEP) + 1;
  const value = new Float64Array(n);
  const slope = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const y = Math.exp(LN_Y_MIN + i * STEP);
    const x = integral(y);
    value[i] = Math.log(x / FD_ENERGY_MASSLESS);
    slope[i] = (y * derivative(y)) / x;
  }
  return { value, slope };
}

/** The cubic Hermite interpolant of a table at lnY, inside the table's range. */
function hermite(table: LogTable, lnY: number): number {
  const { value, slope } = table;
  const t = (lnY - LN_Y_MIN) / STEP;
  const i = Math.min(Math.floor(t), value.length - 2);
  const s = t - i;
  const s2 = s * s;
  const s3 = s2 * s;
  return (
    (2 * s3 - 3 * s2 + 1) * value[i] +
    (s3 - 2 * s2 + s) * STEP * slope[i] +
    (-2 * s3 + 3 * s2) * value[i + 1] +
    (s3 - s2) * STEP * slope[i + 1]
  );
}

let energyTable: LogTable | null = null;
let pressureTable: LogTable | null = null;
let matterTable: LogTable | null = null;

/**
 * ln(P(y)/F(0)): the pressure (times 3) of a massive species over the energy density of a massless one at the same
 * temperature. Cubic Hermite interpolation in ln y of the exact integral, as for the energy; series P = F(0)
 * (1 - 5 y^2 / (7 pi^2)) below y = 1e-3 and P = (45 zeta(5)/2)/y - (2835 zeta(7)/8)/y^3 above 1e3
 * (int x^(s-1)/(e^x + 1) dx = (1 - 2^(1-s)) Gamma(s) zeta(s)).
 */
export function lnPressureRatio(lnY: number): number {
  if (lnY <= LN_Y_MIN) {
    const y = Math.exp(lnY);
    return Math.log1p(-SMALL * y * y);
  }
  if (lnY >= LN_Y_MAX) {
    const iy2 = Math.exp(-2 * lnY);
    return -lnY + Math.log(22.5 * ZETA5 - iy2 * 354.375 * ZETA7) - Math.log(FD_ENERGY_MASSLESS);
  }
  pressureTable ??= logTable(fermiDiracPressureIntegral, fermiDiracPressureSlope);
  return hermite(pressureTable, lnY);
}

const SMALL = 5 / (7 * Math.PI ** 2); // F(y) = F(0) (1 + 5 y^2 / (7 pi^2) + O(y^4 ln y))

/**
 * ln R(y) with R = F(y)/F(0) = rho(massive) / rho(massless) at the same temperature, as a function of ln y,
 * y = m c^2 / (k T_nu). Cubic Hermite interpolation in ln y of the exact integral (relative error below 1e-9,
 * tested); series in y below 1e-3 and the expansion F = (3 zeta(3)/2) y + (45 zeta(5)/4)/(2 y) - ... above 1e3.
 */
export function lnEnergyRatio(lnY: number): number {
  if (lnY <= LN_Y_MIN) {
    const y = Math.exp(lnY);
    return Math.log1p(SMALL * y * y);
  }
  if (lnY >= LN_Y_MAX) {
    const iy2 = Math.exp(-2 * lnY);
    return (
      lnY + Math.log(FD_NUMBER + iy2 * (11.25 * ZETA5 - (iy2 * (708.75 * ZETA7)) / 8)) - Math.log(FD_ENERGY_MASSLESS)
    );
  }
  energyTable ??= logTable(fermiDiracEnergyIntegral, fermiDiracEnergySlope);
  return hermite(energyTable, lnY);
}

/**
 * d ln R / d ln y: 0 for a relativistic species, 1 once non-relativistic. The equation of state of the species is
 * w = (1 - G/1) / 3 ... precisely 1 + 3w = 2 - G, from rho ~ a^-4 R(y) and d ln rho / d ln a = -3 (1 + w).
 */
export function energyRatioSlope(lnY: number): number {
  if (lnY <= LN_Y_MIN) {
    const y2 = Math.exp(2 * lnY);
    return (2 * SMALL * y2) / (1 + SMALL * y2);
  }
  if (lnY >= LN_Y_MAX) {
    const iy2 = Math.exp(-2 * lnY);
    const F = FD_NUMBER + iy2 * (11.25 * ZETA5 - (iy2 * (708.75 * ZETA7)) / 8);
    const yFp = FD_NUMBER - iy2 * (11.25 * ZETA5 - (iy2 * (3 * 708.75 * ZETA7)) / 8);
    return yFp / F;
  }
  energyTable ??= logTable(fermiDiracEnergyIntegral, fermiDiracEnergySlope);
  const { value: lnR, slope } = energyTable;
  const t = (lnY - LN_Y_MIN) / STEP;
  const i = Math.min(Math.floor(t), lnR.length - 2);
  const s = t - i;
  const s2 = s * s;
  // Derivative of the Hermite cubic with respect to ln y.
  return (
    ((6 * s2 - 6 * s) * lnR[i] + (-6 * s2 + 6 * s) * lnR[i + 1]) / STEP +
    (3 * s2 - 4 * s + 1) * slope[i] +
    (3 * s2 - 2 * s) * slope[i + 1]
  );
}

/** M(y) = F - P = int_0^inf x^2 y^2 / sqrt(x^2 + y^2) / (e^x + 1) dx: the rho - 3p of one species (F - P written as one integrand). */
export function fermiDiracMatterIntegral(y: number): number {
  return integrateScalar(
    (x) => {
      const e = Math.exp(-x);
      return (x * x * y * y * e) / (Math.sqrt(x * x + y * y) * (1 + e));
    },
    0,
    60,
    1e-12,
  ).value;
}

/** dM/dy = int_0^inf x^2 y (2 x^2 + y^2) / (x^2 + y^2)^(3/2) / (e^x + 1) dx. */
function fermiDiracMatterSlope(y: number): number {
  return integrateScalar(
    (x) => {
      const e = Math.exp(-x);
      const E2 = x * x + y * y;
      return (x * x * y * (2 * x * x + y * y) * e) / (E2 * Math.sqrt(E2) * (1 + e));
    },
    0,
    60,
    1e-12,
  ).value;
}

/** int_0^inf x / (e^x + 1) dx = pi^2 / 12: M(y) = (pi^2/12) y^2 (1 + O(y^2 ln y)) for small y. */
const MATTER_SMALL = Math.PI ** 2 / 12;

/**
 * ln(M(y)/F(0)), M = F - P the matter-like (rho - 3p) part of a massive species, from its own integrand: where the
 * species is still mostly relativistic, rho - 3p is a small difference of two large numbers, and the difference of
 * two interpolated tables would lose its digits. Cubic Hermite interpolation in ln y of the exact integral; series
 * (pi^2/12) y^2 below y = 1e-3 and (3 zeta(3)/2) y - (45 zeta(5)/4)/y + (8505 zeta(7)/32)/y^3 above 1e3 (the
 * expansions of F and P above).
 */
export function lnMatterRatio(lnY: number): number {
  if (lnY <= LN_Y_MIN) return Math.log(MATTER_SMALL / FD_ENERGY_MASSLESS) + 2 * lnY;
  if (lnY >= LN_Y_MAX) {
    const iy2 = Math.exp(-2 * lnY);
    return lnY + Math.log(FD_NUMBER - iy2 * (11.25 * ZETA5 - iy2 * 265.78125 * ZETA7)) - Math.log(FD_ENERGY_MASSLESS);
  }
  matterTable ??= logTable(fermiDiracMatterIntegral, fermiDiracMatterSlope);
  return hermite(matterTable, lnY);
}
