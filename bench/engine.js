// Engine benchmark: 8 models x 2,000 redshifts (0 to 20), every per-redshift quantity, cumulative path,
// against a slow careful path (each point integrated from scratch, adaptive, at 1e-13, in other variables).
import {
  redshiftTable,
  integrateScalar,
  expansionRateSquared,
  hubbleDistanceMpc,
  hubbleTimeGyr,
} from "../dist/engine/index.js";
import { BENCH_MODELS, BENCH_MODELS_NU } from "./models.js";

export function runEngineBench({ points = 2000, zMax = 20, repeats = 30 } = {}) {
  const zs = Float64Array.from({ length: points }, (_, i) => (zMax * i) / (points - 1));
  const total = BENCH_MODELS.length * points;
  for (let w = 0; w < 5; w++) for (const m of BENCH_MODELS) redshiftTable(m, zs); // warm-up (JIT)
  const times = [];
  let tables;
  for (let r = 0; r < repeats; r++) {
    const t0 = process.hrtime.bigint();
    tables = BENCH_MODELS.map((m) => redshiftTable(m, zs));
    times.push(Number(process.hrtime.bigint() - t0) / 1e6);
  }
  times.sort((a, b) => a - b);
  const ms = times[Math.floor(times.length / 2)];

  // Careful path: D_C in ln a, lookback in ln a, age and particle horizon in s = sqrt(a), each from scratch.
  let maxRel = 0;
  const careful = [];
  BENCH_MODELS.forEach((m, k) => {
    const e2 = expansionRateSquared(m);
    const DH = hubbleDistanceMpc(m.H0_km_s_Mpc);
    const tH = hubbleTimeGyr(m.H0_km_s_Mpc);
    const t = tables[k];
    for (let i = 1; i < points; i += 7) {
      const z = zs[i];
      const lnA = -Math.log1p(z);
      const DC = DH * integrateScalar((u) => Math.exp(-u) / Math.sqrt(e2(Math.exp(u))), lnA, 0, 1e-13).value;
      const lb = tH * integrateScalar((u) => 1 / Math.sqrt(e2(Math.exp(u))), lnA, 0, 1e-13).value;
      const s = Math.exp(lnA / 2);
      const age = tH * integrateScalar((x) => 2 / (x * Math.sqrt(e2(x * x))), 0, s, 1e-13).value;
      const ph = DH * integrateScalar((x) => 2 / (x * x * x * Math.sqrt(e2(x * x))), 0, s, 1e-13).value;
      for (const [ours, ref] of [
        [t.comoving_distance_Mpc[i], DC],
        [t.lookback_time_Gyr[i], lb],
        [t.age_Gyr[i], age],
        [t.particle_horizon_Mpc[i], ph],
      ]) {
        const rel = Math.abs(ours - ref) / Math.abs(ref);
        if (rel > maxRel) maxRel = rel;
      }
      careful.push(z);
    }
  });
  // The same work with massive neutrinos (goal: at most 2x the cost).
  for (let w = 0; w < 5; w++) for (const m of BENCH_MODELS_NU) redshiftTable(m, zs);
  const nuTimes = [];
  for (let r = 0; r < repeats; r++) {
    const t0 = process.hrtime.bigint();
    for (const m of BENCH_MODELS_NU) redshiftTable(m, zs);
    nuTimes.push(Number(process.hrtime.bigint() - t0) / 1e6);
  }
  nuTimes.sort((a, b) => a - b);
  const nuMs = nuTimes[Math.floor(nuTimes.length / 2)];
  return {
    points: total,
    ms,
    nuMs,
    pointsPerSecond: (total / ms) * 1000,
    maxRelError: maxRel,
    checked: careful.length * 4,
  };
}
