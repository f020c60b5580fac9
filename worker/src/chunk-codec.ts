/** Typed arrays ↔ base64 without copying more than once. Hosts are little-endian (x86-64, arm64). */
export function encodeFloat64(a: Float64Array): string {
  return Buffer.from(a.buffer, a.byteOffset, a.byteLength).toString('base64');
}

/**
 * True when a decoded Buffer owns its whole ArrayBuffer: then a typed view needs no copy (offset 0 is
 * aligned). Small Buffers are slices of Node's shared pool, possibly unaligned: those are copied.
 */
function ownsBuffer(b: Buffer): boolean {
  return b.byteOffset === 0 && b.buffer.byteLength === b.byteLength;
}

export function decodeFloat64(s: string | Float64Array): Float64Array {
  if (typeof s !== 'string') return s;
  const b = Buffer.from(s, 'base64');
  if (ownsBuffer(b)) return new Float64Array(b.buffer, 0, b.byteLength / 8);
  const out = new Float64Array(b.byteLength / 8);
  new Uint8Array(out.buffer).set(b);
  return out;
}

export function encodeUint32(a: Uint32Array): string {
  return Buffer.from(a.buffer, a.byteOffset, a.byteLength).toString('base64');
}

export function decodeUint32(s: string | Uint32Array): Uint32Array {
  if (typeof s !== 'string') return s;
  const b = Buffer.from(s, 'base64');
  if (ownsBuffer(b)) return new Uint32Array(b.buffer, 0, b.byteLength / 4);
  const out = new Uint32Array(b.byteLength / 4);
  new Uint8Array(out.buffer).set(b);
  return out;
}
