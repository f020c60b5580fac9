/** Estimated bits below which a production JWT_SECRET is refused (a random 32-character value has ~190). */
export const MIN_SECRET_BITS = 80;
const MIN_DISTINCT = 8;

/**
 * Why a secret looks guessable, or null. The estimate is the Shannon entropy of the secret's own
 * character frequencies times its length: it cannot prove randomness, but it catches one repeated
 * character, few distinct characters, a short word repeated and short keyboard runs.
 */
export function weakSecretReason(secret: string): string | null {
  const chars = [...secret];
  const counts = new Map<string, number>();
  for (const c of chars) counts.set(c, (counts.get(c) ?? 0) + 1);
  if (counts.size < MIN_DISTINCT)
    return `it uses only ${counts.size} distinct character${counts.size === 1 ? '' : 's'}`;
  const period = smallestPeriod(chars);
  if (period <= chars.length / 2) return `it repeats a ${period}-character pattern`;
  let perChar = 0;
  for (const n of counts.values()) {
    const p = n / chars.length;
    perChar -= p * Math.log2(p);
  }
  const bits = perChar * chars.length;
  if (bits < MIN_SECRET_BITS) return `its estimated strength is ${Math.round(bits)} bits, below ${MIN_SECRET_BITS}`;
  return null;
}

function smallestPeriod(chars: string[]): number {
  for (let p = 1; p <= chars.length / 2; p++) {
    let ok = true;
    for (let i = p; i < chars.length && ok; i++) ok = chars[i] === chars[i - p];
    if (ok) return p;
  }
  return chars.length;
}
