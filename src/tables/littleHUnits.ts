import type { StoredTablesDocument } from "../contract/tablesDocument.js";
import { differencesFromBaseline } from "./differences.js";

export { littleHUnit } from "../contract/littleHUnitNames.js";

/** The power of h of a document key, from the unit in its name (comoving_distance_Mpc: 1; ..._Gpc3: 3). */
function keyPower(key: string): number {
  if (/km_s_Mpc$/.test(key)) return 0; // H(z) stays in km/s/Mpc
  if (/_per_Mpc3$/.test(key)) return -3;
  if (/_1_Mpc$/.test(key)) return -1;
  if (/_Mpc3(_sr)?$/.test(key) || /_Gpc3$/.test(key)) return 3;
  if (/_Mpc$/.test(key) || /_kpc$/.test(key) || /^kpc_per_arcsec/.test(key)) return 1;
  return 0;
}

function scaled(record: Record<string, unknown>, h: number): Record<string, unknown> {
  const out: Record<string, unknown> = { ...record };
  for (const [k, v] of Object.entries(record)) {
    const p = keyPower(k);
    if (p === 0) continue;
    if (typeof v === "number") out[k] = v * h ** p;
    else if (Array.isArray(v)) out[k] = v.map((x) => (typeof x === "number" ? x * h ** p : x));
  }
  return out;
}

/**
 * The document as a page shows it when the scenario asks for h units (`h_units: true`): every length, volume,
 * wavenumber and density converted with each model's own h, differences from the baseline taken again on the
 * converted values (with different h, a relative difference in h^-1 Mpc is not the one in Mpc). Display only: the
 * tables document and its CSVs stay in Mpc, as the contract says.
 */
export function inLittleHUnits<D extends StoredTablesDocument>(doc: D): D {
  const models = doc.models.map((m) => {
    const h = m.parameters.H0 / 100;
    return {
      ...m,
      summary: scaled(m.summary as Record<string, unknown>, h),
      redshifts: m.redshifts.map((r) => scaled(r as unknown as Record<string, unknown>, h)),
      grid: scaled(m.grid as unknown as Record<string, unknown>, h),
      targets: m.targets.map((t) => scaled(t as unknown as Record<string, unknown>, h)),
      surveys: m.surveys.map((s) => scaled(s as unknown as Record<string, unknown>, h)),
    };
  }) as unknown as D["models"];
  const baseline = models.find((m) => m.id === doc.scenario.baseline) ?? models[0];
  const differences: Record<string, unknown> = {};
  for (const m of models)
    if (m.id !== baseline.id) differences[m.id] = differencesFromBaseline(m as never, baseline as never);
  return { ...doc, models, differences } as D;
}

/** Whether a document's scenario asks for lengths in h^-1 Mpc (format 3 on). */
export { wantsLittleHUnits } from "../contract/littleHUnitNames.js";
