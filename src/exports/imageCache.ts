import { createHash } from "node:crypto";
import { createRequire } from "node:module";
import { existsSync, mkdirSync, readFileSync } from "node:fs";
import writeFileAtomic from "write-file-atomic";
import { dirname, join } from "node:path";
import { Chart } from "chart.js";
import { chartPng, chartSvg, type ChartSpec } from "./chartImage.js";
import type { ChartRenderers } from "./exportFiles.js";
import type { ExportProvenance } from "./exportProvenance.js";
import { PACKAGE_ROOT } from "../common/toolVersion.js";

/** Bump when the drawing code changes, so that cached images are redrawn. */
const RENDER_REVISION = 4;

function canvasVersion(): string {
  const require = createRequire(import.meta.url);
  const main = require.resolve("@napi-rs/canvas");
  const pkg = join(dirname(main), "package.json");
  return existsSync(pkg) ? JSON.parse(readFileSync(pkg, "utf8")).version : "unknown";
}

/**
 * Chart renderers that keep each image in a content-addressed cache (default node_modules/.cache/cosmoledger/images;
 * COSMOLEDGER_CACHE=DIR moves it, COSMOLEDGER_CACHE=off turns it off). The key covers the chart's data and labels,
 * the provenance, the drawing revision and the Chart.js and canvas versions, so a cached image is the one that
 * would be drawn now. Frozen versions therefore cost nothing after their first build.
 */
export function cachedRenderers(): ChartRenderers {
  const setting = process.env.COSMOLEDGER_CACHE;
  if (setting === "off") return { png: chartPng, svg: chartSvg };
  const dir = setting ?? join(PACKAGE_ROOT, "node_modules", ".cache", "cosmoledger", "images");
  const salt = JSON.stringify({ RENDER_REVISION, chart: Chart.version, canvas: canvasVersion() });
  const fileOf = (ext: string, spec: ChartSpec, p: ExportProvenance) => {
    const key = createHash("sha256").update(salt).update(JSON.stringify(spec)).update(JSON.stringify(p)).digest("hex");
    return join(dir, key.slice(0, 2), `${key}.${ext}`);
  };
  const keep = (file: string, content: string | Buffer) => {
    try {
      mkdirSync(dirname(file), { recursive: true });
      writeFileAtomic.sync(file, content);
    } catch {
      // A read-only or full cache only costs time.
    }
  };
  return {
    png: async (spec, p) => {
      const file = fileOf("png", spec, p);
      if (existsSync(file)) return readFileSync(file);
      const out = await chartPng(spec, p);
      keep(file, out);
      return out;
    },
    svg: (spec, p) => {
      const file = fileOf("svg", spec, p);
      if (existsSync(file)) return readFileSync(file, "utf8");
      const out = chartSvg(spec, p);
      keep(file, out);
      return out;
    },
  };
}
