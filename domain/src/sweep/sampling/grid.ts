/**
 * Mixed-radix indexing of a Cartesian grid. The LAST axis varies fastest (row-major, the order of
 * nested loops written in axis order, like C arrays): index = ((d0·r1 + d1)·r2 + d2)….
 * Nothing is materialised: a chunk [i0, i1) decodes i0 once and then steps an odometer.
 */

/** Number of grid points for the given radices (product of counts). */
export function gridSize(radices: readonly number[]): number {
  let n = 1;
  for (const r of radices) n *= r;
  return n;
}

/** Digits (one per axis) of grid point `index`, written into `out`. */
export function gridDigits(
  index: number,
  radices: readonly number[],
  out: Int32Array = new Int32Array(radices.length),
): Int32Array {
  if (!Number.isInteger(index) || index < 0 || index >= gridSize(radices)) {
    throw new RangeError(`grid index ${index} outside 0..${gridSize(radices) - 1}`);
  }
  let rest = index;
  for (let a = radices.length - 1; a >= 0; a--) {
    const r = radices[a]!;
    out[a] = rest % r;
    rest = Math.floor(rest / r);
  }
  return out;
}

/** Inverse of gridDigits. */
export function gridIndex(digits: ArrayLike<number>, radices: readonly number[]): number {
  let index = 0;
  for (let a = 0; a < radices.length; a++) {
    const d = digits[a]!;
    const r = radices[a]!;
    if (!Number.isInteger(d) || d < 0 || d >= r)
      throw new RangeError(`grid digit ${d} of axis ${a} outside 0..${r - 1}`);
    index = index * r + d;
  }
  return index;
}

/** Advance digits to the next grid point in place (odometer; last axis fastest). */
export function gridIncrement(digits: Int32Array, radices: readonly number[]): void {
  for (let a = radices.length - 1; a >= 0; a--) {
    const next = digits[a]! + 1;
    if (next < radices[a]!) {
      digits[a] = next;
      return;
    }
    digits[a] = 0;
  }
}
