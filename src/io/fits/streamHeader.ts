/**
 * Reading the next HDU's header from a {@link ByteStream}: 2880-byte blocks
 * up to the one holding the END card (Pence et al. 2010, A&A 524, A42,
 * section 4.4.1), parsed by header.ts with byte offsets counted from the
 * start of the (decompressed) file.
 */
import { InputError } from '../../core/errors.js';
import type { ByteStream } from './byteStream.js';
import { BLOCK, CARD, FitsHeader, readHeader } from './header.js';
import { locateHdu, type Hdu } from './hdu.js';

/** Largest header accepted from a stream (bytes): 1000 blocks of 36 cards. */
const MAX_HEADER_BYTES = 1000 * BLOCK;

function hasEnd(block: Uint8Array): boolean {
  for (let p = 0; p < BLOCK; p += CARD) {
    if (block[p] === 69 && block[p + 1] === 78 && block[p + 2] === 68) { // 'END'
      let blank = true;
      for (let j = 3; j < 8; j++) if (block[p + j] !== 32) { blank = false; break; }
      if (blank) return true;
    }
  }
  return false;
}

/**
 * Reads and locates the HDU whose header starts at the stream's position
 * (`index` its number in the file), or returns null when, after the first
 * HDU, the file ends or goes on with bytes that are not an extension.
 */
export async function readStreamHdu(stream: ByteStream, index: number): Promise<Hdu | null> {
  const start = stream.offset;
  const blocks: Buffer[] = [];
  for (;;) {
    const block = Buffer.alloc(BLOCK);
    const got = await stream.readInto(block, BLOCK);
    if (index > 0 && blocks.length === 0) {
      // after the first HDU, fill or bytes that are not an extension end the file (as walkHdus treats them)
      if (got < 8 || block.toString('latin1', 0, 8) !== 'XTENSION') return null;
    }
    if (index === 0 && blocks.length === 0) {
      // the checks walkHdus makes first, with its messages
      if (got < BLOCK) {
        throw new InputError(`file has ${got} bytes, less than one 2880-byte FITS block`, { file: stream.file, byteOffset: got },
          'the file is truncated or not FITS');
      }
      if (block.toString('latin1', 0, 9) !== 'SIMPLE  =') {
        throw new InputError('the file does not start with SIMPLE', { file: stream.file, byteOffset: 0 }, 'this is not a FITS file');
      }
    }
    if (got < BLOCK) {
      throw new InputError(`header starting at byte ${start} has no END card before the end of the file`,
        { file: stream.file, byteOffset: stream.offset }, 'the file is truncated or not FITS');
    }
    blocks.push(block);
    if (hasEnd(block)) break;
    if (blocks.length * BLOCK >= MAX_HEADER_BYTES) {
      throw new InputError(`header starting at byte ${start} has no END card in its first ${MAX_HEADER_BYTES} bytes`,
        { file: stream.file, byteOffset: start }, 'the header is damaged or its END card is missing');
    }
  }
  const bytes = Buffer.concat(blocks);
  const h = readHeader(bytes, 0, stream.file);
  const cards = h.cards.map((c) => ({ ...c, byteOffset: c.byteOffset + start }));
  const header = new FitsHeader(cards, start, start + h.end, stream.file, h.notes);
  return locateHdu(Infinity, header, index, stream.file);
}

/** Skips the data of `hdu` and its padding to the next 2880-byte block; a cut-short stream is an InputError. */
export async function skipHduData(stream: ByteStream, hdu: Hdu): Promise<void> {
  const got = await stream.skip(hdu.dataBytes);
  if (got < hdu.dataBytes) throw stream.truncated(`the data of HDU ${hdu.index}`, hdu.dataBytes - got);
  await skipPadding(stream, hdu);
}

/** Skips the fill after `hdu`'s data up to the next 2880-byte block (a missing last fill is tolerated). */
export async function skipPadding(stream: ByteStream, hdu: Hdu): Promise<void> {
  const padded = Math.ceil(hdu.dataBytes / BLOCK) * BLOCK;
  await stream.skip(padded - hdu.dataBytes);
}
