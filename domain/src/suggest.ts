/**
 * "Did you mean" for names typed by hand (inputs, outputs, derived columns): the known name closest
 * by edit distance, when it is close enough to be a likely typo rather than a different word.
 */

/** Levenshtein distance (insertions, deletions, substitutions; each costs 1). */
export function editDistance(a: string, b: string): number {
  const prev = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    let diag = prev[0]!;
    prev[0] = i;
    for (let j = 1; j <= b.length; j++) {
      const up = prev[j]!;
      prev[j] = Math.min(up + 1, prev[j - 1]! + 1, diag + (a[i - 1] === b[j - 1] ? 0 : 1));
      diag = up;
    }
  }
  return prev[b.length]!;
}

/** Case and underscores carry little meaning in a typed name (`v_Di` vs `vDi_ms`). */
const plain = (s: string) => s.toLowerCase().replace(/_/g, '');

/**
 * The candidate nearest to `name` (ignoring case and underscores), or null when even the nearest
 * needs more edits than a third of the longer name (at least 2): beyond that a suggestion is a guess.
 */
export function nearestName(name: string, candidates: Iterable<string>): string | null {
  let best: string | null = null;
  let bestD = Infinity;
  for (const c of candidates) {
    const d = editDistance(plain(name), plain(c));
    if (d < bestD) {
      best = c;
      bestD = d;
    }
  }
  if (best === null) return null;
  const allowed = Math.max(2, Math.floor(Math.max(plain(name).length, plain(best).length) / 3));
  return bestD <= allowed ? best : null;
}

/** The message for a name that is neither an input nor an output, with the nearest known name. */
export function unknownSymbolMessage(name: string, candidates: readonly string[]): string {
  const near = nearestName(name, candidates);
  return near
    ? `unknown input or output \`${name}\`; did you mean \`${near}\`?`
    : `unknown input or output \`${name}\`; known names: ${candidates.join(', ')}`;
}
