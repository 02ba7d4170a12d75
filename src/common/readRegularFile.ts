import { closeSync, constants, fstatSync, lstatSync, openSync, readFileSync } from "node:fs";

/**
 * The bytes of a regular file, or why it cannot be read as a scenario. Opened without blocking and checked with
 * fstat before reading, so a FIFO or device named *.yaml is refused instead of hanging the command.
 */
export function readRegularFile(
  file: string,
  maxBytes = Infinity,
): { bytes: Buffer } | { why: string; tooLarge?: number } {
  let fd: number;
  try {
    fd = openSync(file, constants.O_RDONLY | constants.O_NONBLOCK);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === "ENOENT" && isLink(file)) return { why: "is a symbolic link whose target does not exist" };
    if (code === "ENOENT") return { why: "does not exist" };
    if (code === "ENOTDIR") return { why: "has a file where a folder should be in its path" };
    // The system refused (permission, I/O error, too many open files): the command's file-system exit, not input.
    throw e;
  }
  try {
    const st = fstatSync(fd);
    if (st.isDirectory()) return { why: "is a folder, not a scenario file" };
    if (!st.isFile()) return { why: "is not a regular file (a FIFO, socket or device); only regular files are read" };
    // The size is known before a byte is read: a huge or sparse file is refused at once.
    if (st.size > maxBytes) return { why: `is ${st.size} bytes; at most ${maxBytes} are read`, tooLarge: st.size };
    return { bytes: readFileSync(fd) };
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === "EISDIR") return { why: "is a folder, not a scenario file" };
    (e as NodeJS.ErrnoException).path ??= file;
    throw e;
  } finally {
    closeSync(fd);
  }
}

export const isLink = (file: string) => {
  try {
    return lstatSync(file).isSymbolicLink();
  } catch {
    return false;
  }
};
