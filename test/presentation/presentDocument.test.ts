// The presentation layer (src/presentation/) against things outside the project: the definition of h units
// (h = H0 / 100 km/s/Mpc; D[h^-1 Mpc] = h D[Mpc], V[h^-3 Gpc^3] = h^3 V, k[h Mpc^-1] = k / h; common practice in
// survey work), Einstein-de Sitter closed forms, and the invariance of percentiles under a positive factor.
import { describe, expect, it } from "vitest";
import { loadScenario } from "../../src/scenario/loadScenario.js";
import { buildTablesDocument } from "../../src/tables/buildTablesDocument.js";
import { presentDocument, presentationNotes } from "../../src/presentation/presentDocument.js";
import { presentationTables } from "../../src/presentation/presentTables.js";
import { chartData } from "../../src/presentation/chartData.js";
import { intervalOf, NO_SPREAD } from "../../src/presentation/formatInterval.js";
import { hPowerOfKey, hPowerOfUnit } from "../../src/contract/littleHUnitNames.js";
import {
  CHART_SERIES,
  EARLY_QUANTITIES,
  REDSHIFT_GROUPS,
  SUMMARY_QUANTITIES,
  TARGET_QUANTITIES,
} from "../../src/contract/quantityCatalog.js";
import type { StoredTablesDocument, TablesDocument } from "../../src/contract/tablesDocument.js";
import { hubbleDistanceMpc } from "../helpers/referenceScales.js";
import { relErr } from "../helpers/modelOf.js";

const compute = (yaml: string): TablesDocument => buildTablesDocument(loadScenario(yaml, "present.yaml"));

const EDS = (hUnits: boolean) => `title: EdS
id: eds
${hUnits ? "h_units: true\n" : ""}redshifts: [0.5, 3]
models:
  - { id: slow, H0: 55, Omega_m: 1, Omega_k: 0, radiation: none, omega_b: 0.02 }
  - { id: fast, H0: 80, Omega_m: 1, Omega_k: 0, radiation: none, omega_b: 0.02 }
`;

