/**
 * Every released format of the data contract. A format is never changed or removed once released: a reader takes
 * each document by the format it declares, and an additive change (a new quantity, an optional field) is a new
 * format number whose schema sits beside the old ones (DEVELOPERS.md, "The data contract").
 */
export const TABLES_FORMAT_PREFIX = "cosmoledger.tables/";
export const VERSION_FORMAT_PREFIX = "cosmoledger.version/";

/** Tables formats this release reads; the last one is the one it writes. */
export const TABLES_FORMAT_NUMBERS = [1, 2, 3, 4, 5, 6] as const;
/** Version-record formats this release reads; the last one is the one it writes. */
export const VERSION_FORMAT_NUMBERS = [1, 2, 3] as const;

export const TABLES_FORMAT = `${TABLES_FORMAT_PREFIX}6` as const;
export const VERSION_FORMAT = `${VERSION_FORMAT_PREFIX}3` as const;

export type FormatFamily = "tables" | "version";

const prefixOf = (family: FormatFamily) => (family === "tables" ? TABLES_FORMAT_PREFIX : VERSION_FORMAT_PREFIX);
const numbersOf = (family: FormatFamily): readonly number[] =>
  family === "tables" ? TABLES_FORMAT_NUMBERS : VERSION_FORMAT_NUMBERS;

/** The number N of a declared format "cosmoledger.<family>/N", or null when the value is not such a name. */
export function formatNumber(declared: unknown, family: FormatFamily): number | null {
  if (typeof declared !== "string" || !declared.startsWith(prefixOf(family))) return null;
  const rest = declared.slice(prefixOf(family).length);
  return /^[1-9][0-9]{0,8}$/.test(rest) ? Number(rest) : null;
}

/**
 * Why a declared format cannot be read by this release, or null when it can: not a cosmoledger format at all, or
 * a newer one ("written by a newer cosmoledger; upgrade").
 */
export function unreadableFormat(declared: unknown, family: FormatFamily): string | null {
  const n = formatNumber(declared, family);
  const known = numbersOf(family);
  const range = `${prefixOf(family)}${known[0]} to ${prefixOf(family)}${known.at(-1)}`;
  if (n === null)
    return `not a cosmoledger ${family === "tables" ? "tables document" : "version record"} (format ${JSON.stringify(declared ?? null)}; this release reads ${range})`;
  if (n > known.at(-1)!)
    return `written by a newer cosmoledger (format ${declared}; this release reads ${range}); upgrade cosmoledger to read it`;
  if (!known.includes(n)) return `format ${declared} was never released`;
  return null;
}
