/** The cautions every tables document, page and export carries. */
export const CAUTIONS = [
  "Background only: a homogeneous, isotropic FLRW expansion. Perturbations, gravitational lensing, peculiar velocities and K-corrections are not included.",
  "Radiation is photons at T_cmb plus N_eff massless neutrino species; massive neutrinos and baryon physics are not modelled in this version.",
  "Dark energy follows the CPL form w(a) = w0 + wa (1 - a) at all times, including its extrapolation into the future used for the fate and the event horizon.",
  "No fitting formulas enter these numbers: every quantity is an integral or closed form of the Friedmann equation, computed to 1e-10 relative accuracy.",
  "These are comparison tables, not parameter inference: for precision constraints use a dedicated Boltzmann and likelihood code.",
];
