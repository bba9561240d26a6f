#!/usr/bin/env node
// The whole-process reference for `skyspan info` on a float32 HEALPix map: a
// plain Node script (no skyspan code) that reads the FITS file, walks its
// headers (2880-byte blocks of 80-character cards up to END) and sums the
// big-endian float32 values of the binary table in a DataView loop.
// Usage: node bench/readSumBigEndian.mjs FILE   (prints the sum and the value count)
import { readFileSync } from 'node:fs';

const buf = readFileSync(process.argv[2]);
const dv = new DataView(buf.buffer, buf.byteOffset, buf.byteLength);
let pos = 0, sum = 0, count = 0;
while (pos < buf.length) {
  const cards = {};
  for (let end = false; !end; pos += 2880) {
    for (let c = 0; c < 36 && !end; c++) {
      const card = buf.toString('latin1', pos + 80 * c, pos + 80 * c + 80);
      const key = card.slice(0, 8).trim();
      if (key === 'END') end = true;
      else if (card[8] === '=') cards[key] = card.slice(10).split('/')[0].trim().replace(/'/g, '').trim();
    }
  }
  const naxis = Number(cards.NAXIS ?? 0);
  let bytes = naxis ? Math.abs(Number(cards.BITPIX)) / 8 : 0;
  for (let k = 1; k <= naxis; k++) bytes *= Number(cards[`NAXIS${k}`]);
  bytes += Number(cards.PCOUNT ?? 0);
  if (cards.XTENSION === 'BINTABLE') {
    const start = pos, n = Number(cards.NAXIS1) * Number(cards.NAXIS2) / 4;
    for (let i = 0, p = start; i < n; i++, p += 4) sum += dv.getFloat32(p, false);
    count += n;
  }
  pos += Math.ceil(bytes / 2880) * 2880;
}
process.stdout.write(`${sum} ${count}\n`);
