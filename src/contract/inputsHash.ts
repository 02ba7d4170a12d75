import { createHash } from "node:crypto";
import canonicalize from "canonicalize";
import type { ResolvedInputsRecord } from "./tablesDocument.js";

const sha256 = (text: string) => createHash("sha256").update(text, "utf8").digest("hex");

/** The part of the resolved inputs that identifies a version: physics and tables inputs, not title or prose. */
function identity(engineVersion: string, inputs: ResolvedInputsRecord) {
  return {
    engine: engineVersion,
    id: inputs.id,
    baseline: inputs.baseline,
    redshifts: inputs.redshifts,
    grid: inputs.grid,
    // A spread (and the draws behind it) enters only when present, so inputs without one hash as in format 3.
    models: inputs.models.map((m) => ({
      id: m.id,
      extends: m.extends,
      inputs: m.inputs,
      ...("spread" in m && m.spread ? { spread: m.spread } : {}),
    })),
    targets: inputs.targets,
    surveys: inputs.surveys,
    ...("draws" in inputs && inputs.draws ? { draws: inputs.draws } : {}),
  };
}

/**
 * inputs_sha256 from tables format 2 on: SHA-256 of the RFC 8785 canonical JSON (sorted keys, ECMAScript numbers;
 * the `canonicalize` package) of the engine version and the identifying inputs, so field order in code never matters.
 */
export function inputsSha256(engineVersion: string, inputs: ResolvedInputsRecord): string {
  return sha256(canonicalize(identity(engineVersion, inputs))!);
}

/**
 * inputs_sha256 of tables format 1: SHA-256 of JSON.stringify of the same object, keys in the order the resolver
 * built them. Kept so that format-1 versions are compared under their own rule; never used for a new document.
 */
export function inputsSha256Format1(engineVersion: string, inputs: ResolvedInputsRecord): string {
  return sha256(JSON.stringify(identity(engineVersion, inputs)));
}

/** The inputs hash of the current inputs computed under the rule of tables format `n` (for comparing with a stored version). */
export function inputsSha256UnderFormat(n: number, engineVersion: string, inputs: ResolvedInputsRecord): string {
  return n === 1 ? inputsSha256Format1(engineVersion, inputs) : inputsSha256(engineVersion, inputs);
}
