/** Physical constants used by the engine, each with its value, unit and source. */
export interface Constant {
  readonly value: number;
  readonly unit: string;
  readonly source: string;
}

const AU_M = 149_597_870_700;
const JULIAN_YEAR_S = 365.25 * 86_400;

export const CONSTANTS = {
  speed_of_light: { value: 299_792_458, unit: "m s^-1", source: "SI definition of the metre (exact)" },
  astronomical_unit: { value: AU_M, unit: "m", source: "IAU 2012 Resolution B2 (exact)" },
  parsec: { value: (648_000 / Math.PI) * AU_M, unit: "m", source: "IAU 2015 Resolution B2: 1 pc = 648000/pi au" },
  julian_year: { value: JULIAN_YEAR_S, unit: "s", source: "IAU: 365.25 days of 86400 s (exact)" },
  gigayear: { value: 1e9 * JULIAN_YEAR_S, unit: "s", source: "10^9 Julian years" },
  boltzmann_constant: { value: 1.380649e-23, unit: "J K^-1", source: "CODATA 2018 (exact in the 2019 SI)" },
  planck_constant: { value: 6.62607015e-34, unit: "J s", source: "CODATA 2018 (exact in the 2019 SI)" },
  gravitational_constant: {
    value: 6.6743e-11,
    unit: "m^3 kg^-1 s^-2",
    source: "CODATA 2018 (relative uncertainty 2.2e-5)",
  },
  electron_volt: { value: 1.602176634e-19, unit: "J", source: "CODATA 2018 (exact in the 2019 SI)" },
} as const satisfies Record<string, Constant>;

/** Speed of light in km/s (exact). */
export const C_KM_S = CONSTANTS.speed_of_light.value / 1000;
/** One megaparsec in metres. */
export const MPC_M = 1e6 * CONSTANTS.parsec.value;
/** One megaparsec in kilometres. */
export const MPC_KM = MPC_M / 1000;
/** One megaparsec in centimetres. */
export const MPC_CM = MPC_M * 100;
/** One gigayear in seconds. */
export const GYR_S = CONSTANTS.gigayear.value;
/** One giga light-year (c times 10^9 Julian years) in megaparsecs: about 306.601 (IAU light year, IAU parsec). */
export const GLY_MPC = (CONSTANTS.speed_of_light.value * GYR_S) / MPC_M;
/** One arcsecond in radians. */
export const ARCSEC_RAD = Math.PI / 648_000;
/** The whole sky in square degrees: 4 pi (180/pi)^2. */
export const FULL_SKY_DEG2 = 4 * Math.PI * (180 / Math.PI) ** 2;