describe("h units are applied once, by the presentation", () => {
  const stored = compute(EDS(true));
  const p = presentDocument(stored);

  it("D_C and V_C in h units follow the Einstein-de Sitter closed forms, the same for every H0", () => {
    // Closed form (Einstein-de Sitter, e.g. Hogg 1999, astro-ph/9905116): D_C = 2 (c/H0) (1 - 1/sqrt(1+z)); in
    // h^-1 Mpc the factor c/H0 becomes c/(100 km/s/Mpc). V_C = (4 pi / 3) D_C^3 for flat space (Hogg 1999, eq. 29).
    for (const m of p.doc.models)
      m.redshifts.forEach((r) => {
        const dc = 2 * hubbleDistanceMpc(100) * (1 - 1 / Math.sqrt(1 + (r.z as number)));
        expect(relErr(r.comoving_distance_Mpc as number, dc)).toBeLessThan(1e-10);
        const v = (((4 * Math.PI) / 3) * dc ** 3) / 1e9;
        expect(relErr((r as unknown as Record<string, number>).comoving_volume_Gpc3, v)).toBeLessThan(1e-10);
      });
  });

  it("converts lengths by h, volumes by h^3, wavenumbers by 1/h and leaves times and H(z) alone", () => {
    stored.models.forEach((m, i) => {
      const h = m.parameters.H0 / 100;
      const shown = p.doc.models[i];
      const r0 = m.redshifts[1] as unknown as Record<string, number>;
      const r1 = shown.redshifts[1] as unknown as Record<string, number>;
      expect(r1.luminosity_distance_Mpc).toBe(h * r0.luminosity_distance_Mpc);
      expect(r1.comoving_volume_Gpc3).toBe(h ** 3 * r0.comoving_volume_Gpc3);
      expect(r1.H_km_s_Mpc).toBe(r0.H_km_s_Mpc);
      expect(r1.age_Gyr).toBe(r0.age_Gyr);
      expect((shown.summary as unknown as Record<string, number>).age_Gyr).toBe(
        (m.summary as unknown as Record<string, number>).age_Gyr,
      );
    });
    // A wavenumber needs an equality epoch, so a model with thermal radiation.
    const warm = compute(
      "title: W\nid: w\nh_units: true\nredshifts: [1]\nmodels:\n  - { id: w, H0: 67, Omega_m: 0.3 }\n",
    );
    const k = (warm.models[0].summary as unknown as Record<string, number>).k_eq_1_Mpc;
    expect(k).toBeGreaterThan(0);
    expect((presentDocument(warm).doc.models[0].summary as unknown as Record<string, number>).k_eq_1_Mpc).toBe(
      k / 0.67,
    );
    // The stored document is untouched (downloads keep the contract's Mpc).
    expect(p.stored).toBe(stored);
    expect(stored.models[0].redshifts[0].luminosity_distance_Mpc).not.toBe(
      p.doc.models[0].redshifts[0].luminosity_distance_Mpc,
    );
  });

  it("labels every converted quantity in h units and names each model's H0 in the notes of every table", () => {
    const tables = presentationTables(p);
    const dl = tables.find((t) => t.id === "z-luminosity_distance_Mpc")!;
    expect(dl.spans![0].unit).toBe("h^-1 Mpc");
    expect(tables.find((t) => t.id === "z-age_Gyr")!.spans![0].unit).toBe("Gyr");
    for (const t of tables) expect(t.notes[0]).toMatch(/slow: H0 = 55 km\/s\/Mpc; fast: H0 = 80 km\/s\/Mpc/);
    const plain = presentationTables(presentDocument(compute(EDS(false))));
    expect(plain.find((t) => t.id === "z-luminosity_distance_Mpc")!.spans![0].unit).toBe("Mpc");
    expect(plain[0].notes).toEqual([]);
  });

  it("differences from the baseline are taken again in h units", () => {
    // Both models' D_C in h^-1 Mpc are equal (closed form above), so the relative difference is 0 to rounding,
    // while in Mpc it is 55/80 - 1.
    const rel = p.doc.differences.fast.redshifts[0].comoving_distance_Mpc as number;
    expect(Math.abs(rel)).toBeLessThan(1e-12);
    expect(relErr(stored.differences.fast.redshifts[0].comoving_distance_Mpc as number, 55 / 80 - 1)).toBeLessThan(
      1e-10,
    );
  });

  it("every catalogue unit scales with the same power of h as its key (labels and values cannot disagree)", () => {
    const all = [
      ...REDSHIFT_GROUPS.flatMap((g) => g.quantities),
      ...SUMMARY_QUANTITIES,
      ...EARLY_QUANTITIES,
      ...TARGET_QUANTITIES,
      ...CHART_SERIES,
    ];
    for (const q of all) expect(hPowerOfUnit(q.unit), q.key).toBe(hPowerOfKey(q.key));
  });
});

const SPREAD = (spread: string, extra = "") => `title: Spread in h units
id: spread-h
h_units: true
redshifts: [0.5, 2]
draws: { count: 400, seed: 11 }
models:
  - id: flat
    H0: 70
    Omega_m: 0.3
    radiation: none
    spread: ${spread}
targets:
  - { name: Old light, lookback_Gyr: 9 }
${extra}`;

