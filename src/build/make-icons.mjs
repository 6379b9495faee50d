/**
 * Draws the app icons (a bell curve between two specification limits) as PNG files into static/icons/.
 * Made here rather than downloaded, so the build needs nothing from outside. Pure Node: a tiny rasteriser
 * with 4×4 supersampling and a minimal PNG encoder (RFC 2083: signature, IHDR, IDAT with zlib, IEND).
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { deflateSync } from 'node:zlib';

const INK = [0x1f, 0x3a, 0x4d];
const CURVE = [0xe0, 0xa0, 0x4a];
const PAPER = [0xf6, 0xf4, 0xef];

const CRC_TABLE = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k += 1) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});

function crc32(bytes) {
  let c = 0xffffffff;
  for (const b of bytes) c = CRC_TABLE[(c ^ b) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

function chunk(type, data) {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([length, body, crc]);
}

function encodePng(size, rgba) {
  const header = Buffer.alloc(13);
  header.writeUInt32BE(size, 0);
  header.writeUInt32BE(size, 4);
  header[8] = 8; // bit depth
  header[9] = 6; // colour type RGBA
  const raw = Buffer.alloc((size * 4 + 1) * size);
  for (let y = 0; y < size; y += 1) {
    raw[y * (size * 4 + 1)] = 0; // filter: none
    rgba.copy(raw, y * (size * 4 + 1) + 1, y * size * 4, (y + 1) * size * 4);
  }
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', header),
    chunk('IDAT', deflateSync(raw, { level: 9 })),
    chunk('IEND', Buffer.alloc(0))
  ]);
}

/** Colour of one point of the unit square; `inset` shrinks the drawing for the maskable safe zone. */
function colourAt(x, y, { rounded, inset }) {
  const r = 0.18;
  if (rounded) {
    const cx = Math.min(Math.max(x, r), 1 - r);
    const cy = Math.min(Math.max(y, r), 1 - r);
    if ((x - cx) ** 2 + (y - cy) ** 2 > r * r) return null; // transparent corner
  }
  const u = (x - inset) / (1 - 2 * inset);
  const v = (y - inset) / (1 - 2 * inset);
  // Specification limits at ±2.6σ of the curve, drawn as two paper-coloured bars.
  if (v > 0.14 && v < 0.86 && (Math.abs(u - 0.22) < 0.025 || Math.abs(u - 0.78) < 0.025)) return PAPER;
  const z = (u - 0.5) / 0.107;
  const curveY = 0.8 - 0.6 * Math.exp(-0.5 * z * z);
  if (u > 0.06 && u < 0.94 && Math.abs(v - curveY) < 0.045) return CURVE;
  return INK;
}

function drawIcon(size, options) {
  const rgba = Buffer.alloc(size * size * 4);
  const samples = 4;
  for (let py = 0; py < size; py += 1) {
    for (let px = 0; px < size; px += 1) {
      let rr = 0;
      let gg = 0;
      let bb = 0;
      let aa = 0;
      for (let sy = 0; sy < samples; sy += 1) {
        for (let sx = 0; sx < samples; sx += 1) {
          const c = colourAt((px + (sx + 0.5) / samples) / size, (py + (sy + 0.5) / samples) / size, options);
          if (!c) continue;
          rr += c[0];
          gg += c[1];
          bb += c[2];
          aa += 1;
        }
      }
      const i = (py * size + px) * 4;
      rgba[i] = aa ? Math.round(rr / aa) : 0;
      rgba[i + 1] = aa ? Math.round(gg / aa) : 0;
      rgba[i + 2] = aa ? Math.round(bb / aa) : 0;
      rgba[i + 3] = Math.round((255 * aa) / (samples * samples));
    }
  }
  return encodePng(size, rgba);
}

const outDir = new URL('../../static/icons/', import.meta.url);
mkdirSync(outDir, { recursive: true });
const icons = [
  ['capstan-192.png', 192, { rounded: true, inset: 0.06 }],
  ['capstan-512.png', 512, { rounded: true, inset: 0.06 }],
  // Maskable: full bleed, drawing inside the central 80 % safe zone.
  ['capstan-maskable-512.png', 512, { rounded: false, inset: 0.14 }]
];
for (const [name, size, options] of icons) writeFileSync(new URL(name, outDir), drawIcon(size, options));
console.log(`icons: ${icons.map(([name]) => name).join(', ')} -> static/icons/`);
