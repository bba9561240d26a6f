/**
 * Big-endian decoding into typed arrays (FITS stores every number big-endian,
 * Pence et al. 2010, A&A 524, A42, section 5). Contiguous runs are byte-swapped
 * with Node's native Buffer.swap16/32/64 (in place when the caller owns the
 * bytes, else on a copy) and viewed as a typed array; interleaved table columns
 * are gathered with a DataView loop.
 */

/** Element types a FITS array or column can decode to. */
export type ElementType = 'uint8' | 'int16' | 'int32' | 'int64' | 'float32' | 'float64';

/** The typed array each element type decodes to; int64 becomes Float64Array (exact below 2^53). */
export type DecodedArray = Uint8Array | Int16Array | Int32Array | Float32Array | Float64Array;

/** Size in bytes of one element. */
export function elementBytes(t: ElementType): number {
  return t === 'uint8' ? 1 : t === 'int16' ? 2 : t === 'int32' || t === 'float32' ? 4 : 8;
}

function view(buf: Buffer, t: ElementType, count: number): DecodedArray {
  const ab = buf.buffer, off = buf.byteOffset;
  switch (t) {
    case 'uint8': return new Uint8Array(ab, off, count);
    case 'int16': return new Int16Array(ab, off, count);
    case 'int32': return new Int32Array(ab, off, count);
    case 'float32': return new Float32Array(ab, off, count);
    case 'float64': return new Float64Array(ab, off, count);
    case 'int64': {
      const big = new BigInt64Array(ab, off, count);
      const out = new Float64Array(count);
      for (let i = 0; i < count; i++) out[i] = Number(big[i]);
      return out;
    }
  }
}

/**
 * Decodes `count` contiguous big-endian elements starting at `offset`.
 * With `inPlace` the source bytes are swapped where they lie (the source is
 * changed) and the result shares memory with it when aligned.
 */
export function decodeContiguous(bytes: Uint8Array, offset: number, count: number, t: ElementType, inPlace = false): DecodedArray {
  const size = elementBytes(t);
  const n = count * size;
  const aligned = (bytes.byteOffset + offset) % size === 0;
  let buf: Buffer;
  if (inPlace && aligned) {
    buf = Buffer.from(bytes.buffer, bytes.byteOffset + offset, n);
  } else {
    buf = Buffer.allocUnsafeSlow(n);
    buf.set(bytes.subarray(offset, offset + n));
  }
  if (size === 2) buf.swap16();
  else if (size === 4) buf.swap32();
  else if (size === 8) buf.swap64();
  return view(buf, t, count);
}

/** Allocates the output array for `count` elements of type `t`. */
export function allocate(t: ElementType, count: number): DecodedArray {
  switch (t) {
    case 'uint8': return new Uint8Array(count);
    case 'int16': return new Int16Array(count);
    case 'int32': return new Int32Array(count);
    case 'float32': return new Float32Array(count);
    case 'float64': case 'int64': return new Float64Array(count);
  }
}

/**
 * Gathers an interleaved column: `rows` rows of `rowBytes` bytes starting at
 * `start`, the column at byte `colOffset` of each row with `repeat` elements.
 * Output is row-major (row r's elements at r*repeat .. r*repeat+repeat-1).
 */
export function decodeStrided(bytes: Uint8Array, start: number, rows: number, rowBytes: number, colOffset: number,
  repeat: number, t: ElementType): DecodedArray {
  const out = allocate(t, rows * repeat);
  gatherBigEndian(bytes, start, rows, rowBytes, colOffset, repeat, elementBytes(t), t, out);
  return out;
}

/**
 * Kernel: reads `perRow` big-endian elements of type `t` from each of `rows`
 * rows (`rowBytes` apart, the first at `start + colOffset`, then every
 * `stepBytes`) into out[0 .. rows*perRow), row-major. The caller has checked
 * every offset against `bytes`.
 */
export function gatherBigEndian(bytes: Uint8Array, start: number, rows: number, rowBytes: number, colOffset: number,
  perRow: number, stepBytes: number, t: ElementType, out: DecodedArray): void {
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  let k = 0;
  for (let r = 0; r < rows; r++) {
    let p = start + r * rowBytes + colOffset;
    for (let j = 0; j < perRow; j++, p += stepBytes, k++) {
      switch (t) {
        case 'uint8': out[k] = bytes[p]; break;
        case 'int16': out[k] = dv.getInt16(p); break;
        case 'int32': out[k] = dv.getInt32(p); break;
        case 'float32': out[k] = dv.getFloat32(p); break;
        case 'float64': out[k] = dv.getFloat64(p); break;
        case 'int64': out[k] = Number(dv.getBigInt64(p)); break;
      }
    }
  }
}

/** Writes `values` big-endian as type `t` into `out` at `offset` (contiguous). */
export function encodeContiguous(values: ArrayLike<number>, t: ElementType, out: Uint8Array, offset: number): void {
  const n = values.length;
  const dv = new DataView(out.buffer, out.byteOffset, out.byteLength);
  const size = elementBytes(t);
  if (t === 'float32' && values instanceof Float32Array) {
    const src = new Uint8Array(values.buffer, values.byteOffset, n * 4);
    out.set(src, offset);
    Buffer.from(out.buffer, out.byteOffset + offset, n * 4).swap32();
    return;
  }
  if (t === 'float64' && values instanceof Float64Array) {
    const src = new Uint8Array(values.buffer, values.byteOffset, n * 8);
    out.set(src, offset);
    Buffer.from(out.buffer, out.byteOffset + offset, n * 8).swap64();
    return;
  }
  let p = offset;
  for (let i = 0; i < n; i++, p += size) writeOne(dv, p, t, values[i]);
}

/** Writes one element big-endian. */
export function writeOne(dv: DataView, p: number, t: ElementType, v: number): void {
  switch (t) {
    case 'uint8': dv.setUint8(p, v); break;
    case 'int16': dv.setInt16(p, v); break;
    case 'int32': dv.setInt32(p, v); break;
    case 'float32': dv.setFloat32(p, v); break;
    case 'float64': dv.setFloat64(p, v); break;
    case 'int64': dv.setBigInt64(p, BigInt(Math.trunc(v))); break;
  }
}
