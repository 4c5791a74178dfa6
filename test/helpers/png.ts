// A small PNG reader for tests: 8-bit RGB or RGBA, non-interlaced (what resvg and ImageMagick's
// PNG32: write), decoded by the PNG specification (W3C PNG 2nd ed., §9 filters) with Node's zlib.
import * as zlib from "zlib";

export interface Png { width: number; height: number; pixel: (x: number, y: number) => [number, number, number, number] }

export function readPng(buf: Buffer): Png {
  if (buf.readUInt32BE(0) !== 0x89504e47) throw new Error("not a PNG");
  let pos = 8;
  let width = 0;
  let height = 0;
  let channels = 4;
  const idat: Buffer[] = [];
  while (pos < buf.length) {
    const len = buf.readUInt32BE(pos);
    const type = buf.toString("latin1", pos + 4, pos + 8);
    const data = buf.subarray(pos + 8, pos + 8 + len);
    if (type === "IHDR") {
      width = data.readUInt32BE(0);
      height = data.readUInt32BE(4);
      const depth = data[8];
      const colour = data[9];
      if (depth !== 8 || (colour !== 6 && colour !== 2) || data[12] !== 0) throw new Error(`unsupported PNG (depth ${depth}, colour type ${colour}, interlace ${data[12]})`);
      channels = colour === 6 ? 4 : 3;
    } else if (type === "IDAT") idat.push(data);
    pos += 12 + len;
  }
  const raw = zlib.inflateSync(Buffer.concat(idat));
  const stride = width * channels;
  const out = Buffer.alloc(height * stride);
  for (let y = 0; y < height; y++) {
    const f = raw[y * (stride + 1)];
    const line = raw.subarray(y * (stride + 1) + 1, (y + 1) * (stride + 1));
    for (let i = 0; i < stride; i++) {
      const a = i >= channels ? out[y * stride + i - channels] : 0;
      const b = y > 0 ? out[(y - 1) * stride + i] : 0;
      const c = i >= channels && y > 0 ? out[(y - 1) * stride + i - channels] : 0;
      let v = line[i];
      if (f === 1) v += a;
      else if (f === 2) v += b;
      else if (f === 3) v += (a + b) >> 1;
      else if (f === 4) {
        const p = a + b - c;
        const pa = Math.abs(p - a);
        const pb = Math.abs(p - b);
        const pc = Math.abs(p - c);
        v += pa <= pb && pa <= pc ? a : pb <= pc ? b : c;
      }
      out[y * stride + i] = v & 255;
    }
  }
  return {
    width,
    height,
    pixel: (x, y) => {
      const o = Math.round(y) * stride + Math.round(x) * channels;
      return [out[o], out[o + 1], out[o + 2], channels === 4 ? out[o + 3] : 255];
    },
  };
}

/** Distance between two colours (RGB, 0–441). */
export function colourDistance(p: [number, number, number, number], hex: string): number {
  const n = parseInt(hex.slice(1), 16);
  return Math.hypot(p[0] - (n >> 16), p[1] - ((n >> 8) & 255), p[2] - (n & 255));
}
