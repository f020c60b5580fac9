import { ValidationError } from '@driftgrid/domain';

/** Index of the first byte that does not start or continue a valid UTF-8 sequence (RFC 3629), or -1. */
export function firstInvalidUtf8(buf: Uint8Array): number {
  const n = buf.length;
  let i = 0;
  while (i < n) {
    const b = buf[i]!;
    if (b < 0x80) {
      i++;
      continue;
    }
    const len = b >= 0xc2 && b <= 0xdf ? 2 : b >= 0xe0 && b <= 0xef ? 3 : b >= 0xf0 && b <= 0xf4 ? 4 : 0;
    if (len === 0 || i + len > n) return i;
    const b1 = buf[i + 1]!;
    // Second-byte ranges that exclude overlong forms, surrogates and code points above U+10FFFF.
    const lo = b === 0xe0 ? 0xa0 : b === 0xf0 ? 0x90 : 0x80;
    const hi = b === 0xed ? 0x9f : b === 0xf4 ? 0x8f : 0xbf;
    if (b1 < lo || b1 > hi) return i;
    for (let k = 2; k < len; k++) if ((buf[i + k]! & 0xc0) !== 0x80) return i;
    i += len;
  }
  return -1;
}

const lineAt = (buf: Uint8Array, offset: number) => {
  let line = 1;
  for (let i = 0; i < offset; i++) if (buf[i] === 0x0a) line++;
  return line;
};

/**
 * Refuses a file that is not UTF-8, or that already holds U+FFFD (the mark of an earlier lossy
 * conversion), naming the line: decoding it leniently would store replacement characters silently.
 */
export function assertUtf8Text(input: Buffer): void {
  const bad = firstInvalidUtf8(input);
  if (bad >= 0) {
    const line = lineAt(input, bad);
    const byte = `0x${input[bad]!.toString(16).toUpperCase().padStart(2, '0')}`;
    const message = `has a byte (${byte}) that is not UTF-8, as in a file saved as Latin-1 or Windows-1252: save it as "CSV UTF-8" and upload again`;
    throw new ValidationError(`The file is not UTF-8 text: line ${line} ${message}`, [{ path: 'file', line, message }]);
  }
  const text = input.toString('utf8');
  const at = text.indexOf('\uFFFD');
  if (at >= 0) {
    const line = text.slice(0, at).split('\n').length;
    const message =
      'holds the replacement character U+FFFD (�), left where an earlier conversion lost a character: fix the text and upload again';
    throw new ValidationError(`The file is damaged at line ${line}: it ${message}`, [{ path: 'file', line, message }]);
  }
}
