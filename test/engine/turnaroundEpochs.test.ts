// Epochs a recollapsing model never reaches are not reported: a matter-dark energy equality that would lie beyond
// the turnaround is null with a note. Closed forms: with w = -1 and no radiation, rho_de / rho_m = (Ode / Om) a^3,
// so equality is at a_eq = (Om / Ode)^(1/3); the turnaround a_max is the root of E^2(a) = Om a^-3 + Ok a^-2 + Ode.
import { describe, expect, it } from "vitest";
import { backgroundSummary } from "../../src/engine/index.js";
import { modelOf, relErr } from "../helpers/modelOf.js";

/** The turnaround a_max: the first a > 1 where E^2 = Om a^-3 + Ok a^-2 + Ode reaches 0 (bisection, written here). */
function turnaround(Om: number, Ok: number, Ode: number): number {
  const e2 = (a: number) => Om / a ** 3 + Ok / a ** 2 + Ode;
  let lo = 1;
  let hi = 1;
  while (e2(hi) > 0) hi *= 1.01;
  for (let k = 0; k < 200; k++) {
    const mid = (lo + hi) / 2;
    if (e2(mid) > 0) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

describe("future epochs against the turnaround", () => {
  it("an equality beyond the turnaround is null, with a note naming both scale factors", () => {
    const [Om, Ode] = [1.99, 0.005];
    const Ok = 1 - Om - Ode;
    const { summary, warnings } = backgroundSummary(modelOf({ Om, Ode, Ok }));
    const aMax = turnaround(Om, Ok, Ode);
    expect(relErr(summary.max_scale_factor!, aMax)).toBeLessThan(1e-9);
    const aEq = Math.cbrt(Om / Ode);
    expect(aEq).toBeGreaterThan(aMax);
    expect(summary.z_matter_de_equality).toBeNull();
    expect(warnings.join("\n")).toMatch(
      new RegExp(
        `equal densities only at a = ${aEq.toPrecision(6)}, beyond the turnaround at a = ${aMax.toPrecision(6)}`,
      ),
    );
  });

  it("an equality before the turnaround of a recollapsing model, and one ahead of an expanding model, are given", () => {
    // w = -0.2: rho_de / rho_m = (Ode / Om) a^(-3w), equal at a = (Om / Ode)^(1 / (-3w)) = 2.5^(1/0.6) = 4.6; with
    // Om = 1, Ode = 0.4, Ok = -0.4 the expansion turns around later (E^2 = a^-3 + 0.4 a^-2.4 - 0.4 a^-2 = 0 near 5.6).
    const before = backgroundSummary(modelOf({ Om: 1, Ode: 0.4, Ok: -0.4, w0: -0.2 })).summary;
    const aEq = 2.5 ** (1 / 0.6);
    expect(before.max_scale_factor).toBeGreaterThan(aEq);
    expect(relErr(before.z_matter_de_equality!, 1 / aEq - 1)).toBeLessThan(1e-10);
    // Ahead, without a turnaround: Om = 0.8, Ode = 0.2 (flat) reach equality at a = 4^(1/3).
    const ahead = backgroundSummary(modelOf({ Om: 0.8, Ode: 0.2 })).summary;
    expect(ahead.max_scale_factor).toBeNull();
    expect(Math.abs(ahead.z_matter_de_equality! - (1 / Math.cbrt(4) - 1))).toBeLessThan(1e-12);
  });
});

describe("light that wrapped round a closed space", () => {
  it("the antipode warning states the conditioning of D_M there", async () => {
    // Conditioning of D_M = R sin(chi) in chi: d ln D_M / d ln chi = chi cot chi (calculus; common practice).
    const { loadScenario } = await import("../../src/scenario/loadScenario.js");
    const { buildTablesDocument } = await import("../../src/tables/buildTablesDocument.js");
    const doc = buildTablesDocument(
      loadScenario(
        "title: t\nid: t\nredshifts: [1000]\nmodels:\n  - { id: c, H0: 70, Omega_m: 0.3, Omega_k: -0.6, radiation: none }\n",
        "t.yaml",
      ),
      { chartGrid: false },
    );
    const w = doc.models[0].warnings.join("\n");
    expect(w).toMatch(/has passed the antipode/);
    expect(w).toMatch(/multiplied by about \|chi cot chi\| \(chi = D_C\/R\)/);
  });
});
