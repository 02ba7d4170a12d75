// Eight benchmark models spanning the engine's domain (flat, open, closed, w0-wa, negative Omega_de, recollapse).
import { makeBackgroundModel } from "../dist/engine/index.js";

const rad = { T_cmb_K: 2.7255, N_eff: 3.044 };
const spec = [
  { Omega_m: 0.315, curvature: { kind: "flat" }, w0: -1, wa: 0 },
  { Omega_m: 0.3, curvature: { kind: "Omega_k", Omega_k: 0.1 }, w0: -1, wa: 0 },
  { Omega_m: 0.35, curvature: { kind: "Omega_k", Omega_k: -0.05 }, w0: -1, wa: 0 },
  { Omega_m: 0.3, curvature: { kind: "flat" }, w0: -0.8, wa: -0.6 },
  { Omega_m: 0.28, curvature: { kind: "Omega_k", Omega_k: 0.05 }, w0: -1.2, wa: 0.5 },
  { Omega_m: 0.3, curvature: { kind: "Omega_de", Omega_de: -0.2 }, w0: -1, wa: 0 },
  { Omega_m: 1.5, curvature: { kind: "Omega_de", Omega_de: 0.005 }, w0: -1, wa: 0 },
  { Omega_m: 0.25, curvature: { kind: "flat" }, w0: -0.9, wa: 0 },
];
export const BENCH_MODELS = spec.map((s, i) => makeBackgroundModel({ H0_km_s_Mpc: 65 + i, radiation: rad, ...s }));
/** The same eight models with one massive neutrino of 0.06 eV each. */
export const BENCH_MODELS_NU = spec.map((s, i) =>
  makeBackgroundModel({ H0_km_s_Mpc: 65 + i, radiation: rad, m_nu_eV: [0.06], ...s }),
);
