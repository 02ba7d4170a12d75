import { createCanvas, SvgExportFlag } from "@napi-rs/canvas";
const variants = { paths: SvgExportFlag.ConvertTextToPaths, text: SvgExportFlag.NoPrettyXML, relative: SvgExportFlag.RelativePathEncoding };
for (const [name, flag] of Object.entries(variants)) {
  const c = createCanvas(600, 340, flag);
  const ctx = c.getContext("2d");
  ctx.beginPath(); for (let i = 0; i < 1000; i++) ctx.lineTo(i * 0.6, 100 + 50 * Math.sin(i / 30)); ctx.stroke();
  ctx.setLineDash([9, 4]); ctx.beginPath(); for (let i = 0; i < 1000; i++) ctx.lineTo(i * 0.6, 200 + 50 * Math.sin(i / 30)); ctx.stroke();
  ctx.font = "12px sans-serif"; ctx.fillText("Hello world 12345", 10, 20);
  console.log(name, c.getContent().length);
}
console.log(Object.keys(SvgExportFlag));
