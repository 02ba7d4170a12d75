import { describe, expect, it } from "vitest";
import betainc from "@stdlib/math-base-special-betainc";
import { backgroundSummary, comovingVolumeWithin, redshiftTable, curvatureRadiusMpc } from "../../src/engine/index.js";
import { hubbleDistanceMpc, hubbleTimeGyr } from "../helpers/referenceScales.js";
import { modelOf, relErr } from "../helpers/modelOf.js";

const Z = [0.01, 0.1, 0.5, 1, 2, 3, 5, 10, 100, 1000, 1e4];
const TOL = 1e-10; // the engine's promised relative accuracy

describe("Einstein-de Sitter (Omega_m = 1, no radiation): closed forms", () => {
  // D_C = 2 D_H (1 - (1+z)^(-1/2)); t = (2/3) t_H (1+z)^(-3/2) (Hogg 1999; textbook closed forms).
  const m = modelOf({ H0: 70, Om: 1, Ode: 0 });
  const DH = hubbleDistanceMpc(70);
  const tH = hubbleTimeGyr(70);
  const t = redshiftTable(m, Z);
  it("comoving distance and age at every redshift", () => {
    Z.forEach((z, i) => {
      expect(relErr(t.comoving_distance_Mpc[i], 2 * DH * (1 - 1 / Math.sqrt(1 + z)))).toBeLessThan(TOL);
      expect(relErr(t.age_Gyr[i], (2 / 3) * tH * (1 + z) ** -1.5)).toBeLessThan(TOL);
    });
  });
  it("H(z) = H0 (1+z)^(3/2) and H(z)/(1+z) = H0 (1+z)^(1/2) (closed form)", () => {
    Z.forEach((z, i) => {
      expect(relErr(t.H_km_s_Mpc[i], 70 * (1 + z) ** 1.5)).toBeLessThan(1e-14);
      expect(relErr(t.H_over_1pz_km_s_Mpc[i], 70 * Math.sqrt(1 + z))).toBeLessThan(1e-14);
    });
  });
  it("particle horizon today 2 D_H; no event horizon; q0 = 1/2", () => {
    const s = backgroundSummary(m).summary;
    expect(relErr(s.particle_horizon_Mpc!, 2 * DH)).toBeLessThan(TOL);
    expect(s.event_horizon_Mpc).toBeNull();
    expect(s.deceleration_q0).toBeCloseTo(0.5, 14);
    expect(s.fate).toBe("expands_decelerating"); // matter forever: q = 1/2 > 0
    expect(s.z_acceleration).toBeNull();
  });
});

describe("empty (Milne) universe, Omega_k = 1", () => {
  // D_L = D_H z (1 + z/2); t0 = t_H (Hogg 1999, eq. 21 with D_M = D_H sinh ln(1+z)).
  const m = modelOf({ H0: 70, Om: 0, Ode: 0, Ok: 1 });
  const DH = hubbleDistanceMpc(70);
  const t = redshiftTable(m, Z);
  it("luminosity distance", () => {
    Z.forEach((z, i) => expect(relErr(t.luminosity_distance_Mpc[i], DH * z * (1 + z / 2))).toBeLessThan(TOL));
  });
  it("age equals the Hubble time; particle horizon infinite", () => {
    const s = backgroundSummary(m).summary;
    expect(relErr(s.age_Gyr!, hubbleTimeGyr(70))).toBeLessThan(TOL);
    expect(s.particle_horizon_Mpc).toBeNull();
  });
});

describe("de Sitter (Omega_Lambda = 1)", () => {
  // D_C = D_H z; lookback = t_H ln(1+z); event horizon = D_H (textbook closed forms).
  const m = modelOf({ H0: 70, Om: 0, Ode: 1 });
  const DH = hubbleDistanceMpc(70);
  const tH = hubbleTimeGyr(70);
  const t = redshiftTable(m, Z.slice(0, 8));
  it("comoving distance and lookback time", () => {
    Z.slice(0, 8).forEach((z, i) => {
      expect(relErr(t.comoving_distance_Mpc[i], DH * z)).toBeLessThan(TOL);
      expect(relErr(t.lookback_time_Gyr[i], tH * Math.log1p(z))).toBeLessThan(TOL);
    });
  });
  it("event horizon D_H; infinite age reported as null with a warning", () => {
    const r = backgroundSummary(m);
    expect(relErr(r.summary.event_horizon_Mpc!, DH)).toBeLessThan(TOL);
    expect(r.summary.age_Gyr).toBeNull();
    expect(r.warnings.join(" ")).toMatch(/infinite age/);
  });
});

