// Each shortcut of the fast paths tested where it acts: the one-rule Gauss panels of the draws' past integrals
// (panels just narrow enough for the 7-point rule, and for the 4-point rule) against the adaptive 1e-13 panels, and
// the scans that skip grid points proven not to hold a sign change against plain scans of every grid point, on
// models built to sit next to a sign change. Closed forms named beside each check.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import {
  accelerationOnsetRedshift,
  matterDarkEnergyEqualityRedshift,
  pastIntegrals,
  type BackgroundModel,
} from "../../src/engine/index.js";
import { NARROW_PANEL, VERY_NARROW_PANEL } from "../../src/engine/pastIntegrals.js";
import { decelerationSource } from "../../src/engine/decelerationParameter.js";
import { firstNonPositive } from "../../src/engine/scanForSign.js";
import { brentRoot } from "../../src/engine/brentRoot.js";
import { modelOf, relErr } from "../helpers/modelOf.js";

// A fixed seed, printed, so that a failure can be replayed exactly (fast-check's documented configureGlobal).
const SEED = 250_025;
console.log(`fast-check seed ${SEED} (test/engine/drawShortcuts.test.ts)`);

/** Redshifts whose panels in s = sqrt(a) = (1+z)^-1/2 are each `relative` wide (relative to their lower end). */
function panelsOf(relative: number, count: number): Float64Array {
  const z = new Float64Array(count);
  for (let k = 1; k <= count; k++) z[k - 1] = (1 + relative) ** (2 * k) - 1; // s_k = (1 + r)^-k
  return z;
}

const MODELS: [string, BackgroundModel][] = [
  ["flat Lambda-CDM with radiation", modelOf({ Om: 0.31, Or: 9e-5 })],
  ["closed CPL", modelOf({ Om: 0.35, Ok: -0.05, w0: -0.85, wa: -0.6, Or: 8e-5 })],
  ["open phantom", modelOf({ Om: 0.25, Ok: 0.08, w0: -1.3, wa: 0.2 })],
];

describe("one Gauss rule per narrow panel (the draws' past integrals)", () => {
  for (const [rule, relative] of [
    ["7-point", NARROW_PANEL * 0.95],
    ["4-point", VERY_NARROW_PANEL * 0.95],
  ] as const) {
    it(`panels just narrow enough for the ${rule} rule agree with adaptive 1e-13 panels to 2e-13`, () => {
      // The panels are wider than the 4-point rule's limit (7-point case) or just under it (4-point case), so each
      // rule is the one used; a lower-order rule there errs by about (width/2s)^(2m): 1e-11 for 4 points on the
      // 7-point panels, 4e-12 for 3 points on the 4-point panels (Gauss-Legendre error; Abramowitz & Stegun 25.4.30).
      const z = panelsOf(relative, rule === "7-point" ? 40 : 120);
      for (const [name, model] of MODELS) {
        const fast = pastIntegrals(model, z, { narrowPanelsByGauss: true });
        const careful = pastIntegrals(model, z);
        for (let i = 0; i < z.length; i++) {
          expect(relErr(fast.lookback[i], careful.lookback[i]), `${name} lookback z = ${z[i]}`).toBeLessThan(2e-13);
          expect(relErr(fast.comoving[i], careful.comoving[i]), `${name} D_C z = ${z[i]}`).toBeLessThan(2e-13);
        }
      }
    });
  }
});

/** The acceleration onset by a plain scan of every grid point (no skipping), on the engine's own source term. */
function plainAccelerationOnset(model: BackgroundModel): number | null {
  if (!(decelerationSource(model, 1) < 0)) return null;
  const g = (u: number) => -decelerationSource(model, Math.exp(u));
  const u = firstNonPositive(g, 0, -12, 0.005) ?? firstNonPositive(g, -12, -170, 0.05);
  return u === null ? null : Math.expm1(-u);
}

/**
 * Matter-dark energy equality without neutrinos by a plain scan outward from today in both directions, on the closed
 * form ln(rho_de / rho_m) = ln(Ode/Om) - 3 (w0 + wa) u - 3 wa (1 - e^u) (CPL, Chevallier & Polarski 2001).
 */
