import { crc32 } from "node:zlib";

/** Inserts tEXt chunks (keyword, Latin-1 text) after IHDR, as the PNG specification (ISO/IEC 15948, section 11.3.4.3) lays them out. */
export function withPngText(png: Buffer, entries: Record<string, string>): Buffer {
  const IHDR_END = 8 + 4 + 4 + 13 + 4; // signature, length, type, IHDR data, CRC
  if (png.toString("latin1", 12, 16) !== "IHDR") throw new Error("not a PNG with a leading IHDR chunk");
  const chunks = Object.entries(entries).map(([keyword, text]) => {
    const data = Buffer.concat([Buffer.from(keyword, "latin1"), Buffer.from([0]), Buffer.from(text.replace(/[^\x20-\x7e\n]/g, "?"), "latin1")]);
    const typeAndData = Buffer.concat([Buffer.from("tEXt", "latin1"), data]);
    const length = Buffer.alloc(4);
    length.writeUInt32BE(data.length);
    const crc = Buffer.alloc(4);
    crc.writeUInt32BE(crc32(typeAndData) >>> 0);
    return Buffer.concat([length, typeAndData, crc]);
  });
  return Buffer.concat([png.subarray(0, IHDR_END), ...chunks, png.subarray(IHDR_END)]);
}
