/**
 * A model the engine could not compute to its promised accuracy (a quadrature that did not converge near a loitering
 * or static point, a turning point the scan cannot resolve). Raised with the model's index so that the command can
 * point at it in the scenario file: a located input error (exit 2), never an unexpected failure.
 */
export class ModelComputeError extends Error {
  constructor(
    readonly modelIndex: number,
    readonly modelId: string,
    readonly reason: string,
  ) {
    super(`model ${modelId}: ${reason}`);
    this.name = "ModelComputeError";
  }
}

/** Replaces every non-finite number in a tables document's models by null; returns how many were replaced. */
export function nullNonFinite(value: unknown): number {
  let n = 0;
  const walk = (v: unknown): void => {
    if (Array.isArray(v)) {
      for (let i = 0; i < v.length; i++) {
        if (typeof v[i] === "number" && !Number.isFinite(v[i])) {
          v[i] = null;
          n++;
        } else if (v[i] && typeof v[i] === "object") walk(v[i]);
      }
    } else if (v && typeof v === "object") {
      for (const [k, x] of Object.entries(v)) {
        if (typeof x === "number" && !Number.isFinite(x)) {
          (v as Record<string, unknown>)[k] = null;
          n++;
        } else if (x && typeof x === "object") walk(x);
      }
    }
  };
  walk(value);
  return n;
}
