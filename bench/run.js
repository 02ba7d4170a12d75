// npm run bench: prints the figures; never asserts on time. The last line is one JSON object.
import { runEngineBench } from "./engine.js";
import { runComputeBench } from "./compute.js";
import { runSiteBench } from "./site.js";
import { runArchiveBench } from "./archive.js";
import { runLimitsBench } from "./limits.js";
import { runSpreadBench } from "./spread.js";
import { runIncrementalBuildBench } from "./incrementalBuild.js";
import { runPreviewBench } from "./preview.js";
import { runWhatIfBench } from "./whatIf.js";

const engine = runEngineBench();
console.log(`engine: ${engine.points} points (8 models x 2000 redshifts, z 0..20, all per-redshift quantities)`);
console.log(`  median wall time ${engine.ms.toFixed(2)} ms, ${(engine.pointsPerSecond / 1e6).toFixed(2)} M points/s`);
console.log(
  `  with one massive neutrino per model: ${engine.nuMs.toFixed(2)} ms (${(engine.nuMs / engine.ms).toFixed(2)}x)`,
);
console.log(
  `  largest relative error against the per-point careful path (1e-13): ${engine.maxRelError.toExponential(2)} over ${engine.checked} values`,
);
const cli = runComputeBench();
console.log(`cli: bare node start-up ${cli.nodeStartMs.toFixed(0)} ms`);
console.log(`  --help ${cli.helpMs.toFixed(0)} ms (${(cli.helpMs - cli.nodeStartMs).toFixed(0)} ms beyond node)`);
console.log(
  `  compute, 8 models x (2000 grid + 20 table redshifts): ${cli.computeMs.toFixed(0)} ms (${(cli.computeMs - cli.nodeStartMs).toFixed(0)} ms beyond node)`,
);
console.log(
  `  side by side with node -e 0 (median of pair ratios): quote of 1 model at 3 redshifts ${cli.quoteRatio.toFixed(2)}x; compute (as above) ${cli.computeRatio.toFixed(2)}x`,
);
console.log(
  `  floors under compute, side by side with node -e 0: a process that only serialises the same tables document and writes tables.json ${cli.floorRatio.toFixed(2)}x; compute's modules loaded, nothing run (compute without a file) ${cli.loadRatio.toFixed(2)}x`,
);
console.log(
  `  compute phases, one cold process: ${Object.entries(cli.phases)
    .map(([k, v]) => `${k} ${v} ms`)
    .join("; ")}`,
);
const site = runSiteBench();
site.sizes.forEach((n, i) =>
  console.log(
    `site: ${n} generated scenarios x 4 models, table exports, --skip-images: ${site.seconds[i].toFixed(2)} s (${((1000 * site.seconds[i]) / n).toFixed(1)} ms per scenario page)`,
  ),
);
console.log(
  `  ${site.imagesN} scenarios with chart images drawn into an empty cache: ${site.imageSeconds.toFixed(2)} s (${((1000 * (site.imageSeconds - (site.seconds[0] * site.imagesN) / site.sizes[0])) / site.imagesN).toFixed(0)} ms of images per page)`,
);
console.log(
  `  largest demo scenario page (HTML with inline chart data, without Chart.js): ${site.maxPageKB.toFixed(0)} KB`,
);
const archive = runArchiveBench();
console.log(
  `archive: freeze (whole process) median ${archive.freezeMedianMs.toFixed(0)} ms; record ${archive.recordKB.toFixed(0)} KB each`,
);
console.log(
  `  verify ${archive.versions} versions (hashes, chain, recompute): ${archive.verifyMs.toFixed(0)} ms; build with ${archive.versions} version pages and every diff pair (--skip-images): ${(archive.buildMs / 1000).toFixed(2)} s`,
);
const incremental = await runIncrementalBuildBench();
const line = (b) =>
  `${b.seconds.toFixed(2)} s, peak ${b.peakMB.toFixed(0)} MB${b.rendered !== null ? ` (${b.rendered} of ${b.pages} pages rendered)` : ""}`;
console.log(
  `incremental build: ${incremental.count} generated scenarios x ${incremental.versions} frozen versions (--skip-images): clean build ${line(incremental.clean)}`,
);
console.log(`  rebuild, nothing changed: ${line(incremental.unchanged)}`);
console.log(
  `  rebuild after one more freeze: ${line(incremental.afterFreeze)}; ${(incremental.clean.seconds / incremental.afterFreeze.seconds).toFixed(0)}x faster than the clean build`,
);
const preview = await runPreviewBench();
if (!preview) console.log("preview: chromium is not installed (apt-get install -y chromium); latency not measured");
else
  for (const [name, p] of [
    ["demo scenarios", preview.small],
    ["200 generated scenarios with 1,000 frozen versions", preview.large],
  ])
    console.log(
      `preview (${name}): save to new number in Chromium, median ${p.medianMs.toFixed(0)} ms over ${p.ms.length} saves (first ${p.firstMs.toFixed(0)} ms, slowest ${p.maxMs.toFixed(0)} ms); serve's first build ${(p.firstBuildMs / 1000).toFixed(1)} s, peak ${p.peakMB.toFixed(0)} MB; a full build of the same folder ${p.fullBuildS.toFixed(1)} s (${((1000 * p.fullBuildS) / p.medianMs).toFixed(0)}x a save)`,
    );
