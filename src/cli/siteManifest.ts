import { existsSync, linkSync, copyFileSync, lstatSync, mkdirSync, readFileSync } from "node:fs";
import { dirname, join } from "node:path";
import type { SiteUnit } from "../site/sitePages.js";
import type { ScenarioArchive } from "../archive/readArchive.js";
import { bytesHashOf, metaOf, type RecordMeta, type TrustedRecords } from "../archive/trustedRecords.js";

/**
 * The list of a built site's pages with their keys and files, kept in the site folder so that the next build of the
 * same folder can reuse the pages whose key is unchanged. Same pages, same manifest: a clean and an incremental
 * build write it byte for byte alike.
 */
export const SITE_MANIFEST = ".cosmoledger-pages.json";
const MANIFEST_FORMAT = "cosmoledger.site-pages/1";

export type ManifestUnits = Map<string, { key: string; files: string[] }>;

/** The pages of a previous build of `siteDir`, or null when it has no readable manifest (then nothing is reused). */
export function readSiteManifest(siteDir: string): ManifestUnits | null {
  const file = join(siteDir, SITE_MANIFEST);
  if (!existsSync(file)) return null;
  try {
    const m = JSON.parse(readFileSync(file, "utf8")) as {
      format: string;
      lists: string[][];
      units: [string, string, number][];
    };
    if (m.format !== MANIFEST_FORMAT) return null;
    return new Map(m.units.map(([path, key, list]) => [path, { key, files: m.lists[list].map((f) => path + f) }]));
  } catch {
    return null; // a damaged manifest costs a full build, never a wrong page
  }
}

/** The manifest's text: units in path order; each unit's file names (relative to the unit) stored once per distinct list. */
export function siteManifestText(units: { path: string; key: string; files: string[] }[]): string {
  const lists: string[][] = [];
  const index = new Map<string, number>();
  const rows = units.map((u) => {
    const names = u.files.map((f) => f.slice(u.path.length));
    const id = JSON.stringify(names);
    if (!index.has(id)) {
      index.set(id, lists.length);
      lists.push(names);
    }
    return [u.path, u.key, index.get(id)];
  });
  return `${JSON.stringify({ format: MANIFEST_FORMAT, lists, units: rows })}\n`;
}

/** Whether every file of a unit is still a regular file in the site folder (a page removed by hand is rebuilt). */
export function unitFilesPresent(siteDir: string, files: string[]): boolean {
  for (const f of files) {
    try {
      if (!lstatSync(join(siteDir, f)).isFile()) return false;
    } catch {
      return false;
    }
  }
  return true;
}

/**
 * The reused units' files, from the previous site into the site being built: hard links where the file system
 * allows (the previous site is removed once the new one is in place), copies otherwise.
 */
export function carryUnitFiles(fromDir: string, toDir: string, units: SiteUnit[], previous: ManifestUnits): SiteUnit[] {
  const made = new Set<string>();
  return units.map((u) => {
    if (u.files !== null) return u;
    const files = previous.get(u.path)!.files;
    for (const f of files) {
      const target = join(toDir, f);
      const folder = dirname(target);
      if (!made.has(folder)) {
        mkdirSync(folder, { recursive: true });
        made.add(folder);
      }
      try {
        linkSync(join(fromDir, f), target);
      } catch {
        copyFileSync(join(fromDir, f), target);
      }
    }
    return { ...u, files };
  });
}

/** The version files this site was built from, by the SHA-256 of their bytes, with their light fields. */
export const SITE_RECORDS = ".cosmoledger-records.json";
const RECORDS_FORMAT = "cosmoledger.site-records/1";

/**
 * The version files a previous build of `siteDir` checked in full: empty when there is no readable list, or when it
 * was written by other code (`salt`, src/cli/buildSalt.ts): a newer cosmoledger checks every file again by its rules.
 */
export function readTrustedRecords(siteDir: string, salt: string): TrustedRecords {
  const file = join(siteDir, SITE_RECORDS);
  if (!existsSync(file)) return new Map();
  try {
    const m = JSON.parse(readFileSync(file, "utf8")) as {
      format: string;
      salt: string;
      records: [string, RecordMeta][];
    };
    return m.format === RECORDS_FORMAT && m.salt === salt ? new Map(m.records) : new Map();
  } catch {
    return new Map(); // a damaged list costs a full check, never a wrong page
  }
}

/** The list for the next build: every version of the archive, in the order of the hashes of their bytes. */
export function trustedRecordsText(archives: ScenarioArchive[], salt: string): string {
  const records: [string, RecordMeta][] = [];
  for (const a of archives)
    for (const r of a.versions) {
      const h = bytesHashOf(r);
      if (h) records.push([h, metaOf(r)]);
    }
  records.sort((a, b) => (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : 0));
  return `${JSON.stringify({ format: RECORDS_FORMAT, salt, records })}\n`;
}
