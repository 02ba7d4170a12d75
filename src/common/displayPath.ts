import { relative, resolve, sep } from "node:path";

/** A path as shown in messages and stored in documents: relative to the working folder when inside it, else absolute; forward slashes. */
export function displayPath(file: string): string {
  const rel = relative(process.cwd(), resolve(file));
  return (rel.startsWith("..") ? resolve(file) : rel).split(sep).join("/");
}
