import { crc32 } from "node:zlib";

/** Where the chunks after the signature and IHDR begin: signature, length, type, IHDR data, CRC. */
const IHDR_END = 8 + 4 + 4 + 13 + 4;

/** One PNG chunk: length, type, data, CRC of type and data (ISO/IEC 15948, section 5.3). */
function chunk(type: string, data: Buffer): Buffer {
  const typeAndData = Buffer.concat([Buffer.from(type, "latin1"), data]);
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(typeAndData) >>> 0);
  return Buffer.concat([length, typeAndData, crc]);
}

/** The PNG with chunks inserted right after IHDR (where both iTXt and pHYs may stand). */
function afterIhdr(png: Buffer, chunks: Buffer[]): Buffer {
  if (png.toString("latin1", 12, 16) !== "IHDR") throw new Error("not a PNG with a leading IHDR chunk");
  return Buffer.concat([png.subarray(0, IHDR_END), ...chunks, png.subarray(IHDR_END)]);
}

/**
 * Inserts uncompressed iTXt chunks (keyword, UTF-8 text) after IHDR, laid out as the PNG specification
 * (ISO/IEC 15948, section 11.3.4.5) defines them: keyword, NUL, compression flag 0, method 0, empty language tag,
 * NUL, empty translated keyword, NUL, text.
 */
export function withPngText(png: Buffer, entries: Record<string, string>): Buffer {
  return afterIhdr(
    png,
    Object.entries(entries).map(([keyword, text]) =>
      chunk(
        "iTXt",
        Buffer.concat([Buffer.from(keyword, "latin1"), Buffer.from([0, 0, 0, 0, 0]), Buffer.from(text, "utf8")]),
      ),
    ),
  );
}

/**
 * Inserts a pHYs chunk after IHDR recording the print resolution (ISO/IEC 15948, section 11.3.5.3: pixels per unit
 * on each axis, unit 1 = the metre): 300 dpi is 11811 pixels per metre.
 */
export function withPngResolution(png: Buffer, dpi: number): Buffer {
  const perMetre = Math.round(dpi / 0.0254);
  const data = Buffer.alloc(9);
  data.writeUInt32BE(perMetre, 0);
  data.writeUInt32BE(perMetre, 4);
  data.writeUInt8(1, 8);
  return afterIhdr(png, [chunk("pHYs", data)]);
}
