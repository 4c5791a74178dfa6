#!/usr/bin/env node
// Draws Fanwise's own icon (a fan of three ochre bands around a plum mean line, growing from a
// graphite history stub) at 16, 32, 64 and 80 px into assets/. Pure Node: zlib + a PNG writer.
// Run: node scripts/make-icons.js   (the PNGs are committed; this is their generator)
"use strict";
const fs = require("fs");
const path = require("path");
const zlib = require("zlib");

const COLORS = {
  paper: [255, 253, 248, 255],
  band95: [244, 227, 191, 255],
  band80: [233, 194, 122, 255],
  band50: [212, 151, 58, 255],
  plum: [90, 45, 130, 255],
  graphite: [59, 59, 59, 255],
  edge: [217, 210, 195, 255],
};

// Colour of the point (x, y) in the unit square (y down).
function shade(x, y) {
  const r = 0.12; // rounded-square background
  const dx = Math.max(r - x, 0, x - (1 - r));
  const dy = Math.max(r - y, 0, y - (1 - r));
  if (dx * dx + dy * dy > r * r) return [0, 0, 0, 0];
  const ox = 0.36, oy = 0.6; // forecast origin
  if (x >= ox) {
    const t = x - ox;
    const centre = oy - 0.22 * t; // the mean line rises a little
    const off = y - centre;
    const up = off < 0 ? 1.25 : 0.8; // skewed upwards, as a back-transformed fan is
    const a = Math.abs(off) / up;
    if (Math.abs(off) < 0.04) return COLORS.plum;
    if (a < 0.13 * t + 0.015) return COLORS.band50;
    if (a < 0.25 * t + 0.015) return COLORS.band80;
    if (a < 0.4 * t + 0.015) return COLORS.band95;
  } else if (x > 0.1) {
    // history: a graphite polyline into the origin
    const pts = [[0.1, 0.66], [0.18, 0.56], [0.25, 0.68], [0.31, 0.58], [ox, oy]];
    for (let k = 0; k + 1 < pts.length; k++) {
      const [x0, y0] = pts[k], [x1, y1] = pts[k + 1];
      if (x >= x0 && x <= x1) {
        const hy = y0 + ((y1 - y0) * (x - x0)) / (x1 - x0);
        const slope = (y1 - y0) / (x1 - x0);
        if (Math.abs(y - hy) < 0.045 * Math.sqrt(1 + slope * slope)) return COLORS.graphite;
      }
    }
  }
  return COLORS.paper;
}

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
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const td = Buffer.concat([Buffer.from(type, "ascii"), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(td));
  return Buffer.concat([len, td, crc]);
}

function png(size) {
  const ss = 4;
  const raw = Buffer.alloc(size * (size * 4 + 1));
  for (let j = 0; j < size; j++) {
    raw[j * (size * 4 + 1)] = 0;
    for (let i = 0; i < size; i++) {
      const acc = [0, 0, 0, 0];
      for (let a = 0; a < ss; a++) for (let b = 0; b < ss; b++) {
        const c = shade((i + (a + 0.5) / ss) / size, (j + (b + 0.5) / ss) / size);
        acc[0] += c[0] * c[3]; acc[1] += c[1] * c[3]; acc[2] += c[2] * c[3]; acc[3] += c[3];
      }
      const o = j * (size * 4 + 1) + 1 + i * 4;
      const alpha = acc[3] / (ss * ss);
      raw[o] = acc[3] ? Math.round(acc[0] / acc[3]) : 0;
      raw[o + 1] = acc[3] ? Math.round(acc[1] / acc[3]) : 0;
      raw[o + 2] = acc[3] ? Math.round(acc[2] / acc[3]) : 0;
      raw[o + 3] = Math.round(alpha);
    }
  }
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(size, 0);
  ihdr.writeUInt32BE(size, 4);
  ihdr[8] = 8; ihdr[9] = 6; ihdr[10] = 0; ihdr[11] = 0; ihdr[12] = 0;
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk("IHDR", ihdr),
    chunk("IDAT", zlib.deflateSync(raw, { level: 9 })),
    chunk("IEND", Buffer.alloc(0)),
  ]);
}

const out = path.join(__dirname, "..", "assets");
fs.mkdirSync(out, { recursive: true });
for (const s of [16, 32, 64, 80, 128]) fs.writeFileSync(path.join(out, `icon-${s}.png`), png(s));
console.log("wrote assets/icon-{16,32,64,80,128}.png");
