/** Marker file that says a site folder was written by cosmoledger (build or the dev server) and may be replaced by it. */
export const SITE_MARKER = ".cosmoledger-site";
