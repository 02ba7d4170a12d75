// The pressure of a massive neutrino species is as accurate as its energy density: 3p/rho and P/F(0)
// against 30-digit mpmath integrals (test/fixtures/mpmath/neutrinoPressure.py), across the whole range from
// relativistic (y << 1) to non-relativistic (y >> 1), where 3p = rho (1 - d ln F / d ln y) used to lose digits.
import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { lnEnergyRatio, lnPressureRatio } from "../../src/engine/index.js";
import { relErr } from "../helpers/modelOf.js";

type Row = { y: string; P_over_F0: string; threeP_over_rho: string };
const fixture: { rows: Row[] } = JSON.parse(
  readFileSync(join(import.meta.dirname, "../fixtures/mpmath/neutrinoPressure.json"), "utf8"),
);

describe("Fermi-Dirac pressure of a massive species", () => {
  it.each(fixture.rows.map((r) => [r.y, r] as [string, Row]))("y = %s: P/F(0) and 3p/rho within 1.5e-10", (_, r) => {
    const lnY = Math.log(Number(r.y));
    expect(relErr(Math.exp(lnPressureRatio(lnY)), Number(r.P_over_F0))).toBeLessThan(1e-10);
    expect(relErr(Math.exp(lnPressureRatio(lnY) - lnEnergyRatio(lnY)), Number(r.threeP_over_rho))).toBeLessThan(
      1.5e-10,
    );
  });
});
