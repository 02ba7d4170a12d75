// A spread of sigma8 alone: sigma8(z), f sigma8 and S8 are sigma8 times quantities that do not depend on it
// (D(z), f(z) D(z), (Omega_m/0.3)^(1/2)), and a percentile commutes with multiplication by a positive constant
// (order statistics keep their order), so every band of them is the sigma8 band times that constant, exactly up
// to rounding. The background bands do not move at all.
import { describe, expect, it } from "vitest";
import { computeScenario } from "../helpers/computeScenario.js";

describe("a spread of sigma8", () => {
  it("scales the bands of sigma8(z), f sigma8 and S8 by their sigma8-free factors and leaves the background alone", () => {
    const doc = computeScenario(`title: t
redshifts: [0.5, 1.5]
draws: { count: 400, seed: 11 }
models:
  - { id: m, H0: 68, Omega_m: 0.31, sigma8: 0.8, spread: { normal: { sigma8: 0.02 } } }
`);
    const m = doc.models[0];
    const s = m.spread!;
    const S8 = s.summary.S8!;
    const factor = Math.sqrt(0.31 / 0.3);
    // The sigma8 percentiles themselves, read back from S8 = sigma8 (Omega_m/0.3)^(1/2) (Hildebrandt et al. 2017).
    const sigma8q = S8.q.map((q) => q / factor);
    // The median of 400 normal draws of sd 0.02 lies within a few Monte Carlo errors of the centre.
    expect(Math.abs(sigma8q[2] - 0.8)).toBeLessThan(0.004);
    m.redshifts.forEach((row, i) => {
      const band = s.redshifts[i];
      const D = row.growth_factor as number;
      const f = row.growth_rate as number;
      band.sigma8_z!.q.forEach((q, j) => expect(Math.abs(q / (sigma8q[j] * D) - 1)).toBeLessThan(1e-12));
      band.f_sigma8!.q.forEach((q, j) => expect(Math.abs(q / (sigma8q[j] * f * D) - 1)).toBeLessThan(1e-12));
      // Distances and the growth itself do not depend on sigma8: no spread at all (the draws' road equals the
      // model's to 1e-12, test/spread/centralDraw.test.ts).
      for (const key of ["luminosity_distance_Mpc", "growth_factor", "growth_rate"] as const)
        for (const q of band[key]!.q) expect(Math.abs(q / (row[key] as number) - 1)).toBeLessThan(1e-12);
    });
  });
});
