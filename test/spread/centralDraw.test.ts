// A draw is the model's own computation at other parameters: a spread whose every sample sits at the model's own
// parameters must give, for every quantity (summary, table rows, targets of every placement, survey shells, chart
// grid with the linear growth, and the h-unit bands), percentiles equal to the model's tables. This runs the whole fast road of spreads
// (sampling, the one-pass draw evaluation with its Gauss panels, the vector layout, the percentile bands and their
// assembly) against the careful road of the model itself, for random models of every kind.
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { loadScenario } from "../../src/scenario/loadScenario.js";
import { buildTablesDocument } from "../../src/tables/buildTablesDocument.js";
import type { Band, TablesDocument } from "../../src/contract/tablesDocument.js";
import { hPowerOfKey } from "../../src/contract/littleHUnitNames.js";

// A fixed seed, printed, so that a failure can be replayed exactly (fast-check's documented configureGlobal).
const SEED = 250_001;
console.log(`fast-check seed ${SEED} (test/spread/centralDraw.test.ts)`);

const model = fc.record({
  H0: fc.double({ min: 55, max: 80, noNaN: true }),
  Omega_m: fc.double({ min: 0.2, max: 0.45, noNaN: true }),
  Omega_k: fc.constantFrom(0, 0.06, -0.04, 1e-13),
  w0: fc.double({ min: -1.3, max: -0.7, noNaN: true }),
  wa: fc.constantFrom(0, -0.5, 0.3),
  neutrinos: fc.constantFrom("", "m_nu_eV: [0.06], ", "m_nu_eV: [0.2, 0.2, 0.2], "),
  baryons: fc.constantFrom("", "omega_b: 0.0224, "),
  radiation: fc.constantFrom("", "radiation: none, "),
  sigma8: fc.constantFrom("", "sigma8: 0.79, "),
});

const fmt = (x: number) => String(x);

/** The quantity `key` of a record, as a number or NaN (null, or absent). */
const quantityOf = (record: object, key: string) => {
  const v = (record as Record<string, unknown>)[key];
  return typeof v === "number" ? v : Number.NaN;
};

function expectBandsEqual(bands: Record<string, Band | null>, record: object, where: string, h = 1) {
  for (const [key, band] of Object.entries(bands)) {
    const v = quantityOf(record, key) * h ** hPowerOfKey(key);
    if (band === null) {
      expect(Number.isNaN(v), `${where}.${key}: no band but a value ${v}`).toBe(true);
      continue;
    }
    for (const q of band.q) {
      const rel = q === v ? 0 : Math.abs(q - v) / Math.max(Math.abs(q), Math.abs(v));
      expect(rel, `${where}.${key}: draw ${q} vs model ${v}`).toBeLessThan(1e-12);
    }
  }
}

describe("a draw at the model's own parameters is the model", { timeout: 300_000 }, () => {
  it("every band of a spread of identical samples equals the model's tables to 1e-12", () => {
    fc.assert(
      fc.property(model, fc.boolean(), (m, hUnits) => {
        const flat = m.radiation !== "" && m.neutrinos !== "";
        const curvature = m.Omega_k === 0 ? "" : `Omega_k: ${fmt(m.Omega_k)}, `;
        const yaml = `title: Central draws
id: central
${hUnits ? "h_units: true\n" : ""}redshifts: [0, 0.2, 1, 3.5, 20]
grid: { z_max: 30, points: 60 }
draws: { count: 100, seed: 1 }
models:
  - { id: m, H0: ${fmt(m.H0)}, Omega_m: ${fmt(m.Omega_m)}, ${curvature}w0: ${fmt(m.w0)}, wa: ${m.wa}, ${m.baryons}${m.sigma8}${flat ? "" : m.neutrinos}${m.radiation}spread: { samples: chain.csv } }
targets:
  - { name: By z, z: 1.3, size_kpc: 20 }
  - { name: By lookback, lookback_Gyr: 7, absolute_magnitude: -21 }
  - { name: By age, age_Gyr: 2 }
  - { name: By distance, comoving_distance_Mpc: 1500, luminosity_erg_s: 1.0e45 }
  - { name: By angle, z: 0.8, size_arcsec: 2 }
surveys:
  - { name: Shell, area_deg2: 800, z_min: 0.3, z_max: 0.9, density_per_Mpc3: 3.0e-4 }
`;
        // Twenty samples (the least a samples file may hold), every one at the model's own H0 and Omega_m (as the file gives them, digit for digit).
        const chain = `H0,Omega_m\n${Array.from({ length: 20 }, () => `${fmt(m.H0)},${fmt(m.Omega_m)}`).join("\n")}\n`;
        const s = loadScenario(yaml, "central.yaml", {
          readAttachment: (path) => {
            if (path !== "chain.csv") throw new Error("no such file");
            return chain;
          },
        });
        const doc: TablesDocument = buildTablesDocument(s);
        const tables = doc.models[0];
        const spread = tables.spread!;
        expect(spread.accepted).toBe(20);
        expectBandsEqual(spread.summary, tables.summary, "summary");
        tables.redshifts.forEach((r, i) => expectBandsEqual(spread.redshifts[i], r, `redshifts[${i}]`));
        tables.targets.forEach((t, i) => expectBandsEqual(spread.targets[i], t, `targets[${i}]`));
        tables.surveys.forEach((v, i) => expectBandsEqual(spread.surveys[i], v, `surveys[${i}]`));
        for (const [key, band] of Object.entries(spread.grid)) {
          const column = (tables.grid as unknown as Record<string, (number | null)[]>)[key];
          if (band === null) continue; // a column some point of which has no value (D_L's modulus at z = 0)
          column.forEach((v, i) => {
            const q = band.q[2][i];
            if (v === null) expect(q, `grid.${key}[${i}]`).toBeNull();
            else expect(Math.abs(q! - v) / Math.max(Math.abs(v), 1e-300), `grid.${key}[${i}]`).toBeLessThan(1e-12);
          });
        }
        // The h-unit bands: each draw converted with its own h, here the model's.
        if (hUnits) {
          const h = tables.parameters.H0 / 100;
          const scaled = spread.h_scaled!;
          expectBandsEqual(scaled.summary, tables.summary, "h_scaled.summary", h);
          tables.redshifts.forEach((r, i) => expectBandsEqual(scaled.redshifts[i], r, `h_scaled.redshifts[${i}]`, h));
          tables.targets.forEach((t, i) => expectBandsEqual(scaled.targets[i], t, `h_scaled.targets[${i}]`, h));
        } else expect(spread.h_scaled).toBeUndefined();
      }),
      { seed: SEED, numRuns: 25 },
    );
  });
});
