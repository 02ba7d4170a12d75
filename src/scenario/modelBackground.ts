import {
  assertBigBang,
  makeBackgroundModel,
  maximumScaleFactor,
  type BackgroundModel,
  type CurvatureSpec,
} from "../engine/index.js";
import schema from "../schema/scenario.schema.json" with { type: "json" };
import type { ResolvedModelInputs, SpreadKey } from "./resolvedScenario.js";

/**
 * The engine's background for resolved inputs, checked as the resolver checks every model: a big bang, and a
 * turnaround the engine can follow. Throws the engine's RangeError or NoBigBangError otherwise.
 */
export function backgroundOf(inputs: ResolvedModelInputs): BackgroundModel {
  const k = inputs.curvature_key;
  const curvature: CurvatureSpec =
    k === "flat"
      ? { kind: "flat" }
      : k === "Omega_k"
        ? { kind: "Omega_k", Omega_k: inputs.curvature_value! }
        : { kind: "Omega_de", Omega_de: inputs.curvature_value! };
  const background = makeBackgroundModel({
    H0_km_s_Mpc: inputs.H0,
    Omega_m: inputs.Omega_m,
    curvature,
    w0: inputs.w0,
    wa: inputs.wa,
    radiation: inputs.radiation === "none" ? null : { T_cmb_K: inputs.T_cmb!, N_eff: inputs.N_eff! },
    baryons:
      inputs.baryon_key === "Omega_b"
        ? { Omega_b: inputs.baryon_value! }
        : inputs.baryon_key === "omega_b"
          ? { omega_b: inputs.baryon_value! }
          : null,
    m_nu_eV: inputs.m_nu_eV,
  });
  assertBigBang(background);
  maximumScaleFactor(background); // a turnaround the engine cannot follow is an input problem, not a crash
  return background;
}

type Bounds = { minimum?: number; maximum?: number; exclusiveMinimum?: number };
const modelProperties = schema.definitions.model.properties as unknown as Record<string, Bounds>;

/** Why a value is outside what a scenario may give for that key (the scenario schema's bounds), or null. */
export function outsideSchemaBounds(key: SpreadKey, value: number): string | null {
  const b = modelProperties[key] ?? {};
  if (b.minimum !== undefined && value < b.minimum) return `${key} below ${b.minimum}`;
  if (b.exclusiveMinimum !== undefined && value <= b.exclusiveMinimum)
    return `${key} at or below ${b.exclusiveMinimum}`;
  if (b.maximum !== undefined && value > b.maximum) return `${key} above ${b.maximum}`;
  return null;
}
