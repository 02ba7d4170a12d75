import type { BackgroundModel } from "./backgroundModel.js";
import { FD_ENERGY_MASSLESS, FD_NUMBER } from "./fermiDiracEnergy.js";

/** The term of E^2(a) that dominates as a -> 0 or a -> infinity: E^2 ~ coefficient * a^(-power). */
export interface DominantTerm {
  /** Power p in E^2 ~ a^(-p); -Infinity when the term grows faster than any power (CPL with wa > 0 as a -> infinity). */
  readonly power: number;
  /** Sum of the coefficients of the terms with that power. */
  readonly coefficient: number;
}

interface Term {
  power: number;
  coefficient: number;
}

/** A dark-energy power within 1e-12 of an ordinary one (w0 = -1/3, 0, 1/3) is taken as that power exactly. */
function snap(power: number): number {
  for (const p of [2, 3, 4]) if (Math.abs(power - p) <= 1e-12) return p;
  return power;
}

function terms(model: BackgroundModel, late: boolean): Term[] {
  const out: Term[] = [];
  if (model.Omega_r !== 0) out.push({ power: 4, coefficient: model.Omega_r });
  if (model.Omega_cb !== 0) out.push({ power: 3, coefficient: model.Omega_cb });
  // Massive neutrinos: radiation (a^-4, massless-equivalent density) early, matter (a^-3) late.
  for (const n of model.massiveNeutrinos) {
    out.push(
      late
        ? { power: 3, coefficient: n.Omega_rel * (FD_NUMBER / FD_ENERGY_MASSLESS) * Math.exp(n.lnY0) }
        : { power: 4, coefficient: n.Omega_rel },
    );
  }
  if (model.Omega_k !== 0) out.push({ power: 2, coefficient: model.Omega_k });
  if (model.Omega_de !== 0) {
    const { w0, wa } = model;
    if (!late) {
      // CPL as a -> 0: a^(-3(1 + w0 + wa)) exp(-3 wa) (Chevallier & Polarski 2001).
      out.push({ power: snap(3 * (1 + w0 + wa)), coefficient: model.Omega_de * Math.exp(-3 * wa) });
    } else if (wa > 0) {
      // CPL as a -> infinity grows like exp(3 wa a): faster than any power.
      out.push({ power: -Infinity, coefficient: model.Omega_de });
    } else if (wa === 0) {
      out.push({ power: snap(3 * (1 + w0)), coefficient: model.Omega_de });
    }
    // wa < 0: the dark-energy density falls like exp(-3 |wa| a) and never dominates late.
  }
  return out;
}

function dominant(list: Term[], pick: (a: number, b: number) => boolean): DominantTerm {
  let best: number | null = null;
  for (const t of list) if (best === null || pick(t.power, best)) best = t.power;
  if (best === null) return { power: 0, coefficient: 0 };
  let coefficient = 0;
  for (const t of list) if (t.power === best) coefficient += t.coefficient;
  return { power: best, coefficient };
}

/** Dominant term of E^2 as a -> 0 (the largest power). */
export function dominantTermEarly(model: BackgroundModel): DominantTerm {
  return dominant(terms(model, false), (p, best) => p > best);
}

/** Dominant term of E^2 as a -> infinity (the smallest power). */
export function dominantTermLate(model: BackgroundModel): DominantTerm {
  return dominant(terms(model, true), (p, best) => p < best);
}
