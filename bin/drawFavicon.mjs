// Draws content/assets/favicon.ico (32 and 16 px PNG images in an ICO container) from content/assets/favicon.svg.
// Browsers ask a site's root for /favicon.ico when a page names no icon (an exported HTML fragment opened on its
// own): the site carries one so that the request finds a file. Run after changing the SVG; the ICO is committed.
// ICO layout: Microsoft, "Icons" (ICONDIR and ICONDIRENTRY), with PNG image data as Windows Vista and later read it.
import { readFileSync, writeFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { createCanvas, loadImage } from "@napi-rs/canvas";

const assets = fileURLToPath(new URL("../content/assets/", import.meta.url));
const svg = await loadImage(readFileSync(`${assets}favicon.svg`));
const pngs = [32, 16].map((size) => {
  const canvas = createCanvas(size, size);
  canvas.getContext("2d").drawImage(svg, 0, 0, size, size);
  return { size, data: canvas.toBuffer("image/png") };
});
const header = Buffer.alloc(6 + 16 * pngs.length);
header.writeUInt16LE(0, 0); // reserved
header.writeUInt16LE(1, 2); // type 1: icon
header.writeUInt16LE(pngs.length, 4);
let offset = header.length;
pngs.forEach(({ size, data }, i) => {
  const e = 6 + 16 * i;
  header.writeUInt8(size, e); // width
  header.writeUInt8(size, e + 1); // height
  header.writeUInt8(0, e + 2); // no palette
  header.writeUInt8(0, e + 3); // reserved
  header.writeUInt16LE(1, e + 4); // colour planes
  header.writeUInt16LE(32, e + 6); // bits per pixel
  header.writeUInt32LE(data.length, e + 8);
  header.writeUInt32LE(offset, e + 12);
  offset += data.length;
});
writeFileSync(`${assets}favicon.ico`, Buffer.concat([header, ...pngs.map((p) => p.data)]));
