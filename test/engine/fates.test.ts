// Every fate of the documented set (README, "Fates"), one test each, and the big rip against a closed form and an
// independent mpmath integral.
import { describe, expect, it } from "vitest";
import betainc from "@stdlib/math-base-special-betainc";
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { backgroundSummary } from "../../src/engine/index.js";
import { modelOf, relErr } from "../helpers/modelOf.js";
import { hubbleTimeGyr } from "../helpers/referenceScales.js";

const fateOf = (p: Parameters<typeof modelOf>[0]) => backgroundSummary(modelOf(p)).summary;

describe("the fate of every model is one of a complete set, decided from the dominant term as a -> infinity", () => {
  it("expands_decelerating: flat, matter only (E^2 = a^-3 forever; Einstein-de Sitter)", () => {
    const s = fateOf({ Om: 1, Ode: 0 });
    expect(s.fate).toBe("expands_decelerating");
    expect(s.time_to_rip_Gyr).toBeNull();
  });
  it("coasts: open, no dark energy (curvature a^-2 dominates late; H a -> constant)", () => {
    expect(fateOf({ Om: 0.3, Ok: 0.7, Ode: 0 }).fate).toBe("coasts");
    // w = -1/3 dark energy also scales as a^-2 (CPL with wa = 0: rho ~ a^(-3(1+w))).
    expect(fateOf({ Om: 0.3, Ode: 0.7, w0: -1 / 3 }).fate).toBe("coasts");
  });
  it("expands_accelerating: a cosmological constant, or w between -1 and -1/3", () => {
    expect(fateOf({ Om: 0.3, Ode: 0.7 }).fate).toBe("expands_accelerating");
    expect(fateOf({ Om: 0.3, Ode: 0.7, w0: -0.8 }).fate).toBe("expands_accelerating");
    // CPL with wa < 0: the dark energy decays late (w -> +infinity) and matter takes over again.
    expect(fateOf({ Om: 0.3, Ode: 0.7, w0: -0.9, wa: -0.5 }).fate).toBe("expands_decelerating");
  });
  it("big_rip: constant w < -1, and any CPL with wa > 0 and positive dark energy", () => {
    expect(fateOf({ Om: 0.3, Ode: 0.7, w0: -1.2 }).fate).toBe("big_rip");
    expect(fateOf({ Om: 0.3, Ode: 0.7, w0: -1, wa: 0.3 }).fate).toBe("big_rip");
  });
  it("the rip boundary is w = -1 exactly: w = -1.05 and -1.01 rip, w = -0.95 and -0.99 do not", () => {
    // Constant w: rho_de ~ a^(-3(1+w)) grows without bound for any w < -1 (common practice; Caldwell, Kamionkowski &
    // Weinberg 2003, recalled from memory), so the boundary is -1 itself, not some w further below it.
    for (const w0 of [-1.05, -1.01]) {
      const s = fateOf({ Om: 0.3, Ode: 0.7, w0 });
      expect(s.fate, `w0 = ${w0}`).toBe("big_rip");
      expect(s.time_to_rip_Gyr, `w0 = ${w0}`).toBeGreaterThan(0);
    }
    for (const w0 of [-0.95, -0.99]) {
      const s = fateOf({ Om: 0.3, Ode: 0.7, w0 });
      expect(s.fate, `w0 = ${w0}`).toBe("expands_accelerating");
      expect(s.time_to_rip_Gyr, `w0 = ${w0}`).toBeNull();
    }
    // CPL: w(a) = w0 + wa (1 - a) tends to -infinity for wa > 0 however small (a rip, late), and to +infinity for
    // wa < 0 (no rip, even from a phantom w0).
    expect(fateOf({ Om: 0.3, Ode: 0.7, w0: -0.9, wa: 0.02 }).fate).toBe("big_rip");
    expect(fateOf({ Om: 0.3, Ode: 0.7, w0: -1.05, wa: -0.02 }).fate).not.toBe("big_rip");
  });
  it("recollapses: closed with matter only, and negative dark energy; a crunch at a finite time", () => {
    const closed = fateOf({ Om: 2, Ode: 0 });
    expect(closed.fate).toBe("recollapses");
    expect(closed.crunch_time_Gyr).not.toBeNull();
    expect(fateOf({ Om: 0.3, Ode: -0.1 }).fate).toBe("recollapses");
    // Negative dark energy that grows (w < -1) also ends in a crunch, not a rip.
    expect(fateOf({ Om: 0.3, Ode: -0.1, w0: -1.5 }).fate).toBe("recollapses");
  });
});

describe("the time to a big rip", () => {
  it("flat matter + constant w < -1: the incomplete-beta closed form of the Friedmann integral", () => {
    // t_rip - t_0 = int_1^inf da / (a H) = t_H int a^(3/2) (da/a) / sqrt(Om (1+u)) with u = (Ode/Om) a^(-3w); then
    // v = 1/(1+u): t_H (3|w|)^-1 Om^-1/2 (Om/Ode)^s B(Om; 1/2 - s, s), s = 1/(2|w|) (derived here from the
    // Friedmann equation; the leading behaviour (2/3)|1+w|^-1 t_H (1-Om)^-1/2 is Caldwell, Kamionkowski &
    // Weinberg 2003, PRL 91, 071301, recalled from memory).
    for (const [Om, w] of [
      [0.3, -1.5],
      [0.3, -1.15],
      [0.3, -1.05],
      [0.3, -1.01],
      [0.25, -2],
    ]) {
      const Ode = 1 - Om;
      const s = 1 / (2 * Math.abs(w));
      const B = betainc(Om, 0.5 - s, s, false, false);
      const expected = (hubbleTimeGyr(70) / (3 * Math.abs(w) * Math.sqrt(Om))) * (Om / Ode) ** s * B;
      const got = fateOf({ Om, Ode, w0: w }).time_to_rip_Gyr!;
      expect(relErr(got, expected)).toBeLessThan(1e-10);
      // The approximation of Caldwell et al. is within a few percent where dark energy already dominates.
      const approx = ((2 / 3) * hubbleTimeGyr(70)) / (Math.abs(1 + w) * Math.sqrt(1 - Om));
      expect(relErr(got, approx)).toBeLessThan(0.1);
    }
  });

  it("CPL and curved phantom models against mpmath integrals (test/fixtures/mpmath/fates.py)", () => {
    const fixture = JSON.parse(readFileSync(join(import.meta.dirname, "../fixtures/mpmath/fates.json"), "utf8"));
    for (const m of fixture.models) {
      const s = fateOf({
        H0: m.H0,
        Om: Number(m.Omega_m),
        Or: Number(m.Omega_r),
        Ok: Number(m.Omega_k),
        w0: Number(m.w0),
        wa: Number(m.wa),
      });
      expect(s.fate, m.id).toBe("big_rip");
      expect(relErr(s.time_to_rip_Gyr!, Number(m.time_to_rip_Gyr)), m.id).toBeLessThan(1e-10);
      expect(relErr(s.rip_time_Gyr!, Number(m.rip_time_Gyr)), m.id).toBeLessThan(1e-10);
    }
  });
});