const whatIf = await runWhatIfBench();
console.log(
  `what-if engine bundle: ${whatIf.sizes.engineGzipKB.toFixed(1)} KB gzipped (${whatIf.sizes.engineKB.toFixed(0)} KB; budget 100 KB gzipped); panel script ${whatIf.sizes.panelGzipKB.toFixed(1)} KB gzipped`,
);
if (!whatIf.pages)
  console.log("what-if: chromium is not installed (apt-get install -y chromium); latency not measured");
else
  for (const [id, p] of Object.entries(whatIf.pages))
    console.log(
      `what-if in Chromium (${id}, 200 grid points and 11 table redshifts): open to numbers cold median ${p.coldMedianMs.toFixed(0)} ms (${p.coldMs.map((x) => x.toFixed(0)).join(", ")}), after the idle warm-up ${p.afterWarmUpMedianMs.toFixed(0)} ms; a change median ${p.warmMedianMs.toFixed(0)} ms (slowest ${p.warmMaxMs.toFixed(0)} ms), with a chart in view ${p.warmWithChartMedianMs.toFixed(0)} ms (slowest ${p.warmWithChartMaxMs.toFixed(0)} ms)`,
    );
const spread = await runSpreadBench();
console.log(
  `spread: compute of 8 models x 1,000 draws over 200 grid + 20 table redshifts (one massive neutrino each), whole process: ${spread.wholeMs.toFixed(0)} ms (without spreads ${spread.plainMs.toFixed(0)} ms; node -e 0 ${spread.nodeMs.toFixed(0)} ms)`,
);
console.log(
  `  warm, in one process (the document built again, both threads' code already optimised): ${spread.warmMs.toFixed(0)} ms`,
);
console.log(
  `  one draw ${spread.perDrawMs.toFixed(3)} ms against one plain model's evaluation ${spread.plainPerModelMs.toFixed(3)} ms (${spread.drawOverPlain.toFixed(2)}x)`,
);
const limits = runLimitsBench();
for (const l of limits)
  console.log(
    `limits: ${l.name}: compute ${l.compute.seconds.toFixed(1)} s, peak ${l.compute.peakMB.toFixed(0)} MB; build ${l.build.seconds.toFixed(1)} s, peak ${l.build.peakMB.toFixed(0)} MB (2 GB heap)`,
  );
console.log(
  JSON.stringify({
    points: engine.points,
    ms: Number(engine.ms.toFixed(3)),
    ms_with_neutrinos: Number(engine.nuMs.toFixed(3)),
    max_rel_error: engine.maxRelError,
    help_ms_beyond_node: Number((cli.helpMs - cli.nodeStartMs).toFixed(1)),
    compute_ms_beyond_node: Number((cli.computeMs - cli.nodeStartMs).toFixed(1)),
    quote_over_node: Number(cli.quoteRatio.toFixed(2)),
    compute_over_node: Number(cli.computeRatio.toFixed(2)),
    serialise_floor_over_node: Number(cli.floorRatio.toFixed(2)),
    load_floor_over_node: Number(cli.loadRatio.toFixed(2)),
    site_200_s: Number(site.seconds[2].toFixed(2)),
    site_10_with_images_s: Number(site.imageSeconds.toFixed(2)),
    max_page_kb: Number(site.maxPageKB.toFixed(1)),
    freeze_ms: Number(archive.freezeMedianMs.toFixed(1)),
    verify_20_ms: Number(archive.verifyMs.toFixed(1)),
    build_20_versions_s: Number((archive.buildMs / 1000).toFixed(2)),
    spread_8x1000_ms: Number(spread.wholeMs.toFixed(0)),
    spread_8x1000_warm_ms: Number(spread.warmMs.toFixed(0)),
    draw_over_plain: Number(spread.drawOverPlain.toFixed(2)),
    incremental_clean_s: Number(incremental.clean.seconds.toFixed(2)),
    incremental_after_freeze_s: Number(incremental.afterFreeze.seconds.toFixed(2)),
    incremental_clean_peak_mb: Math.round(incremental.clean.peakMB),
    preview_demo_median_ms: preview ? Math.round(preview.small.medianMs) : null,
    preview_200x5_median_ms: preview ? Math.round(preview.large.medianMs) : null,
    what_if_engine_gzip_kb: Number(whatIf.sizes.engineGzipKB.toFixed(1)),
    what_if_change_median_ms: whatIf.pages ? Math.round(whatIf.pages["lantern-deep-field"].warmMedianMs) : null,
    what_if_cold_median_ms: whatIf.pages ? Math.round(whatIf.pages["lantern-deep-field"].coldMedianMs) : null,
    limits_peak_mb: Math.max(...limits.flatMap((l) => [l.compute.peakMB, l.build.peakMB])),
  }),
);