describe("intervals in the units shown", () => {
  it("an H0-only spread of a flat model without radiation has no width in h^-1 Mpc, on tables and charts", () => {
    // With radiation: none and Omega_m fixed, E(z) does not depend on H0, so h D is the same for every draw (closed
    // form of D_C = (c/H0) integral dz/E; common practice): the band must be zero to rounding, never 1/h wide.
    const p = presentDocument(compute(SPREAD("{ normal: { H0: 4 } }")));
    const m = p.doc.models[0] as StoredTablesDocument["models"][number] & {
      spread: NonNullable<TablesDocument["models"][0]["spread"]>;
    };
    for (const row of m.spread.redshifts) {
      const b = row.luminosity_distance_Mpc!;
      expect((b.q[4] - b.q[0]) / b.q[2]).toBeLessThan(1e-12);
      expect(intervalOf(b)!.fixed).toBe(true);
    }
    // Times do depend on H0 (1/H0), so their intervals stay.
    expect(intervalOf(m.spread.redshifts[0].age_Gyr)!.fixed).toBe(false);
    const key = presentationTables(p)[0];
    const dl = key.rows.find((r) => r.label === "z = 0.5: D_L")!;
    expect(dl.unit).toBe("h^-1 Mpc");
    expect(dl.cells[0].interval!.text).toBe(NO_SPREAD);
    const band = chartData(p).models[0].bands!.luminosity_distance_Mpc;
    const curve = chartData(p).models[0].values.luminosity_distance_Mpc;
    band.hi.forEach((hi, i) => {
      if (hi === null || curve[i] === null || curve[i] === 0) return;
      expect(Math.abs(hi - (curve[i] as number)) / (curve[i] as number)).toBeLessThan(1e-12);
      expect(Math.abs((band.lo[i] as number) - (curve[i] as number)) / (curve[i] as number)).toBeLessThan(1e-12);
    });
  });

  it("a target placed by lookback time shows no interval for its lookback time, only that it has no spread", () => {
    const p = presentDocument(compute(SPREAD("{ normal: { H0: 4, Omega_m: 0.02 } }")));
    const target = presentationTables(p).find((t) => t.id === "target-1")!;
    const lookback = target.rows.find((r) => /lookback/i.test(r.label))!;
    expect(lookback.cells[0].interval?.text ?? NO_SPREAD).toBe(NO_SPREAD);
    expect(lookback.cells[0].text).toBe("9.00000");
  });

  it("with H0 fixed, per-draw h bands equal the Mpc bands times h (percentiles commute with a positive factor)", () => {
    const stored = compute(SPREAD("{ normal: { Omega_m: 0.02 } }"));
    const withStored = presentDocument(stored);
    // The same record as an older format without h_scaled: the presentation scales the Mpc bands by the one h.
    const spread = { ...stored.models[0].spread! };
    delete (spread as { h_scaled?: unknown }).h_scaled;
    const older = presentDocument({ ...stored, models: [{ ...stored.models[0], spread }] });
    const a = (withStored.doc.models[0] as TablesDocument["models"][0]).spread!.redshifts[1].luminosity_distance_Mpc!;
    const b = (older.doc.models[0] as TablesDocument["models"][0]).spread!.redshifts[1].luminosity_distance_Mpc!;
    a.q.forEach((x, j) => expect(relErr(x, b.q[j])).toBeLessThan(1e-14));
    expect(older.notes).toEqual([]);
  });

  it("a record without h bands whose spread varies H0 leaves its h-scaled intervals out, and says so", () => {
    const stored = compute(SPREAD("{ normal: { H0: 4 } }"));
    const spread = { ...stored.models[0].spread! };
    delete (spread as { h_scaled?: unknown }).h_scaled;
    const p = presentDocument({ ...stored, models: [{ ...stored.models[0], spread }] });
    const shown = (p.doc.models[0] as TablesDocument["models"][0]).spread!;
    expect(shown.redshifts[0].luminosity_distance_Mpc).toBeNull();
    expect(shown.redshifts[0].age_Gyr).not.toBeNull();
    expect(p.notes.join(" ")).toMatch(/varies H0, so their intervals in h units cannot be given/);
  });
});

describe("warnings travel with the numbers", () => {
  it("a model's input warnings (H0 = 0.7) are in the document and in the notes of every table", () => {
    const doc = compute("title: W\nid: w\nredshifts: [1]\nmodels:\n  - { id: odd, H0: 0.7, Omega_m: 0.3 }\n");
    expect(doc.models[0].input_warnings[0]).toMatch(/^H0 = 0.7 km\/s\/Mpc lies outside 20 to 150/);
    const notes = presentationNotes(presentDocument(doc));
    expect(notes.some((n) => n.startsWith("warning (odd): H0 = 0.7 km/s/Mpc lies outside"))).toBe(true);
    for (const t of presentationTables(presentDocument(doc))) expect(t.notes).toEqual(notes);
  });
});
