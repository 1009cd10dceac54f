// Draws the add-in's icons (a teal tile crossed by a white fracture line) as
// PNG files with no image library: raw RGBA rows, zlib, and the PNG chunks.
import { deflateSync } from "node:zlib";
import { writeFileSync, mkdirSync } from "node:fs";

const CRC_TABLE = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});
function crc32(buf) {
  let c = 0xffffffff;
  for (const b of buf) c = CRC_TABLE[(c ^ b) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}
function chunk(type, data) {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, "ascii"), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([len, body, crc]);
}
function png(size) {
  const rows = [];
  // The fracture: a zigzag from the top-left third to the bottom-right third.
  const path = [[0.3, 0.0], [0.45, 0.35], [0.35, 0.55], [0.6, 0.75], [0.55, 1.0]];
  const nearCrack = (x, y) => {
    for (let i = 0; i < path.length - 1; i++) {
      const [x1, y1] = path[i];
      const [x2, y2] = path[i + 1];
      const t = Math.max(0, Math.min(1, ((x - x1) * (x2 - x1) + (y - y1) * (y2 - y1)) / ((x2 - x1) ** 2 + (y2 - y1) ** 2)));
      const d = Math.hypot(x - (x1 + t * (x2 - x1)), y - (y1 + t * (y2 - y1)));
      if (d < Math.max(0.045, 0.9 / size)) return true;
    }
    return false;
  };
  for (let y = 0; y < size; y++) {
    const row = [0];
    for (let x = 0; x < size; x++) {
      const u = (x + 0.5) / size;
      const v = (y + 0.5) / size;
      const corner = Math.min(u, v, 1 - u, 1 - v) < 0.06 && Math.hypot(Math.min(u, 1 - u) - 0.12, Math.min(v, 1 - v) - 0.12) > 0.12 && Math.min(u, 1 - u) < 0.12 && Math.min(v, 1 - v) < 0.12;
      if (corner) row.push(0, 0, 0, 0);
      else if (nearCrack(u, v)) row.push(255, 255, 255, 255);
      else row.push(15, 110, 106, 255);
    }
    rows.push(Buffer.from(row));
  }
  const header = Buffer.alloc(13);
  header.writeUInt32BE(size, 0);
  header.writeUInt32BE(size, 4);
  header[8] = 8;
  header[9] = 6;
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk("IHDR", header),
    chunk("IDAT", deflateSync(Buffer.concat(rows))),
    chunk("IEND", Buffer.alloc(0)),
  ]);
}
mkdirSync("taskpane/assets", { recursive: true });
for (const size of [16, 32, 64, 80, 128]) writeFileSync(`taskpane/assets/icon-${size}.png`, png(size));
console.log("wrote taskpane/assets/icon-{16,32,64,80,128}.png");
