import canonicalize from "canonicalize";
import { existsSync } from "node:fs";
import { join } from "node:path";
import { displayPath } from "../common/displayPath.js";
import { readArchive } from "../archive/readArchive.js";
import { compareWithRecomputed, type DriftFinding } from "../archive/versionDrift.js";
import { attachmentsOf, frozenInputs } from "../contract/versionRecord.js";
import { canonicalAttachmentPath } from "../scenario/resolveSpread.js";
import { loadScenario } from "../scenario/loadScenario.js";
import { ScenarioInputError } from "../scenario/scenarioIssue.js";
import { buildTablesDocument } from "../tables/buildTablesDocument.js";
import { ModelComputeError } from "../tables/modelComputeError.js";
import { ENGINE_TOLERANCE, ENGINE_VERSION } from "../engine/index.js";

/** Exit status of `verify --strict` when the archive is intact but the current code no longer reproduces it unexplained. */
export const DRIFT_EXIT = 3;

interface Located extends DriftFinding {
  scenario: string;
  version: number;
}

const shown = (r: number) =>
  r === Infinity ? "changed (not a number, or shape)" : r === 0 ? "0 (identical)" : r.toExponential(2);
const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? "" : "s"}`;

/**
 * `cosmoledger verify [--archive DIR] [--strict] [--json] [--verbose]`: checks every version's hash and the hash chains
 * (exit 2 on any problem, naming the file), then recomputes each version from its frozen source with the current code
 * and separates three things: quantities added since a version was frozen (listed once, not drift), drift that a
 * declared engine change explains, and drift that none does. With --strict, unexplained drift, changed resolved
 * inputs or a source that no longer validates fail with exit 3.
 */
/** Where two JSON values differ: key paths with the stored and the current value, first differences first. */
function differingPaths(stored: unknown, now: unknown, path = "inputs"): string[] {
  const show = (x: unknown) => {
    const s = JSON.stringify(x) ?? "absent";
    return s.length > 40 ? `${s.slice(0, 40)}...` : s;
  };
  if (stored === now) return [];
  if (stored && now && typeof stored === "object" && typeof now === "object") {
    const out: string[] = [];
    const keys = Array.isArray(stored)
      ? Array.from({ length: Math.max(stored.length, (now as unknown[]).length) }, (_, i) => i)
      : [...new Set([...Object.keys(stored), ...Object.keys(now)])].sort();
    for (const k of keys) {
      const next = Array.isArray(stored) ? `${path}[${k}]` : `${path}.${k}`;
      out.push(...differingPaths((stored as Record<string, unknown>)[k], (now as Record<string, unknown>)[k], next));
      if (out.length >= 4) break;
    }
    return out;
  }
  return [`${path} (stored ${show(stored)}, now ${show(now)})`];
}

export function verifyCommand(options: {
  archive?: string;
  scenarios?: string;
  strict?: boolean;
  json?: boolean;
  quiet?: boolean;
  verbose?: boolean;
}): number {
  // One rule for every command: the archive is the folder "archive" beside the scenario files.
  const scenarios = options.scenarios ?? (existsSync("scenarios") ? "scenarios" : ".");
  const dir = options.archive ?? join(scenarios, "archive");
  if (!existsSync(dir)) {
    process.stderr.write(
      `error: no archive at ${displayPath(dir)} (an archive is the folder "archive" beside its scenario files; name the scenarios folder with --scenarios DIR or the archive with --archive DIR; cosmoledger freeze creates it)\n`,
    );
    return 2;
  }
  const { archives, issues } = readArchive(dir);
  if (issues.length > 0) {
    for (const i of issues) process.stderr.write(`error: ${i.file}: ${i.message}\n`);
    process.stderr.write(
      `${plural(issues.length, "problem")} in the archive ${displayPath(dir)}; it cannot be trusted until the files are restored.\n`,
    );
    return 2;
  }
  const total = archives.reduce((n, a) => n + a.versions.length, 0);
  const added = new Map<string, string[]>(); // quantity -> versions that lack it
  const removed = new Map<string, string[]>();
  const largest = new Map<string, { quantity: string; relative: number; at: string }>();
  const explained: Located[] = [];
  const unexplained: Located[] = [];
  const problems: string[] = [];
  const formats = new Map<string, number>();
  for (const a of archives)
    for (const v of a.versions) {
      const label = `${a.id} v${v.version}`;
      formats.set(v.tables.format, (formats.get(v.tables.format) ?? 0) + 1);
      let scenario: ReturnType<typeof loadScenario>;
      try {
        // The files the version kept (samples files) stand in for the scenario's folder.
        // Looked up by one spelling of the path, whichever spelling the record or the source uses.
        const kept = new Map(attachmentsOf(v).map((a) => [canonicalAttachmentPath(a.path), a.text]));
        // Recomputed as frozen: its samples files are read by the rules of the release that froze them.
        scenario = loadScenario(v.source.text, v.source.path, {
          frozen: true,
          readAttachment: (path) => {
            const text = kept.get(canonicalAttachmentPath(path));
            if (text === undefined) throw new Error("the version does not keep this file");
            return text;
          },
        });
      } catch (e) {
        if (!(e instanceof ScenarioInputError)) throw e;
        problems.push(`${label}: its frozen source no longer passes the current validation: ${e.issues[0].message}`);
        continue;
      }
      const now = frozenInputs(scenario);
      if (canonicalize(now) !== canonicalize(v.inputs)) {
        const where = differingPaths(v.inputs, now).slice(0, 4);
        problems.push(
          `${label}: the inputs its source resolves to today differ from the inputs the version stores, at ${where.join("; ")}: either the stored inputs no longer match the stored source (edited after freezing), or a default or an inheritance rule changed`,
        );
      }
      let c: ReturnType<typeof compareWithRecomputed>;
      try {
        c = compareWithRecomputed(v.tables, buildTablesDocument(scenario));
      } catch (e) {
        if (!(e instanceof ModelComputeError)) throw e;
        problems.push(`${label}: the current engine cannot compute it: ${e.message}`);
        continue;
      }
      for (const q of c.added) added.set(q, [...(added.get(q) ?? []), label]);
      for (const q of c.removed) removed.set(q, [...(removed.get(q) ?? []), label]);
      for (const s of c.shape) problems.push(`${label}: ${s}`);
      for (const l of c.largest) {
        const seen = largest.get(l.quantity);
        if (!seen || l.relative > seen.relative)
          largest.set(l.quantity, { quantity: l.quantity, relative: l.relative, at: `${label} ${l.model} ${l.where}` });
      }
      for (const d of c.drift)
        (d.explainedBy ? explained : unexplained).push({ ...d, scenario: a.id, version: v.version });
    }
  const worstFirst = (x: Located, y: Located) => y.relative - x.relative || (x.quantity < y.quantity ? -1 : 1);
  explained.sort(worstFirst);
  unexplained.sort(worstFirst);
  const findings = [
    ...problems,
    ...unexplained.map(
      (d) =>
        `${d.scenario} v${d.version}: ${d.model}: ${d.quantity} drifts by ${shown(d.relative)} at ${d.where} (${JSON.stringify(d.before)} -> ${JSON.stringify(d.after)}); no declared engine change explains it`,
    ),
  ];
  const rows = [...largest.values()].sort((x, y) => y.relative - x.relative || (x.quantity < y.quantity ? -1 : 1));
  if (options.json) {
    process.stdout.write(
      `${JSON.stringify({
        archive: displayPath(dir),
        versions: total,
        engine: ENGINE_VERSION,
        tolerance: ENGINE_TOLERANCE,
        formats: Object.fromEntries([...formats].sort()),
        added: [...added].map(([quantity, versions]) => ({ quantity, versions })),
        removed: [...removed].map(([quantity, versions]) => ({ quantity, versions })),
        explained: explained.map((d) => ({
          scenario: d.scenario,
          version: d.version,
          model: d.model,
          quantity: d.quantity,
          relative: d.relative,
          where: d.where,
          change: d.explainedBy!.id,
          since: d.explainedBy!.engine_version,
          why: d.explainedBy!.why,
        })),
        unexplained: unexplained.map(({ explainedBy: _e, ...d }) => d),
        quantities: rows,
        problems: findings,
      })}\n`,
    );
  } else {
    const out = (s: string) => process.stdout.write(`${s}\n`);
    out(
      `archive ${displayPath(dir)}: ${plural(archives.length, "scenario")}, ${plural(total, "version")} (${
        [...formats]
          .sort()
          .map(([f, n]) => `${n} of ${f}`)
          .join(", ") || "none"
      }); every hash and chain link checks out`,
    );
    if (!options.quiet && total > 0) {
      const within = rows.filter((r) => r.relative <= ENGINE_TOLERANCE);
      out(
        `recomputed with engine ${ENGINE_VERSION}: ${within.length} of ${rows.length} quantities reproduce within ${ENGINE_TOLERANCE}${within.length ? ` (largest ${Math.max(...within.map((r) => r.relative)) === 0 ? "0: bit-identical" : shown(Math.max(...within.map((r) => r.relative)))})` : ""}`,
      );
      for (const [q, vs] of added)
        out(
          `  added since frozen (not drift): ${q} (not computed in ${vs.length === 1 ? vs[0] : plural(vs.length, "version")})`,
        );
      for (const [q, vs] of removed)
        out(`  no longer computed: ${q} (stored in ${vs.length === 1 ? vs[0] : plural(vs.length, "version")})`);
      const byChange = new Map<string, Located[]>();
      for (const d of explained) byChange.set(d.explainedBy!.id, [...(byChange.get(d.explainedBy!.id) ?? []), d]);
      for (const [id, ds] of byChange) {
        const c = ds[0].explainedBy!;
        out(
          `  explained drift: ${plural(ds.length, "value")} in ${[...new Set(ds.map((d) => d.quantity))].join(", ")}, largest ${shown(ds[0].relative)} (${ds[0].scenario} v${ds[0].version} ${ds[0].model}): declared change ${id} from engine ${c.engine_version} (${c.models}): ${c.why}`,
        );
      }
      if (options.verbose) {
        out(`largest relative change per quantity present in both (tolerance ${ENGINE_TOLERANCE}):`);
        const width = Math.max(...rows.map((r) => r.quantity.length));
        for (const r of rows)
          out(`  ${r.quantity.padEnd(width)}  ${shown(r.relative)}${r.relative > 0 ? `  (${r.at})` : ""}`);
      }
    }
  }
  for (const p of findings) process.stderr.write(`${options.strict ? "error" : "warning"}: ${p}\n`);
  if (findings.length === 0) {
    if (!options.json)
      process.stdout.write(
        `every archived number reproduces within ${ENGINE_TOLERANCE}${explained.length ? " or by a declared engine change" : ""}\n`,
      );
    return 0;
  }
  process.stderr.write(
    `${plural(findings.length, "finding")}: archived numbers would not all reproduce under the current code${options.strict ? "" : " (use --strict to fail on this)"}\n`,
  );
  return options.strict ? DRIFT_EXIT : 0;
}
