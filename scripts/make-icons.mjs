// Draws the Askew icons (assets/icon-16.png, -32, -64, -80, -128): a skewed density curve over a slate tile,
// its left tail shaded amber. Our own design; pure Node (zlib) so it runs anywhere: node scripts/make-icons.mjs
import { writeFileSync, mkdirSync } from "node:fs";
import { deflateSync } from "node:zlib";

const tile = [31, 60, 77];     // slate blue
const curve = [245, 247, 250]; // near white
const tail = [242, 165, 65];   // amber

function crc32(buf) {
  let c, crc = 0xffffffff;
  for (let n = 0; n < buf.length; n++) {
    c = (crc ^ buf[n]) & 0xff;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    crc = (crc >>> 8) ^ c;
  }
  return (crc ^ 0xffffffff) >>> 0;
}
function chunk(type, data) {
  const len = Buffer.alloc(4); len.writeUInt32BE(data.length);
  const td = Buffer.concat([Buffer.from(type), data]);
  const crc = Buffer.alloc(4); crc.writeUInt32BE(crc32(td));
  return Buffer.concat([len, td, crc]);
}
function png(size, rgba) {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(size, 0); ihdr.writeUInt32BE(size, 4); ihdr[8] = 8; ihdr[9] = 6;
  const raw = Buffer.alloc(size * (size * 4 + 1));
  for (let y = 0; y < size; y++) { raw[y * (size * 4 + 1)] = 0; rgba.copy(raw, y * (size * 4 + 1) + 1, y * size * 4, (y + 1) * size * 4); }
  return Buffer.concat([Buffer.from([137, 80, 78, 71, 13, 10, 26, 10]), chunk("IHDR", ihdr), chunk("IDAT", deflateSync(raw)), chunk("IEND", Buffer.alloc(0))]);
}
// Density of a left-skewed generalized normal (shape 0.45), mapped to the unit square.
function density(u) {
  const x = (u - 0.62) * 5.2, k = 0.45;
  const t = 1 - k * x;
  if (t <= 0) return 0;
  const y = -Math.log(t) / k;
  return Math.exp(k * y - (y * y) / 2) / Math.sqrt(2 * Math.PI);
}
function shade(u, v) {
  // u, v in [0,1], v up. Rounded tile mask first.
  const r = 0.18, cx = Math.min(Math.max(u, r), 1 - r), cy = Math.min(Math.max(v, r), 1 - r);
  if ((u - cx) ** 2 + (v - cy) ** 2 > r * r) return null;
  const base = 0.16, h = 0.6 / 0.5;
  const top = base + density(u) * h;
  const line = Math.abs(v - top) < 0.045 && u > 0.08 && u < 0.94;
  if (line) return curve;
  if (v > base && v < top && u < 0.36 && u > 0.08) return tail;
  if (Math.abs(v - base) < 0.02 && u > 0.08 && u < 0.94) return curve;
  return tile;
}
mkdirSync("assets", { recursive: true });
for (const size of [16, 32, 64, 80, 128]) {
  const ss = 4, buf = Buffer.alloc(size * size * 4);
  for (let py = 0; py < size; py++) for (let px = 0; px < size; px++) {
    let acc = [0, 0, 0], a = 0;
    for (let sy = 0; sy < ss; sy++) for (let sx = 0; sx < ss; sx++) {
      const c = shade((px + (sx + 0.5) / ss) / size, 1 - (py + (sy + 0.5) / ss) / size);
      if (c) { acc = acc.map((s, i) => s + c[i]); a++; }
    }
    const o = (py * size + px) * 4;
    if (a) { buf[o] = acc[0] / a; buf[o + 1] = acc[1] / a; buf[o + 2] = acc[2] / a; }
    buf[o + 3] = Math.round((255 * a) / (ss * ss));
  }
  writeFileSync(`assets/icon-${size}.png`, png(size, buf));
}
console.log("icons written to assets/");
