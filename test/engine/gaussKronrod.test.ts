import { describe, expect, it } from "vitest";
import { GaussKronrodIntegrator, integrateScalar, QuadratureError } from "../../src/engine/index.js";

// Every expected value here is an integral known in closed form (elementary calculus).
describe("adaptive Gauss-Kronrod quadrature", () => {
  it("integrates a degree-22 polynomial exactly with one 15-point Kronrod rule (degree of exactness 3n+1 = 22 for n = 7)", () => {
    // int_-1^1 x^22 dx = 2/23
    const r = integrateScalar((x) => x ** 22, -1, 1, 1e-13);
    expect(Math.abs(r.value - 2 / 23)).toBeLessThan(1e-15);
  });

  it("integrates smooth functions to 1e-13: int_0^pi sin = 2, int_0^1 e^x = e - 1", () => {
    expect(Math.abs(integrateScalar(Math.sin, 0, Math.PI).value - 2)).toBeLessThan(2e-13);
    expect(Math.abs(integrateScalar(Math.exp, 0, 1).value - Math.expm1(1))).toBeLessThan(2e-13);
  });

  it("handles integrable end-point singularities: int_0^1 x^(-1/2) = 2, int_0^1 ln x = -1", () => {
    expect(Math.abs(integrateScalar((x) => 1 / Math.sqrt(x), 0, 1, 1e-12).value - 2)).toBeLessThan(1e-10);
    expect(Math.abs(integrateScalar(Math.log, 0, 1, 1e-12).value + 1)).toBeLessThan(1e-10);
  });

  it("integrates a sharp peak: int_-1^1 1/(1e-4 + x^2) dx = 2 atan(100)/1e-2", () => {
    const exact = (2 * Math.atan(100)) / 1e-2;
    const r = integrateScalar((x) => 1 / (1e-4 + x * x), -1, 1, 1e-13);
    expect(Math.abs(r.value - exact) / exact).toBeLessThan(1e-12);
  });

  it("integrates all components of a vector integrand to their own tolerance", () => {
    const q = new GaussKronrodIntegrator(2);
    const v = new Float64Array(2);
    const e = new Float64Array(2);
    q.integrate(
      (x, out) => {
        out[0] = Math.cos(x);
        out[1] = 1e-20 * x * x;
      },
      0,
      1,
      1e-13,
      0,
      v,
      e,
    );
    expect(Math.abs(v[0] - Math.sin(1))).toBeLessThan(1e-13);
    expect(Math.abs(v[1] - 1e-20 / 3) / (1e-20 / 3)).toBeLessThan(1e-13);
  });

  it("reports failure instead of returning a wrong number for a divergent integral", () => {
    expect(() => integrateScalar((x) => 1 / x, 0, 1, 1e-13)).toThrow(QuadratureError);
  });
});
