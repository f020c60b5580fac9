/** Typed arrays ↔ base64 without copying more than once. Hosts are little-endian (x86-64, arm64). */
export function encodeFloat64(a: Float64Array): string {
  return Buffer.from(a.buffer, a.byteOffset, a.byteLength).toString('base64');
}

export function decodeFloat64(s: string | Float64Array): Float64Array {
  if (typeof s !== 'string') return s;
  const b = Buffer.from(s, 'base64');
  // Copy into an aligned buffer: Buffer pool slices may not be 8-byte aligned.
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
  const out = new Uint32Array(b.byteLength / 4);
  new Uint8Array(out.buffer).set(b);
  return out;
}
