import { displayPath } from "../common/displayPath.js";

/** Exit status when the system refuses (permission, read-only, full disk, quota); a path of the wrong kind is 2. */
export const FILE_SYSTEM_EXIT = 4;

const ADVICE: Record<string, string> = {
  EACCES: "permission denied; check the file's and its folder's permissions, or choose another path",
  EPERM: "operation not permitted; check permissions, or choose another path",
  EROFS: "the file system is read-only; choose a writable --out or --archive",
  ENOSPC: "no space left on the device; free some space or choose another --out",
  EDQUOT: "disk quota exceeded; free some space or choose another --out",
  EIO: "input/output error from the device; check the disk",
  ENOTDIR: "a part of the path is a file, not a folder; choose another path",
  EISDIR: "it is a folder where a file was expected",
  ENOENT: "no such file or folder (or a symbolic link whose target is gone)",
  ELOOP: "too many symbolic links (a link pointing to itself?)",
  EMFILE: "too many open files; raise the limit (ulimit -n) or try again",
  ENAMETOOLONG: "the path is too long",
  EEXIST: "it already exists",
  EBUSY: "the file or folder is busy",
  EXDEV: "cannot move between file systems; put --out on the same file system as its parent",
};

/**
 * A one-line message for an error the file system raised (Node's errors carry code, syscall and path), or null when
 * the error is not one (then it is a bug and reaches the unexpected-failure path).
 */
export function fileSystemRefusal(error: unknown): string | null {
  const e = error as NodeJS.ErrnoException;
  if (!e || typeof e !== "object" || typeof e.code !== "string" || !(e.code in ADVICE)) return null;
  const where = e.path ? displayPath(e.path) : "(a file)";
  return `error: ${where}: cannot ${e.syscall ?? "access"} it: ${ADVICE[e.code]} (${e.code}); anything half-written was removed`;
}