describe("flat Lambda-CDM without radiation", () => {
  const Om = 0.3;
  const OL = 0.7;
  const m = modelOf({ H0: 67.5, Om, Ode: OL });
  const DH = hubbleDistanceMpc(67.5);
  const tH = hubbleTimeGyr(67.5);
  it("age = 2/(3 H0 sqrt(OL)) asinh(sqrt(OL/Om)) (textbook closed form)", () => {
    const expected = ((2 / 3) * tH * Math.asinh(Math.sqrt(OL / Om))) / Math.sqrt(OL);
    expect(relErr(backgroundSummary(m).summary.age_Gyr!, expected)).toBeLessThan(TOL);
  });
  it("acceleration onset z = (2 OL/Om)^(1/3) - 1 and matter-Lambda equality z = (OL/Om)^(1/3) - 1 (closed forms)", () => {
    const s = backgroundSummary(m).summary;
    expect(relErr(s.z_acceleration!, Math.cbrt((2 * OL) / Om) - 1)).toBeLessThan(1e-12);
    expect(relErr(s.z_matter_de_equality!, Math.cbrt(OL / Om) - 1)).toBeLessThan(1e-12);
  });
  it("comoving distance against the incomplete-beta closed form, via @stdlib/math-base-special-betainc", () => {
    // D_C = D_H / (3 Om^(1/3) OL^(1/6)) [B(t; 1/3, 1/6)] from t(0) to t(z), t = Om (1+z)^3 / (Om (1+z)^3 + OL)
    const tOf = (z: number) => (Om * (1 + z) ** 3) / (Om * (1 + z) ** 3 + OL);
    const B = (x: number) => betainc(x, 1 / 3, 1 / 6, false, false);
    const zs = [0.1, 0.5, 1, 2, 5, 10, 100];
    const t = redshiftTable(m, zs);
    zs.forEach((z, i) => {
      const expected = (DH / (3 * Math.cbrt(Om) * OL ** (1 / 6))) * (B(tOf(z)) - B(tOf(0)));
      expect(relErr(t.comoving_distance_Mpc[i], expected)).toBeLessThan(1e-9); // limited by betainc near t = 1
    });
  });
});

describe("matter plus curvature, no Lambda", () => {
  // Mattig 1958: D_L = 2 D_H [Om z + (Om - 2)(sqrt(1 + Om z) - 1)] / Om^2 (recalled from memory; e.g. Peebles 1993 eq. 13.29).
  for (const Om of [0.1, 0.3, 1.5, 3]) {
    it(`Mattig's relation for D_L at Omega_m = ${Om}`, () => {
      const m = modelOf({ H0: 70, Om, Ode: 0 });
      const DH = hubbleDistanceMpc(70);
      const zs = [0.1, 0.5, 1, 3];
      const t = redshiftTable(m, zs);
      zs.forEach((z, i) => {
        const expected = (2 * DH * (Om * z + (Om - 2) * (Math.sqrt(1 + Om * z) - 1))) / (Om * Om);
        expect(relErr(t.luminosity_distance_Mpc[i], expected)).toBeLessThan(TOL);
      });
    });
  }
  it("open age t0 H0 = 1/(1-Om) - Om/(2 (1-Om)^(3/2)) arccosh(2/Om - 1) (textbook closed form, recalled from memory)", () => {
    const Om = 0.3;
    const expected = hubbleTimeGyr(70) * (1 / (1 - Om) - (Om / (2 * (1 - Om) ** 1.5)) * Math.acosh(2 / Om - 1));
    expect(relErr(backgroundSummary(modelOf({ Om, Ode: 0 })).summary.age_Gyr!, expected)).toBeLessThan(TOL);
  });
  it("closed: age, maximum scale factor Om/(Om-1) and big-crunch time pi Om / (H0 (Om-1)^(3/2)) (parametric cycloid solution)", () => {
    const Om = 2.5;
    const tH = hubbleTimeGyr(70);
    const s = backgroundSummary(modelOf({ Om, Ode: 0 })).summary;
    expect(relErr(s.age_Gyr!, tH * ((Om / (2 * (Om - 1) ** 1.5)) * Math.acos(2 / Om - 1) - 1 / (Om - 1)))).toBeLessThan(
      TOL,
    );
    expect(relErr(s.max_scale_factor!, Om / (Om - 1))).toBeLessThan(1e-13);
    expect(relErr(s.crunch_time_Gyr!, (Math.PI * Om * tH) / (Om - 1) ** 1.5)).toBeLessThan(TOL);
    expect(s.fate).toBe("recollapses");
  });
});

