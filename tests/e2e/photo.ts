// A board photo made for a test: a PNG of the size phones take (several MB), drawn as a green board with copper
// pads and noise so it does not compress. Stored with no compression (deflate level 0), so its size is predictable.
import { deflateSync } from 'node:zlib';

const CRC_TABLE = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});
function crc32(buf: Buffer): number {
  let c = 0xffffffff;
  for (const b of buf) c = CRC_TABLE[(c ^ b) & 0xff]! ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}
function chunk(type: string, data: Buffer): Buffer {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const td = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(td));
  return Buffer.concat([len, td, crc]);
}

/** An RGB PNG of width × height; 1400 × 1000 is about 4.2 MB. Seeded noise, so runs are alike. */
export function boardPhoto(width = 1400, height = 1000): Buffer {
  let seed = 1;
  const rnd = () => (seed = (seed * 1103515245 + 12345) & 0x7fffffff) / 0x7fffffff;
  const raw = Buffer.alloc((width * 3 + 1) * height);
  for (let y = 0; y < height; y++) {
    const row = y * (width * 3 + 1);
    raw[row] = 0;
    for (let x = 0; x < width; x++) {
      const pad = (x % 140 < 18 && y % 110 < 18) || (y % 220 > 100 && y % 220 < 106);
      const n = Math.floor(rnd() * 40) - 20;
      const [r, g, b] = pad ? [200, 146, 74] : [29, 80, 52];
      raw[row + 1 + x * 3] = Math.max(0, Math.min(255, r + n));
      raw[row + 2 + x * 3] = Math.max(0, Math.min(255, g + n));
      raw[row + 3 + x * 3] = Math.max(0, Math.min(255, b + n));
    }
  }
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr.set([8, 2, 0, 0, 0], 8);
  const sig = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  return Buffer.concat([sig, chunk('IHDR', ihdr), chunk('IDAT', deflateSync(raw, { level: 0 })), chunk('IEND', Buffer.alloc(0))]);
}
