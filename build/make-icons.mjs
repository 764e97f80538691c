/**
 * Draws Forelog's logo — a dial on an ink-blue tile, its needle pointing at an amber
 * marker in the dial's gap (a call, placed on the scale) — from one description, and
 * writes it as build/icon.svg and as PNGs for electron-builder and the tray:
 *   build/icon.png (512), build/icons/NxN.png (Linux), build/tray.png and tray@2x.png.
 * Plain Node only (zlib for PNG compression), so any checkout can regenerate them:
 *   node build/make-icons.mjs
 * PNG layout per the PNG specification (W3C, 2nd ed.): signature, IHDR, IDAT, IEND,
 * 8-bit RGBA, filter type 0 on every row, CRC-32 over type and data of each chunk.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { deflateSync } from 'node:zlib';

const here = new URL('./', import.meta.url);
const SIZE = 512; // design units; shapes are scaled to each output size

const INK = [0x1f, 0x3b, 0x57];
const PAPER = [0xf3, 0xed, 0xe2];
const AMBER = [0xe9, 0xa2, 0x3b];

const C = 256; // centre of the dial
const R = 136; // dial radius
const STROKE = 44; // dial line width
const ARC_END = 300; // the dial runs clockwise from 12 o'clock to this angle (degrees)
const MARK_ANGLE = 330; // the marker sits in the gap
const MARK_R = 30;
const NEEDLE = 88; // needle length from the centre
const NEEDLE_W = 24;
const HUB_R = 26;
const TILE = { x: 32, y: 32, w: 448, h: 448, r: 104 };

/** A point at `deg` clockwise from 12 o'clock, `r` from the centre. */
function polar(deg, r) {
  const a = (deg * Math.PI) / 180;
  return [C + r * Math.sin(a), C - r * Math.cos(a)];
}

const arcEnd = polar(ARC_END, R);
const mark = polar(MARK_ANGLE, R);
const needleTip = polar(MARK_ANGLE, NEEDLE);

const hex = (rgb) => `#${rgb.map((v) => v.toString(16).padStart(2, '0')).join('')}`;
const n = (v) => Number(v.toFixed(2));

const svg = `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${SIZE} ${SIZE}" width="${SIZE}" height="${SIZE}">
  <title>Forelog</title>
  <rect x="${TILE.x}" y="${TILE.y}" width="${TILE.w}" height="${TILE.h}" rx="${TILE.r}" fill="${hex(INK)}"/>
  <path d="M ${C} ${C - R} A ${R} ${R} 0 1 1 ${n(arcEnd[0])} ${n(arcEnd[1])}" fill="none" stroke="${hex(PAPER)}" stroke-width="${STROKE}" stroke-linecap="round"/>
  <line x1="${C}" y1="${C}" x2="${n(needleTip[0])}" y2="${n(needleTip[1])}" stroke="${hex(PAPER)}" stroke-width="${NEEDLE_W}" stroke-linecap="round"/>
  <circle cx="${n(mark[0])}" cy="${n(mark[1])}" r="${MARK_R}" fill="${hex(AMBER)}"/>
  <circle cx="${C}" cy="${C}" r="${HUB_R}" fill="${hex(AMBER)}"/>
</svg>
`;

