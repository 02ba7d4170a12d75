// Browser stand-in for node:crypto's createHash("sha256") (hex digests of UTF-8 text), with @noble/hashes: the
// hashes a page computes are those the command line writes.
import { sha256 } from "@noble/hashes/sha2.js";
import { bytesToHex, utf8ToBytes } from "@noble/hashes/utils.js";

export function createHash(algorithm: string) {
  if (algorithm !== "sha256") throw new Error(`only sha256 is available in the page, not ${algorithm}`);
  const parts: Uint8Array[] = [];
  const hash = {
    update(data: string | Uint8Array) {
      parts.push(typeof data === "string" ? utf8ToBytes(data) : data);
      return hash;
    },
    digest(_encoding: "hex") {
      const all = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
      let at = 0;
      for (const p of parts) {
        all.set(p, at);
        at += p.length;
      }
      return bytesToHex(sha256(all));
    },
  };
  return hash;
}
