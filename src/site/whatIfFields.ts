// The inputs of the pages' what-if panel, read from the scenario schema: every model parameter a scenario may set,
// with the schema's range and description, grouped as a cosmologist reads them. The panel writes what a reader
// changes into a model block; `check`'s own validator then judges it (these ranges only guide the inputs).
import schema from "../schema/scenario.schema.json" with { type: "json" };

interface SchemaNumber {
  type?: string;
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
  description?: string;
  items?: SchemaNumber;
  maxItems?: number;
}

/** One input: the model key it writes, its label and unit as shown, and the schema's bounds. */
export interface WhatIfField {
  key: string;
  label: string;
  unit: string;
  min: number | null;
  max: number | null;
  /** The lower bound itself is not allowed (sigma8 > 0). */
  minExclusive: boolean;
  description: string;
}

/** A choice among keys of which a model gives one (curvature; baryons), each with its own bounds. */
export interface WhatIfChoice {
  name: string;
  legend: string;
  options: WhatIfField[];
}

const properties = schema.definitions.model.properties as unknown as Record<string, SchemaNumber>;

function field(key: string, label: string, unit = ""): WhatIfField {
  const p = properties[key];
  if (!p) throw new Error(`the scenario schema has no model key ${key}`);
  const bounds = p.items ?? p;
  return {
    key,
    label,
    unit,
    min: bounds.minimum ?? bounds.exclusiveMinimum ?? null,
    max: bounds.maximum ?? null,
    minExclusive: bounds.exclusiveMinimum !== undefined,
    description: p.description ?? "",
  };
}

/** The panel's inputs, in the order they appear. */
export const WHAT_IF_FORM = {
  expansion: [field("H0", "H0", "km/s/Mpc"), field("Omega_m", "Omega_m"), field("w0", "w0"), field("wa", "wa")],
  curvature: {
    name: "curvature",
    legend: "Curvature",
    options: [
      field("flat", "flat"),
      field("Omega_k", "Omega_k"),
      field("Omega_de", "Omega_de"),
      field("Omega_Lambda", "Omega_Lambda"),
    ],
  } satisfies WhatIfChoice,
  baryons: {
    name: "baryons",
    legend: "Baryons",
    options: [field("omega_b", "omega_b = Omega_b h²"), field("Omega_b", "Omega_b")],
  } satisfies WhatIfChoice,
  growth: [field("sigma8", "sigma8")],
  radiation: {
    choices: (schema.definitions.model.properties.radiation.enum as string[]).slice(),
    description: properties.radiation.description ?? "",
    fields: [field("T_cmb", "T_cmb", "K"), field("N_eff", "N_eff")],
  },
  neutrinos: { ...field("m_nu_eV", "m_nu", "eV"), maxItems: properties.m_nu_eV.maxItems ?? 3 },
};
