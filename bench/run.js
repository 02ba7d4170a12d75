// npm run bench: prints the figures; never asserts on time. The last line is one JSON object.
import { runEngineBench } from "./engine.js";

const engine = runEngineBench();
console.log(`engine: ${engine.points} points (8 models x 2000 redshifts, z 0..20, all per-redshift quantities)`);
console.log(`  median wall time ${engine.ms.toFixed(2)} ms, ${(engine.pointsPerSecond / 1e6).toFixed(2)} M points/s`);
console.log(`  largest relative error against the per-point careful path (1e-13): ${engine.maxRelError.toExponential(2)} over ${engine.checked} values`);
const extra = globalThis.__benchExtra ? await globalThis.__benchExtra() : {};
console.log(JSON.stringify({ points: engine.points, ms: Number(engine.ms.toFixed(3)), max_rel_error: engine.maxRelError, ...extra }));
