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

/**
 * Replaces every non-finite number in a model's tables by null; returns how many were replaced. The chart grid is
 * skipped: gridColumns already stores its non-finite values as null.
 */
export function nullNonFinite(value: unknown, skipKey = "grid"): number {
  let n = 0;
  const walk = (v: unknown): void => {
    if (Array.isArray(v)) {
      for (let i = 0; i < v.length; i++) {
        const x = v[i];
        if (typeof x === "number") {
          if (!Number.isFinite(x)) {
            v[i] = null;
            n++;
          }
        } else if (x !== null && typeof x === "object") walk(x);
      }
    } else if (v !== null && typeof v === "object") {
      const o = v as Record<string, unknown>;
      for (const k in o) {
        if (k === skipKey && o === value) continue;
        const x = o[k];
        if (typeof x === "number") {
          if (!Number.isFinite(x)) {
            o[k] = null;
            n++;
          }
        } else if (x !== null && typeof x === "object") walk(x);
      }
    }
  };
  walk(value);
  return n;
}