describe("flat radiation plus matter", () => {
  // Direct integration: H0 t = [ (2/3) u^(3/2) - 2 Or u^(1/2) + (4/3) Or^(3/2) ] / Om^2, eta H0 = 2 (sqrt(u) - sqrt(Or)) / Om,
  // u = Or + Om a; written without cancellation as H0 t = (2/3) a^2 (s + 2r)/(s + r)^2, eta H0 = 2 a / (s + r), s = sqrt(u), r = sqrt(Or).
  const Or = 0.2;
  const Om = 0.8;
  const m = modelOf({ Om, Or, Ode: 0 });
  const zs = [0, 0.5, 3, 100, 1e4];
  const t = redshiftTable(m, zs);
  it("age and conformal age (particle horizon) at several redshifts", () => {
    zs.forEach((z, i) => {
      const a = 1 / (1 + z);
      const s = Math.sqrt(Or + Om * a);
      const r = Math.sqrt(Or);
      const age = (hubbleTimeGyr(70) * (2 / 3) * a * a * (s + 2 * r)) / (s + r) ** 2;
      const eta = (hubbleDistanceMpc(70) * 2 * a) / (s + r);
      expect(relErr(t.age_Gyr[i], age)).toBeLessThan(TOL);
      expect(relErr(t.particle_horizon_Mpc[i], eta)).toBeLessThan(TOL);
    });
  });
});

describe("comoving volume in curved space", () => {
  const DH = hubbleDistanceMpc(70);
  it("open and closed: Hogg 1999 eq. 29 agrees with the geodesic-ball volumes for chi <= pi/2", () => {
    for (const Ok of [0.3, -0.3]) {
      const R = DH / Math.sqrt(Math.abs(Ok));
      for (const DM of [100, 1000, 3000, 6000]) {
        const sk = Math.sqrt(Math.abs(Ok));
        const x = DM / DH;
        const hogg =
          Ok > 0
            ? ((4 * Math.PI * DH ** 3) / (2 * Ok)) * (x * Math.sqrt(1 + Ok * x * x) - Math.asinh(sk * x) / sk)
            : ((4 * Math.PI * DH ** 3) / (2 * Ok)) * (x * Math.sqrt(1 + Ok * x * x) - Math.asin(sk * x) / sk);
        const chi = Ok > 0 ? Math.asinh(DM / R) : Math.asin(DM / R);
        const ours = comovingVolumeWithin(chi * R, Ok > 0 ? "open" : "closed", R);
        expect(relErr(ours, hogg)).toBeLessThan(1e-11);
      }
    }
  });
  it("closed total 2 pi^2 R^3 at the antipode; flat limit (4/3) pi D^3 as R -> infinity", () => {
    const R = 5000;
    expect(relErr(comovingVolumeWithin(Math.PI * R, "closed", R), 2 * Math.PI ** 2 * R ** 3)).toBeLessThan(1e-14);
    for (const R2 of [1e6, 1e9]) {
      expect(relErr(comovingVolumeWithin(3000, "open", R2), (4 / 3) * Math.PI * 3000 ** 3)).toBeLessThan(
        3000 ** 2 / R2 ** 2,
      );
      expect(relErr(comovingVolumeWithin(3000, "closed", R2), (4 / 3) * Math.PI * 3000 ** 3)).toBeLessThan(
        3000 ** 2 / R2 ** 2,
      );
    }
  });
  it("V_C from the table equals the integral of dV_C/dz over 4 pi sr (Hogg 1999 eqs. 28 and 29)", () => {
    const m = modelOf({ Om: 0.3, Ok: -0.2 });
    const zs = Array.from({ length: 2001 }, (_, i) => (i * 3) / 2000);
    const t = redshiftTable(m, zs);
    // Simpson's rule over the fine grid (an independent path through the volume element)
    let sum = 0;
    for (let i = 0; i < 2000; i += 2) {
      sum +=
        t.comoving_volume_element_Mpc3_sr[i] +
        4 * t.comoving_volume_element_Mpc3_sr[i + 1] +
        t.comoving_volume_element_Mpc3_sr[i + 2];
    }
    const simpson = ((4 * Math.PI * sum * (3 / 2000)) / 3) * 1e-9;
    expect(relErr(t.comoving_volume_Gpc3[2000], simpson)).toBeLessThan(1e-9);
    expect(curvatureRadiusMpc(m)).toBeCloseTo(DH / Math.sqrt(0.2), 8);
  });
});

