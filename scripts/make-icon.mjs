// Draws media/icon.png: the two-level entropy curve S(E)/Nk = H(p) as a dome,
// its inverted half (E above the midpoint, β < 0) tinted. Computed, not drawn
// by hand; plain Node (zlib) so it runs anywhere: `node scripts/make-icon.mjs`.
import { deflateSync } from 'node:zlib';
import { writeFileSync, mkdirSync } from 'node:fs';

const W = 128,
  H = 128,
  pad = 14;
const px = new Uint8Array(W * H * 4);
const set = (x, y, [r, g, b, a]) => {
  if (x < 0 || y < 0 || x >= W || y >= H) return;
  const i = (y * W + x) * 4;
  const k = a / 255,
    j = px[i + 3] / 255;
  const out = k + j * (1 - k);
  for (let c = 0; c < 3; c++) px[i + c] = out ? Math.round(([r, g, b][c] * k + px[i + c] * j * (1 - k)) / out) : 0;
  px[i + 3] = Math.round(out * 255);
};
// Rounded dark tile.
for (let y = 0; y < H; y++)
  for (let x = 0; x < W; x++) {
    const dx = Math.max(0, Math.abs(x - 63.5) - 46),
      dy = Math.max(0, Math.abs(y - 63.5) - 46);
    if (Math.hypot(dx, dy) <= 18) set(x, y, [24, 32, 48, 255]);
  }
const entropy = (p) => (p <= 0 || p >= 1 ? 0 : -p * Math.log(p) - (1 - p) * Math.log(1 - p));
const toY = (s) => H - pad - 8 - (s / Math.LN2) * (H - 2 * pad - 24);
// Tint under the inverted half.
for (let x = 64; x < W - pad; x++) {
  const p = (x - pad) / (W - 2 * pad);
  for (let y = Math.ceil(toY(entropy(p))); y < H - pad - 8; y++) set(x, y, [232, 96, 80, 110]);
}
// The curve, thick and anti-aliased by supersampling.
for (let i = 0; i <= 4000; i++) {
  const p = i / 4000,
    x = pad + p * (W - 2 * pad),
    y = toY(entropy(p));
  for (let dy = -2.2; dy <= 2.2; dy += 0.55)
    for (let dx = -2.2; dx <= 2.2; dx += 0.55)
      if (Math.hypot(dx, dy) <= 2.2) set(Math.round(x + dx), Math.round(y + dy), [250, 210, 90, 60]);
}
// Baseline.
for (let x = pad; x < W - pad; x++) for (let t = 0; t < 2; t++) set(x, H - pad - 8 + t, [200, 210, 225, 255]);

const crcTable = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});
const crc = (buf) => {
  let c = 0xffffffff;
  for (const b of buf) c = crcTable[(c ^ b) & 255] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
};
const chunk = (type, data) => {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const td = Buffer.concat([Buffer.from(type), data]);
  const c = Buffer.alloc(4);
  c.writeUInt32BE(crc(td));
  return Buffer.concat([len, td, c]);
};
const ihdr = Buffer.alloc(13);
ihdr.writeUInt32BE(W, 0);
ihdr.writeUInt32BE(H, 4);
ihdr.set([8, 6, 0, 0, 0], 8);
const raw = Buffer.alloc(H * (W * 4 + 1));
for (let y = 0; y < H; y++) {
  raw[y * (W * 4 + 1)] = 0;
  Buffer.from(px.buffer, y * W * 4, W * 4).copy(raw, y * (W * 4 + 1) + 1);
}
mkdirSync('media', { recursive: true });
writeFileSync(
  'media/icon.png',
  Buffer.concat([
    Buffer.from([137, 80, 78, 71, 13, 10, 26, 10]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(raw)),
    chunk('IEND', Buffer.alloc(0)),
  ]),
);
console.log('wrote media/icon.png');
