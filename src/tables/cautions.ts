/** The cautions every tables document, page and export carries; the fitting formulas are named when they are used. */
export function cautions(
  usesEarlyUniverse: boolean,
  usesMassiveNeutrinos: boolean,
  usesSpreads = false,
  usesPublishedSets = false,
): string[] {
  // Only scenarios with spreads or published sets get their cautions, so the list of every other document is as before.
  const extra = [
    ...(usesPublishedSets
      ? [
          "Published sets: central values and 68 % uncertainties as the papers give them, with each paper's assumptions; a value transcribed from a paper's table but not yet checked against it is marked so beside the citation.",
        ]
      : []),
    ...(usesSpreads
      ? [
          "Spreads: percentiles of Monte Carlo draws of the listed parameters, each draw computed like the model itself, with the Monte Carlo error of every percentile. Marginal uncertainties drawn without their correlations misstate the spread of derived quantities (H0 and Omega_m are strongly anti-correlated in CMB fits); a correlation matrix or the analysis's own samples are faithful.",
        ]
      : []),
  ];
  return [
    "Background and linear growth only: a homogeneous, isotropic FLRW expansion, and the linear theory growth of cold dark matter plus baryons it implies (scale-independent; dark energy does not cluster; baryons fall with the dark matter from the start). Nonlinear structure, gravitational lensing, peculiar velocities and K-corrections are not included.",
    ...(usesMassiveNeutrinos
      ? [
          "Growth with massive neutrinos is that of cold dark matter plus baryons on scales well below the neutrino free-streaming scale (Omega_cb in the source term, the neutrinos smooth); on larger scales, and for the total matter, growth differs, so sigma8(z) and f sigma8 here follow that convention.",
        ]
      : []),
    usesMassiveNeutrinos
      ? "Radiation is photons at T_cmb plus N_eff neutrino species; each massive species carries N_eff/3 of the relativistic density at T_nu = (4/11)^(1/3) T_cmb and follows the exact Fermi-Dirac energy integral."
      : "Radiation is photons at T_cmb plus N_eff massless neutrino species.",
    "Dark energy follows the CPL form w(a) = w0 + wa (1 - a) at all times, including its extrapolation into the future used for the fate and the event horizon.",
    usesEarlyUniverse
      ? "Fitting formulas: z* (recombination) from Hu & Sugiyama 1996; z_drag from Eisenstein & Hu 1998, approximate (it falls a few percent below full recombination calculations); r_drag from the calibrated formula of Aubourg et al. 2015, eq. 16 (calibrated for N_eff = 3.046 near the Planck best fit). BAO ratios use that r_drag. Everything else is an integral or closed form of the Friedmann equation, to 1e-10 relative accuracy."
      : "No fitting formulas enter these numbers: every quantity is an integral or closed form of the Friedmann equation, computed to 1e-10 relative accuracy.",
    ...extra,
    "These are comparison tables, not parameter inference: for precision constraints use a dedicated Boltzmann and likelihood code.",
  ];
}