describe("Pen 1999 (ApJS 120, 49) fitting formula for flat Lambda-CDM D_L", () => {
  // eta(a, Om) = 2 sqrt(s^3 + 1) [a^-4 - 0.1540 s a^-3 + 0.4304 s^2 a^-2 + 0.19097 s^3 a^-1 + 0.066941 s^4]^(-1/8),
  // s^3 = (1 - Om)/Om; D_L = D_H (1+z) [eta(1) - eta(1/(1+z))]; stated accuracy 0.4% for 0.2 <= Om <= 1
  // (coefficients recalled from memory).
  const eta = (a: number, Om: number) => {
    const s = Math.cbrt((1 - Om) / Om);
    return (
      2 *
      Math.sqrt(s ** 3 + 1) *
      (a ** -4 - 0.154 * s * a ** -3 + 0.4304 * s * s * a ** -2 + (0.19097 * s ** 3) / a + 0.066941 * s ** 4) **
        (-1 / 8)
    );
  };
  for (const Om of [0.2, 0.3, 0.5, 0.9]) {
    it(`agrees within 0.4% at Omega_m = ${Om}`, () => {
      const zs = [0.1, 0.5, 1, 2, 5, 10];
      const t = redshiftTable(modelOf({ Om, Ode: 1 - Om }), zs);
      zs.forEach((z, i) => {
        const pen = hubbleDistanceMpc(70) * (1 + z) * (eta(1, Om) - eta(1 / (1 + z), Om));
        expect(relErr(t.luminosity_distance_Mpc[i], pen)).toBeLessThan(0.004);
      });
    });
  }
});

describe("light-travel distance in Mpc", () => {
  it("is c times the lookback time: Einstein-de Sitter (2/3)(c/H0)(1 - (1+z)^-3/2)", () => {
    // Lookback time in EdS: t_L = (2/3) t_H (1 - (1+z)^(-3/2)) (closed form; Hogg 1999 eq. 30 with E = (1+z)^(3/2));
    // times c it is (2/3) D_H (1 - (1+z)^(-3/2)), with D_H = c/H0 from the SI metre and the IAU parsec.
    const zs = [0.1, 1, 3, 10];
    const t = redshiftTable(modelOf({ Om: 1, Ode: 0 }), zs);
    zs.forEach((z, i) => {
      const expected = (2 / 3) * hubbleDistanceMpc(70) * (1 - (1 + z) ** -1.5);
      expect(relErr(t.light_travel_distance_Mpc[i], expected)).toBeLessThan(1e-10);
    });
  });
});
