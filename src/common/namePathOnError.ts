/**
 * Runs `write`; if the file system refuses, removes `cleanup` (a temporary file, when given) and rethrows the error
 * naming `path` (the file the user knows), since Node's write errors on a file descriptor carry no path.
 */
export function namePathOnError<T>(path: string, write: () => T, cleanup?: () => void): T {
  try {
    return write();
  } catch (e) {
    cleanup?.();
    const err = e as NodeJS.ErrnoException;
    if (err && typeof err === "object" && typeof err.code === "string") err.path = path;
    throw e;
  }
}
