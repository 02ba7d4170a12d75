/** Raised for a model whose E^2 reaches zero in the past: it bounced instead of starting from a big bang. */
export class NoBigBangError extends Error {
  readonly turnaroundRedshift: number;
  constructor(turnaroundRedshift: number) {
    super(
      `this model has no big bang: going back in time its expansion would have turned around at z = ${turnaroundRedshift.toPrecision(6)} ` +
        `(H^2 = 0 there); lower Omega_de, raise Omega_m or add radiation`,
    );
    this.name = "NoBigBangError";
    this.turnaroundRedshift = turnaroundRedshift;
  }
}
