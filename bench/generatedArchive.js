// Generated benchmark inputs (not physics data): scenarios of four models each, each frozen several times with a
// slightly different H0, written in-process through the freeze command (the same code `cosmoledger freeze` runs).
import { mkdirSync, writeFileSync } from "node:fs";
import { join, resolve } from "node:path";

const ROOT = resolve(import.meta.dirname, "..");

/** Scenario i of a generated set, with its first model's H0. */
export function generatedScenario(i, h0 = 65 + (i % 7)) {
  const om = (0.25 + (i % 10) * 0.01).toFixed(3);
  return (
    `title: Generated scenario ${i}\nid: gen-${i}\nmodels:\n  - { id: flat, H0: ${h0}, Omega_m: ${om} }\n` +
    `  - { id: open, extends: flat, Omega_k: 0.05 }\n  - { id: closed, extends: flat, Omega_k: -0.05 }\n  - { id: cpl, extends: flat, w0: -0.9, wa: -0.2 }\n` +
    `targets:\n  - { name: arc, z: 2, size_kpc: 5 }\nsurveys:\n  - { name: shell, area_deg2: 1000, z_min: 0.5, z_max: 1 }\n`
  );
}

/** Freezes a scenario file in-process (stdout of the freeze command is silenced). */
export async function freezeQuietly(file, message) {
  const { freezeCommand } = await import(join(ROOT, "dist/cli/freezeCommand.js"));
  const write = process.stdout.write;
  process.stdout.write = () => true;
  try {
    const code = freezeCommand([file], { message });
    if (code !== 0) throw new Error(`freeze of ${file} failed (${code})`);
  } finally {
    process.stdout.write = write;
  }
}

/**
 * `count` scenarios in dir/scenarios, each frozen `versions` times (H0 raised by 0.1 per version); the files end
 * equal to their latest version.
 */
export async function writeArchivedScenarios(dir, count, versions) {
  const scenarios = join(dir, "scenarios");
  mkdirSync(scenarios, { recursive: true });
  for (let i = 0; i < count; i++) {
    const file = join(scenarios, `gen-${i}.yaml`);
    for (let v = 0; v < versions; v++) {
      writeFileSync(file, generatedScenario(i, 65 + (i % 7) + v / 10));
      await freezeQuietly(file, `version ${v + 1}`);
    }
    if (versions === 0) writeFileSync(file, generatedScenario(i));
  }
  return scenarios;
}
