/** Help for `cosmoledger quote`, kept apart so that --help loads nothing else. */

/** What `quote` prints when no --quantities are given. */
export const DEFAULT_QUOTE_QUANTITIES = ["z", "D_C", "D_A", "D_L", "mu", "scale", "lookback", "age", "H"];

export const QUOTE_HELP = `Usage: cosmoledger quote (--model "KEY=VALUE ..."... | FILE [--models ID,...])
                        (--z LIST | --lookback-Gyr LIST | --age-Gyr LIST | --distance-Mpc LIST)...
                        [--size-kpc X] [--abs-mag M] [--luminosity-erg-s L]
                        [--quantities NAME,...] [--format table|csv|json|md|tex] [--save FILE.yaml] [--strict]

Prints numbers at a few redshifts (or lookback times, ages, comoving distances) for one or more models, as compute
would give them for the equivalent scenario: quantities as rows, models as columns, with units and the digits the
pages print (full precision in csv and json). Every scenario model key is allowed in --model, including extends
(of an earlier --model's id).

Examples:
  cosmoledger quote --model "H0=70 Omega_m=0.3" --z 2 --quantities D_A,scale
  cosmoledger quote --model "id=flat H0=67.7 Omega_m=0.31" --model "id=open extends=flat Omega_k=0.05" --age-Gyr 1
  cosmoledger quote scenarios/lantern-deep-field.yaml --models reference,mildly-closed --z 0.5,1,2 --format md
  cosmoledger quote --model "H0=70 Omega_m=0.3 m_nu_eV=[0.06]" --z 1 --size-kpc 10 --save quick.yaml

Quantities (short names; the tables document's keys work too):
  z D_C D_M D_A D_L mu scale scale_comoving lookback age light_travel V_C dV H E Omega_m_z hubble_radius horizon
  D f (linear growth), sigma8_z fsigma8 (need sigma8), size mag flux (need --size-kpc, --abs-mag or
  --luminosity-erg-s), and today's age0 q0 R_curv horizon0 f0 S8.
  Default: ${DEFAULT_QUOTE_QUANTITIES.join(",")}.

Options:
  --model TEXT      a model as KEY=VALUE pairs (repeatable); values are read as in a scenario file
  --models IDS      with FILE: only these models' columns (the file's other models still resolve inheritance)
  --z, --lookback-Gyr, --age-Gyr, --distance-Mpc LIST
                    where to quote, comma-separated (repeatable; mixed kinds allowed)
  --size-kpc, --abs-mag, --luminosity-erg-s X
                    a physical size, absolute magnitude or luminosity for every placement (angular size, magnitude, flux)
  --quantities LIST which rows, in order
  --format F        table (default), csv, json, md or tex
  --save FILE.yaml  also write the equivalent scenario (never overwrites an existing file)
  --strict          warnings (printed to standard error as check prints them) are errors: exit 2, nothing printed

A scenario file with h_units: true is quoted in h units (h^-1 Mpc, each model's own h), as its pages show it.

Exit status: 0 success, 2 a bad argument or model (named, with what would be valid), 4 the file system refused.`;
