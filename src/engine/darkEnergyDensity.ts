/**
 * rho_de(a) / rho_de(1) for w(a) = w0 + wa (1 - a): a^(-3 (1 + w0 + wa)) exp(-3 wa (1 - a))
 * (Chevallier & Polarski 2001, IJMPD 10, 213; Linder 2003, PRL 90, 091301).
 */
export function darkEnergyDensityRatio(a: number, w0: number, wa: number): number {
  if (wa === 0) return w0 === -1 ? 1 : a ** (-3 * (1 + w0));
  return Math.exp(-3 * (1 + w0 + wa) * Math.log(a) - 3 * wa * (1 - a));
}

/** CPL equation of state w(a) = w0 + wa (1 - a) (Chevallier & Polarski 2001; Linder 2003). */
export function darkEnergyEquationOfState(a: number, w0: number, wa: number): number {
  return w0 + wa * (1 - a);
}
