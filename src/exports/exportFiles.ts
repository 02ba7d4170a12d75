import pLimit from "p-limit";
import type { PresentedDocument } from "../presentation/presentDocument.js";
import { presentationTables, type PresentationTable } from "../presentation/presentTables.js";
import { tableCsv, tableHtml, tableJson, tableLatex, tableMarkdown, tablePlainText } from "./exportFormats.js";
import { assumptionsSentence } from "./assumptionsSentence.js";
import { chartPng, chartSvg } from "./chartImage.js";
import { chartSpecs, type ChartSpec } from "../presentation/chartSpecs.js";
import { escapeHtml, escapeMarkdown } from "./exportFormats.js";
import { provenanceLine } from "./exportProvenance.js";
import type { ExportProvenance } from "./exportProvenance.js";

export const TABLE_FORMATS = ["csv", "json", "md", "tex", "html"] as const;
export const CHART_FORMATS = ["png", "svg"] as const;
export const EXPORT_FORMATS = [...TABLE_FORMATS, ...CHART_FORMATS] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];

const RENDER = { csv: tableCsv, json: tableJson, md: tableMarkdown, tex: tableLatex, html: tableHtml } as const;

/** What a page needs to know about its exports: file names per table and chart, and the text behind the copy buttons. */
export interface ExportIndex {
  tables: { id: string; title: string; files: Partial<Record<ExportFormat, string>> }[];
  charts: { id: string; key: string; title: string; alt: string; files: Partial<Record<ExportFormat, string>> }[];
  assumptions: { txt: string; tex: string; plain: string; latex: string };
  /** Markdown and LaTeX of each table, for copy-to-clipboard. */
  copy: Record<string, { md: string; tex: string; txt?: string }>;
}

/**
/** How chart images are made; the site passes a cached version of the same functions. */
export interface ChartRenderers {
  png: (spec: ChartSpec, p: ExportProvenance) => Promise<Buffer>;
  svg: (spec: ChartSpec, p: ExportProvenance) => string;
}

/** A file's content, or for an image a function that draws it when the file is written (see writeExportFiles). */
export type ExportContent = string | Buffer | (() => Promise<Buffer>);

/**
 * Every export of one page (names relative to the page's exports folder): each table in each table format, each
 * chart series as PNG and SVG, and the assumptions paragraph as text and LaTeX, all rendered from one presented
 * document (the site and `cosmoledger export` alike). `pageAddress` is the page relative to the site root; each
 * table's provenance points at its section.
 */
export function exportFiles(
  presented: PresentedDocument,
  base: Omit<ExportProvenance, "page">,
  pageAddress: string,
  formats: readonly ExportFormat[] = EXPORT_FORMATS,
  render: ChartRenderers = { png: chartPng, svg: chartSvg },
): { files: { name: string; content: ExportContent }[]; index: ExportIndex } {
  const files: { name: string; content: ExportContent }[] = [];
  const provenance = (anchor: string): ExportProvenance => ({ ...base, page: `${pageAddress}#${anchor}` });
  const index: ExportIndex = {
    tables: [],
    charts: [],
    assumptions: { txt: "assumptions.txt", tex: "assumptions.tex", plain: "", latex: "" },
    copy: {},
  };
  const tables: PresentationTable[] = presentationTables(presented);
  for (const t of tables) {
    const p = provenance(t.anchor);
    const entry: ExportIndex["tables"][number] = { id: t.id, title: t.title, files: {} };
    for (const f of TABLE_FORMATS) {
      if (!formats.includes(f)) continue;
      const name = `${t.id}.${f}`;
      files.push({ name, content: RENDER[f](t, p) });
      entry.files[f] = name;
    }
    index.copy[t.id] =
      t.id === "key-numbers"
        ? { md: tableMarkdown(t, p), tex: tableLatex(t, p), txt: tablePlainText(t, p) }
        : { md: tableMarkdown(t, p), tex: tableLatex(t, p) };
    index.tables.push(entry);
  }
  const wantCharts = CHART_FORMATS.filter((f) => formats.includes(f));
  if (wantCharts.length > 0) {
    for (const spec of chartSpecs(presented)) {
      const p = provenance("charts");
      const entry: ExportIndex["charts"][number] = {
        id: spec.id,
        key: spec.key,
        title: spec.title,
        alt: spec.alt,
        files: {},
      };
      const stem = `chart-${spec.id}-${spec.key}${spec.variant === "ratio" ? "-ratio" : ""}`;
      if (wantCharts.includes("png")) {
        entry.files.png = `${stem}.png`;
        files.push({ name: entry.files.png, content: () => render.png(spec, p) });
      }
      if (wantCharts.includes("svg")) {
        entry.files.svg = `${stem}.svg`;
        files.push({ name: entry.files.svg, content: () => Promise.resolve(Buffer.from(render.svg(spec, p), "utf8")) });
      }
      index.charts.push(entry);
    }
    // Ready-made image references with their alt text, for a wiki page (Markdown) or any HTML page.
    const image = (c: ExportIndex["charts"][number]) => c.files.png ?? c.files.svg!;
    const source = provenanceLine(provenance("charts"));
    files.push({
      name: "charts.md",
      content: [
        ...index.charts.map((c) => `![${escapeMarkdown(c.alt)}](${image(c)})`),
        "",
        `Source: ${escapeMarkdown(source)}`,
        "",
      ].join("\n\n"),
    });
    files.push({
      name: "charts.html",
      content: [
        ...index.charts.map(
          (c) =>
            `<figure class="cosmoledger-export"><img src="${escapeHtml(image(c))}" alt="${escapeHtml(c.alt)}" width="600" height="340"><figcaption>${escapeHtml(c.title)}. Source: ${escapeHtml(source)}</figcaption></figure>`,
        ),
        "",
      ].join("\n"),
    });
  }
  const sentence = assumptionsSentence(presented.stored, provenance("assumptions"));
  files.push({ name: "assumptions.txt", content: sentence.plain }, { name: "assumptions.tex", content: sentence.tex });
  index.assumptions.plain = sentence.plain;
  index.assumptions.latex = sentence.tex;
  return { files, index };
}

/**
 * Resolves every file's content (drawing images) with at most `inFlight` images pending at once, handing each to
 * `write` as soon as it is ready, in any order. Bounded so that a large site never holds many bitmaps in memory.
 */
export async function writeExportFiles<T extends { content: ExportContent }>(
  files: T[],
  write: (file: T, content: string | Buffer) => void,
  inFlight = 4,
): Promise<void> {
  const limit = pLimit(inFlight);
  let failure: { error: unknown } | null = null; // the first failure, raised once every started image has settled
  const jobs: Promise<void>[] = [];
  for (const f of files) {
    const content = f.content;
    if (typeof content !== "function") {
      write(f, content);
      continue;
    }
    jobs.push(
      limit(async () => {
        if (failure) return; // after a failure, images not yet started are not drawn
        try {
          write(f, await content());
        } catch (error) {
          failure ??= { error };
        }
      }),
    );
  }
  await Promise.all(jobs);
  if (failure) throw (failure as { error: unknown }).error;
}
