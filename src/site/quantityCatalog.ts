/** How each quantity of the tables document is named and grouped on the pages (display only; no physics). */
export interface QuantityInfo { key: string; label: string; unit: string }

export const REDSHIFT_GROUPS: { title: string; id: string; quantities: QuantityInfo[] }[] = [
  {
    title: "Distances", id: "distances", quantities: [
      { key: "comoving_distance_Mpc", label: "Comoving distance D_C", unit: "Mpc" },
      { key: "transverse_comoving_distance_Mpc", label: "Transverse comoving distance D_M", unit: "Mpc" },
      { key: "angular_diameter_distance_Mpc", label: "Angular-diameter distance D_A", unit: "Mpc" },
      { key: "luminosity_distance_Mpc", label: "Luminosity distance D_L", unit: "Mpc" },
      { key: "distance_modulus_mag", label: "Distance modulus", unit: "mag" },
    ],
  },
  {
    title: "Times", id: "times", quantities: [
      { key: "lookback_time_Gyr", label: "Lookback time", unit: "Gyr" },
      { key: "age_Gyr", label: "Age at z", unit: "Gyr" },
      { key: "light_travel_distance_Gly", label: "Light-travel distance", unit: "Gly" },
    ],
  },
  {
    title: "Scales and volumes", id: "scales", quantities: [
      { key: "kpc_per_arcsec_proper", label: "Proper scale", unit: "kpc/arcsec" },
      { key: "kpc_per_arcsec_comoving", label: "Comoving scale", unit: "kpc/arcsec" },
      { key: "comoving_volume_Gpc3", label: "Comoving volume inside z (full sky)", unit: "Gpc^3" },
      { key: "comoving_volume_element_Mpc3_sr", label: "dV_C/dz/dOmega", unit: "Mpc^3/sr" },
    ],
  },
  {
    title: "Expansion and horizons", id: "expansion", quantities: [
      { key: "H_km_s_Mpc", label: "Hubble rate H(z)", unit: "km/s/Mpc" },
      { key: "H_over_1pz_km_s_Mpc", label: "H(z)/(1+z)", unit: "km/s/Mpc" },
      { key: "E", label: "E(z) = H/H0", unit: "" },
      { key: "Omega_m_z", label: "Omega_m(z)", unit: "" },
      { key: "hubble_radius_Mpc", label: "Hubble radius c/H(z)", unit: "Mpc" },
      { key: "particle_horizon_Mpc", label: "Comoving particle horizon at z", unit: "Mpc" },
    ],
  },
];

export const SUMMARY_QUANTITIES: QuantityInfo[] = [
  { key: "age_Gyr", label: "Age today", unit: "Gyr" },
  { key: "hubble_time_Gyr", label: "Hubble time 1/H0", unit: "Gyr" },
  { key: "hubble_distance_Mpc", label: "Hubble distance c/H0", unit: "Mpc" },
  { key: "particle_horizon_Mpc", label: "Comoving particle horizon", unit: "Mpc" },
  { key: "event_horizon_Mpc", label: "Comoving event horizon", unit: "Mpc" },
  { key: "curvature_radius_Mpc", label: "Curvature radius", unit: "Mpc" },
  { key: "deceleration_q0", label: "Deceleration parameter q0", unit: "" },
  { key: "z_acceleration", label: "Acceleration began at z", unit: "" },
  { key: "z_matter_radiation_equality", label: "Matter-radiation equality z", unit: "" },
  { key: "z_matter_de_equality", label: "Matter-dark-energy equality z", unit: "" },
  { key: "max_scale_factor", label: "Maximum scale factor", unit: "" },
  { key: "crunch_time_Gyr", label: "Big crunch at", unit: "Gyr" },
];

export const PARAMETERS: QuantityInfo[] = [
  { key: "H0", label: "H0", unit: "km/s/Mpc" },
  { key: "Omega_m", label: "Omega_m", unit: "" },
  { key: "Omega_de", label: "Omega_de", unit: "" },
  { key: "Omega_k", label: "Omega_k", unit: "" },
  { key: "Omega_r", label: "Omega_r", unit: "" },
  { key: "Omega_gamma", label: "Omega_gamma", unit: "" },
  { key: "Omega_nu", label: "Omega_nu (massless)", unit: "" },
  { key: "w0", label: "w0", unit: "" },
  { key: "wa", label: "wa", unit: "" },
  { key: "T_cmb", label: "T_cmb", unit: "K" },
  { key: "N_eff", label: "N_eff", unit: "" },
];

export const TARGET_QUANTITIES: QuantityInfo[] = [
  { key: "z", label: "Redshift", unit: "" },
  { key: "lookback_time_Gyr", label: "Lookback time", unit: "Gyr" },
  { key: "angular_diameter_distance_Mpc", label: "D_A", unit: "Mpc" },
  { key: "luminosity_distance_Mpc", label: "D_L", unit: "Mpc" },
  { key: "kpc_per_arcsec_proper", label: "Proper scale", unit: "kpc/arcsec" },
  { key: "angular_size_arcsec", label: "Angular size", unit: "arcsec" },
  { key: "apparent_magnitude", label: "Apparent magnitude (no K-corr.)", unit: "mag" },
  { key: "bolometric_flux_erg_s_cm2", label: "Bolometric flux", unit: "erg/s/cm^2" },
];

/** Series offered by the charts: key in the grid, label and unit. */
export const CHART_SERIES: QuantityInfo[] = [
  { key: "comoving_distance_Mpc", label: "D_C", unit: "Mpc" },
  { key: "transverse_comoving_distance_Mpc", label: "D_M", unit: "Mpc" },
  { key: "angular_diameter_distance_Mpc", label: "D_A", unit: "Mpc" },
  { key: "luminosity_distance_Mpc", label: "D_L", unit: "Mpc" },
  { key: "H_over_1pz_km_s_Mpc", label: "H(z)/(1+z)", unit: "km/s/Mpc" },
  { key: "age_Gyr", label: "Age", unit: "Gyr" },
  { key: "lookback_time_Gyr", label: "Lookback time", unit: "Gyr" },
  { key: "kpc_per_arcsec_proper", label: "Proper scale", unit: "kpc/arcsec" },
  { key: "comoving_volume_Gpc3", label: "Comoving volume", unit: "Gpc^3" },
];
