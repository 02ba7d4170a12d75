// The bounded writer of export files: behaviour checked against its contract (no external value is involved).
import { describe, expect, it } from "vitest";
import { writeExportFiles } from "../../src/exports/exportFiles.js";

describe("writeExportFiles", () => {
  it("writes every file, never has more than the limit of images pending, and keeps text files in order", async () => {
    let pending = 0;
    let most = 0;
    const image = (n: number) => async () => {
      pending++;
      most = Math.max(most, pending);
      await new Promise((r) => setTimeout(r, 2));
      pending--;
      return Buffer.from(String(n));
    };
    const files = [
      { name: "t1", content: "a" },
      ...Array.from({ length: 10 }, (_, i) => ({ name: `i${i}`, content: image(i) })),
      { name: "t2", content: "b" },
    ];
    const written: string[] = [];
    await writeExportFiles(files, (f) => written.push(f.name), 3);
    expect(written.sort()).toEqual(files.map((f) => f.name).sort());
    expect(most).toBeLessThanOrEqual(3);
  });

  it("a failed image is raised once the started ones settle, with no unhandled rejection from the others", async () => {
    const files = [
      { name: "a", content: () => Promise.reject(new Error("first")) },
      { name: "b", content: () => Promise.reject(new Error("second")) },
      { name: "c", content: () => Promise.resolve(Buffer.from("c")) },
    ];
    await expect(writeExportFiles(files, () => {}, 2)).rejects.toThrow("first");
  });
});
