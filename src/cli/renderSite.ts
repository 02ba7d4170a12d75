import { PACKAGE_ROOT } from "../common/toolVersion.js";
import { setSiteLedger, type SiteLedger } from "../site/siteLedger.js";
import type { ReuseUnit, SiteUnit } from "../site/sitePages.js";

/** Pages rendered per Eleventy run (the memory of a build is about that of one batch). */
export const RENDER_BATCH = 200;

/**
 * Renders the units `toRender` (site paths) in batches: each batch's ledger is built, rendered and let go before
 * the next, so memory stays that of one batch, not of the whole archive. The index (every scenario) comes with the
 * last batch. Returns the rendered units with their files.
 */
export async function renderInBatches(
  ledgerOf: (reuse: ReuseUnit) => SiteLedger,
  toRender: string[],
  outDir: string,
  options: { preview?: boolean } = {},
): Promise<SiteUnit[]> {
  const rendered: SiteUnit[] = [];
  for (let start = 0; start === 0 || start < toRender.length; start += RENDER_BATCH) {
    const batch = new Set(toRender.slice(start, start + RENDER_BATCH));
    const ledger = ledgerOf((path) => !batch.has(path));
    await renderSite(ledger, outDir, { ...options, index: start + RENDER_BATCH >= toRender.length });
    rendered.push(...ledger.units.filter((u) => u.files !== null));
  }
  return rendered;
}

/**
 * Renders a ledger's pages with Eleventy into `outDir` (only the pages the ledger lists: a reused page is not
 * touched), then the exports and the site marker (.eleventy.js). `preview` renders pages that listen to
 * `cosmoledger serve`. Eleventy resolves the configuration, content/ and the passthrough paths from the package root.
 */
export async function renderSite(
  ledger: SiteLedger,
  outDir: string,
  options: { preview?: boolean; index?: boolean } = {},
): Promise<void> {
  const { Eleventy } = await import("@11ty/eleventy");
  const cwd = process.cwd();
  setSiteLedger(ledger);
  process.env.COSMOLEDGER_SITE_OUT = outDir;
  if (options.preview) process.env.COSMOLEDGER_PREVIEW = "1";
  if (options.index === false) process.env.COSMOLEDGER_NO_INDEX = "1";
  try {
    process.chdir(PACKAGE_ROOT);
    const eleventy = new Eleventy("content", outDir, { configPath: ".eleventy.js", quietMode: true });
    eleventy.disableLogger(); // cosmoledger reports the build itself; Eleventy's errors still arrive as exceptions
    await eleventy.write();
  } finally {
    process.chdir(cwd);
    delete process.env.COSMOLEDGER_SITE_OUT;
    delete process.env.COSMOLEDGER_PREVIEW;
    delete process.env.COSMOLEDGER_NO_INDEX;
    setSiteLedger(null);
  }
}
