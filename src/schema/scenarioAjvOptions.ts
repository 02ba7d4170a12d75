/** The ajv options of the scenario validator, shared by the runtime compile and the precompiled module. */
export const SCENARIO_AJV_OPTIONS = { allErrors: true, strict: true, allowUnionTypes: true } as const;
