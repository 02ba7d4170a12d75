import { crc32 } from "node:zlib";

/**
 * Inserts uncompressed iTXt chunks (keyword, UTF-8 text) after IHDR, laid out as the PNG specification
 * (ISO/IEC 15948, section 11.3.4.5) defines them: keyword, NUL, compression flag 0, method 0, empty language tag,
 * NUL, empty translated keyword, NUL, text.
 */
export function withPngText(png: Buffer, entries: Record<string, string>): Buffer {
  const IHDR_END = 8 + 4 + 4 + 13 + 4; // signature, length, type, IHDR data, CRC
  if (png.toString("latin1", 12, 16) !== "IHDR") throw new Error("not a PNG with a leading IHDR chunk");
  const chunks = Object.entries(entries).map(([keyword, text]) => {
    const data = Buffer.concat([
      Buffer.from(keyword, "latin1"),
      Buffer.from([0, 0, 0, 0, 0]),
      Buffer.from(text, "utf8"),
    ]);
    const typeAndData = Buffer.concat([Buffer.from("iTXt", "latin1"), data]);
    const length = Buffer.alloc(4);
    length.writeUInt32BE(data.length);
    const crc = Buffer.alloc(4);
    crc.writeUInt32BE(crc32(typeAndData) >>> 0);
    return Buffer.concat([length, typeAndData, crc]);
  });
  return Buffer.concat([png.subarray(0, IHDR_END), ...chunks, png.subarray(IHDR_END)]);
}

/**
 * Inserts a pHYs chunk after IHDR recording the print resolution (ISO/IEC 15948, section 11.3.5.3: pixels per unit
 * on each axis, unit 1 = the metre): 300 dpi is 11811 pixels per metre.
 */
export function withPngResolution(png: Buffer, dpi: number): Buffer {
  const IHDR_END = 8 + 4 + 4 + 13 + 4;
  if (png.toString("latin1", 12, 16) !== "IHDR") throw new Error("not a PNG with a leading IHDR chunk");
  const perMetre = Math.round(dpi / 0.0254);
  const data = Buffer.alloc(9);
  data.writeUInt32BE(perMetre, 0);
  data.writeUInt32BE(perMetre, 4);
  data.writeUInt8(1, 8);
  const typeAndData = Buffer.concat([Buffer.from("pHYs", "latin1"), data]);
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(typeAndData) >>> 0);
  return Buffer.concat([png.subarray(0, IHDR_END), length, typeAndData, crc, png.subarray(IHDR_END)]);
}