function plainEquality(Om: number, Ode: number, w0: number, wa: number): number | null {
  const h = (u: number) => Math.log(Ode / Om) - 3 * (w0 + wa) * u - 3 * wa * (1 - Math.exp(u));
  if (h(0) === 0) return 0;
  for (let i = 1; i * 0.005 <= 30; i++) {
    for (const dir of [-1, 1]) {
      const u0 = dir * (i - 1) * 0.005;
      const u1 = dir * i * 0.005;
      if (h(u0) > 0 !== h(u1) > 0 || h(u1) === 0) return Math.expm1(-brentRoot(h, u0, u1, 0));
    }
  }
  return null;
}

describe("scans that skip proven points find what a plain scan finds", () => {
  it("acceleration onset next to today, and for random constant-w and CPL models", () => {
    // Flat Lambda-CDM without radiation: 1 + z_acc = (2 Ode / Om)^(1/3) (closed form from q = 0); at 2 Ode / Om just
    // above 1 the onset lies inside the first grid step.
    for (const excess of [1e-6, 1e-4, 0.02]) {
      const Om = 2 / (3 + excess);
      const model = modelOf({ Om, Ode: 1 - Om });
      const expected = Math.cbrt((2 * (1 - Om)) / Om) - 1;
      expect(Math.abs(accelerationOnsetRedshift(model)! - expected), `excess ${excess}`).toBeLessThan(1e-12);
      expect(accelerationOnsetRedshift(model)).toBe(plainAccelerationOnset(model));
    }
    fc.assert(
      fc.property(
        fc.double({ min: 0.05, max: 0.6, noNaN: true }),
        fc.double({ min: -0.1, max: 0.1, noNaN: true }),
        fc.double({ min: -1.6, max: -0.5, noNaN: true }),
        fc.double({ min: -1, max: 0.5, noNaN: true }),
        fc.constantFrom(0, 8e-5),
        (Om, Ok, w0, wa, Or) => {
          const model = modelOf({ Om, Ok, w0, wa, Or });
          expect(accelerationOnsetRedshift(model)).toBe(plainAccelerationOnset(model));
          const constant = modelOf({ Om, Ok, w0, Or });
          expect(accelerationOnsetRedshift(constant)).toBe(plainAccelerationOnset(constant));
        },
      ),
      { seed: SEED, numRuns: 200 },
    );
  });

  it("matter-dark energy equality, past and future, with crossings placed next to grid points", () => {
    // Constant w: rho_de / rho_m = (Ode/Om) a^(-3w), equal at a = (Om/Ode)^(-1/(3w)) (closed form).
    for (const [Om, w0] of [
      [0.3, -1],
      [0.7, -1],
      [0.5 * (1 + 1e-9), -1],
      [0.3, -0.6],
    ]) {
      const Ode = 1 - Om;
      const expected = (Om / Ode) ** (1 / (3 * w0)) - 1;
      const got = matterDarkEnergyEqualityRedshift(modelOf({ Om, Ode, w0 }))!;
      expect(Math.abs(got - expected), `Om ${Om} w0 ${w0}`).toBeLessThan(1e-12 * Math.max(1, Math.abs(expected)));
    }
    fc.assert(
      fc.property(
        fc.double({ min: 0.05, max: 0.95, noNaN: true }),
        fc.double({ min: -1.8, max: -0.4, noNaN: true }),
        fc.double({ min: -2, max: 1.5, noNaN: true }),
        (Om, w0, wa) => {
          const Ode = 1 - Om;
          const plain = plainEquality(Om, Ode, w0, wa);
          const got = matterDarkEnergyEqualityRedshift(modelOf({ Om, Ode, w0, wa }));
          if (plain === null) expect(got).toBeNull();
          else expect(Math.abs(got! - plain)).toBeLessThan(1e-10 * Math.max(1, Math.abs(plain)));
        },
      ),
      { seed: SEED, numRuns: 300 },
    );
  });
});
