// Hubble scales computed in the tests from defined constants, independently of the engine (so that an error in the
// engine's constants or unit conversions cannot cancel out of a closed-form check).
/** Speed of light in km/s: exact by the SI definition of the metre (CGPM 1983). */
const C_KM_S = 299_792.458;
/** Astronomical unit in m: exact (IAU 2012 Resolution B2). */
const AU_M = 149_597_870_700;
/** Parsec in m: 648000/pi au (IAU 2015 Resolution B2). */
const PARSEC_M = (648_000 / Math.PI) * AU_M;
/** Megaparsec in km. */
const MPC_KM = (1e6 * PARSEC_M) / 1000;
/** Julian year in s: 365.25 days of 86400 s (IAU definition of the light year's year). */
const JULIAN_YEAR_S = 365.25 * 86_400;

/** Hubble distance c/H0 in Mpc for H0 in km/s/Mpc. */
export const hubbleDistanceMpc = (H0: number) => C_KM_S / H0;
/** Hubble time 1/H0 in Gyr (Julian years) for H0 in km/s/Mpc. */
export const hubbleTimeGyr = (H0: number) => MPC_KM / H0 / (1e9 * JULIAN_YEAR_S);
