import { PACKAGE_ROOT } from "../common/toolVersion.js";
import { setSiteLedger, type SiteLedger } from "../site/siteLedger.js";

/**
 * Renders a ledger's pages with Eleventy into `outDir` (only the pages the ledger lists: a reused page is not
 * touched), then the exports and the site marker (.eleventy.js). `preview` renders pages that listen to
 * `cosmoledger serve`. Eleventy resolves the configuration, content/ and the passthrough paths from the package root.
 */
export async function renderSite(ledger: SiteLedger, outDir: string, preview = false): Promise<void> {
  const { Eleventy } = await import("@11ty/eleventy");
  const cwd = process.cwd();
  setSiteLedger(ledger);
  process.env.COSMOLEDGER_SITE_OUT = outDir;
  if (preview) process.env.COSMOLEDGER_PREVIEW = "1";
  try {
    process.chdir(PACKAGE_ROOT);
    const eleventy = new Eleventy("content", outDir, { configPath: ".eleventy.js", quietMode: true });
    eleventy.disableLogger(); // cosmoledger reports the build itself; Eleventy's errors still arrive as exceptions
    await eleventy.write();
  } finally {
    process.chdir(cwd);
    delete process.env.COSMOLEDGER_SITE_OUT;
    delete process.env.COSMOLEDGER_PREVIEW;
    setSiteLedger(null);
  }
}