// Signed distances (negative inside) for the same shapes, in design units.
function roundedBox(x, y) {
  const hx = TILE.w / 2 - TILE.r;
  const hy = TILE.h / 2 - TILE.r;
  const qx = Math.abs(x - (TILE.x + TILE.w / 2)) - hx;
  const qy = Math.abs(y - (TILE.y + TILE.h / 2)) - hy;
  return Math.hypot(Math.max(qx, 0), Math.max(qy, 0)) + Math.min(Math.max(qx, qy), 0) - TILE.r;
}
function segment(x, y, [ax, ay], [bx, by], width) {
  const t = Math.max(0, Math.min(1, ((x - ax) * (bx - ax) + (y - ay) * (by - ay)) / ((bx - ax) ** 2 + (by - ay) ** 2)));
  return Math.hypot(x - (ax + t * (bx - ax)), y - (ay + t * (by - ay))) - width / 2;
}
function dial(x, y) {
  let deg = (Math.atan2(x - C, -(y - C)) * 180) / Math.PI;
  if (deg < 0) deg += 360;
  if (deg <= ARC_END) return Math.abs(Math.hypot(x - C, y - C) - R) - STROKE / 2;
  const [sx, sy] = polar(0, R);
  return Math.min(Math.hypot(x - sx, y - sy), Math.hypot(x - arcEnd[0], y - arcEnd[1])) - STROKE / 2;
}
const disc = (x, y, [cx, cy], r) => Math.hypot(x - cx, y - cy) - r;

/** Topmost colour at a design point, or null outside the tile. Painted in SVG order. */
function colourAt(x, y) {
  if (disc(x, y, [C, C], HUB_R) <= 0) return AMBER;
  if (disc(x, y, mark, MARK_R) <= 0) return AMBER;
  if (segment(x, y, [C, C], needleTip, NEEDLE_W) <= 0) return PAPER;
  if (dial(x, y) <= 0) return PAPER;
  if (roundedBox(x, y) <= 0) return INK;
  return null;
}

/** RGBA pixels, 4×4 samples per pixel for smooth edges (premultiplied, then divided out). */
function rasterize(px) {
  const grid = 4;
  const out = Buffer.alloc(px * px * 4);
  const scale = SIZE / px;
  for (let j = 0; j < px; j += 1) {
    for (let i = 0; i < px; i += 1) {
      let r = 0, g = 0, b = 0, a = 0;
      for (let sj = 0; sj < grid; sj += 1) {
        for (let si = 0; si < grid; si += 1) {
          const c = colourAt((i + (si + 0.5) / grid) * scale, (j + (sj + 0.5) / grid) * scale);
          if (c === null) continue;
          r += c[0]; g += c[1]; b += c[2]; a += 1;
        }
      }
      const o = (j * px + i) * 4;
      if (a > 0) {
        out[o] = Math.round(r / a);
        out[o + 1] = Math.round(g / a);
        out[o + 2] = Math.round(b / a);
        out[o + 3] = Math.round((255 * a) / (grid * grid));
      }
    }
  }
  return out;
}

const CRC_TABLE = Array.from({ length: 256 }, (_, k) => {
  let c = k;
  for (let bit = 0; bit < 8; bit += 1) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});
function crc32(bytes) {
  let c = 0xffffffff;
  for (const byte of bytes) c = CRC_TABLE[(c ^ byte) & 0xff] ^ (c >>> 8);
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
function png(px) {
  const rgba = rasterize(px);
  const rows = Buffer.alloc(px * (px * 4 + 1));
  for (let j = 0; j < px; j += 1) rgba.copy(rows, j * (px * 4 + 1) + 1, j * px * 4, (j + 1) * px * 4);
  const header = Buffer.alloc(13);
  header.writeUInt32BE(px, 0);
  header.writeUInt32BE(px, 4);
  header.set([8, 6, 0, 0, 0], 8); // 8-bit depth, RGBA, deflate, adaptive filtering, no interlace
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', header),
    chunk('IDAT', deflateSync(rows, { level: 9 })),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

mkdirSync(new URL('icons/', here), { recursive: true });
const outputs = [
  ['icon.svg', () => svg],
  ['icon.png', () => png(512)],
  ...[512, 256, 128, 64, 32, 16].map((px) => [`icons/${px}x${px}.png`, () => png(px)]),
  ['tray.png', () => png(32)],
  ['tray@2x.png', () => png(64)],
];
for (const [name, make] of outputs) {
  const data = make();
  writeFileSync(new URL(name, here), data);
  console.log(`build/${name} (${data.length} bytes)`);
}
