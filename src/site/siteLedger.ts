import type { PresentedDocument } from "../presentation/presentDocument.js";
import type { SitePages } from "./sitePages.js";

/** What the site is built from: every page's tables document (live or frozen), the archive's pages and the downloads. */
export interface SiteLedger extends SitePages {
  /** The presented documents of the live pages, in id order (the index's overview charts). */
  docs: PresentedDocument[];
  /** The archive folder, as shown to users. */
  archive: string;
}

let current: SiteLedger | null = null;

/** The ledger handed to Eleventy by `cosmoledger build` (so the site is built from exactly what was checked). */
export function setSiteLedger(ledger: SiteLedger | null): void {
  current = ledger;
}

export function getSiteLedger(): SiteLedger | null {
  return current;
}
