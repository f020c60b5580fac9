/**
 * Iso-lines of a field sampled on a rectilinear grid, by marching squares (common practice; e.g. Lorensen &
 * Cline's marching cubes reduced to two dimensions). Pure and framework-free: the ui draws the result over a
 * heatmap (the line where an ordering parameter equals its validity threshold).
 *
 * Crossings are found by linear interpolation along cell edges. Interpolation happens in the plot's own
 * coordinates: on a log axis the position is interpolated in log10 of the coordinate, and with `logZ` the
 * field is interpolated in log10 of its magnitude — which makes a power law (ρ_i/L_n ∝ √T/B) exact on a
 * log-log grid. Cells with a missing corner (null or non-finite, or ≤ 0 under `logZ`) produce nothing.
 */

export type Point = [number, number];

export interface ContourOptions {
  /** Interpolate positions in log10(x) (the x axis is logarithmic). */
  logX?: boolean;
  /** Interpolate positions in log10(y). */
  logY?: boolean;
  /** Interpolate the field in log10(z); the level must then be positive. */
  logZ?: boolean;
}

/** A field on a grid: `z[j][i]` is the value at (xs[i], ys[j]). */
export interface GridField {
  xs: readonly number[];
  ys: readonly number[];
  z: readonly (readonly (number | null)[])[];
}

/**
 * Line segments where the field crosses `level`. Each cell with corners on both sides of the level
 * contributes one segment, or two at a saddle (resolved by the mean of the four corners).
 */
export function contourSegments(field: GridField, level: number, opts: ContourOptions = {}): [Point, Point][] {
  const { xs, ys, z } = field;
  const fx = opts.logX ? Math.log10 : identity;
  const fy = opts.logY ? Math.log10 : identity;
  const gx = opts.logX ? pow10 : identity;
  const gy = opts.logY ? pow10 : identity;
  const fz = opts.logZ ? (v: number) => (v > 0 ? Math.log10(v) : Number.NaN) : identity;
  const lv = fz(level);
  if (!Number.isFinite(lv)) return [];
  const X = xs.map(fx);
  const Y = ys.map(fy);
  const val = (i: number, j: number): number => {
    const v = z[j]?.[i];
    return v === null || v === undefined ? Number.NaN : fz(v);
  };
  const out: [Point, Point][] = [];
  for (let j = 0; j + 1 < Y.length; j++) {
    for (let i = 0; i + 1 < X.length; i++) {
      // Corners counter-clockwise from bottom-left: a (i,j), b (i+1,j), c (i+1,j+1), d (i,j+1).
      const a = val(i, j);
      const b = val(i + 1, j);
      const c = val(i + 1, j + 1);
      const d = val(i, j + 1);
      if (![a, b, c, d].every(Number.isFinite)) continue;
      const code = (a >= lv ? 1 : 0) | (b >= lv ? 2 : 0) | (c >= lv ? 4 : 0) | (d >= lv ? 8 : 0);
      if (code === 0 || code === 15) continue;
      const x0 = X[i]!;
      const x1 = X[i + 1]!;
      const y0 = Y[j]!;
      const y1 = Y[j + 1]!;
      const t = (p: number, q: number) => (p === q ? 0.5 : (lv - p) / (q - p));
      // Crossing points on the four edges (only used where the edge is crossed).
      const bottom = (): Point => [x0 + t(a, b) * (x1 - x0), y0];
      const right = (): Point => [x1, y0 + t(b, c) * (y1 - y0)];
      const top = (): Point => [x0 + t(d, c) * (x1 - x0), y1];
      const left = (): Point => [x0, y0 + t(a, d) * (y1 - y0)];
      const add = (p: Point, q: Point) => {
        // A contour through a grid node touches the neighbouring cells in a single point: no segment there.
        if (p[0] === q[0] && p[1] === q[1]) return;
        out.push([
          [gx(p[0]), gy(p[1])],
          [gx(q[0]), gy(q[1])],
        ]);
      };
      switch (code) {
        case 1:
        case 14:
          add(left(), bottom());
          break;
        case 2:
        case 13:
          add(bottom(), right());
          break;
        case 3:
        case 12:
          add(left(), right());
          break;
        case 4:
        case 11:
          add(right(), top());
          break;
        case 6:
        case 9:
          add(bottom(), top());
          break;
        case 7:
        case 8:
          add(left(), top());
          break;
        case 5:
        case 10: {
          // Saddle: the centre value decides which pairs of edges connect.
          const centreHigh = (a + b + c + d) / 4 >= lv;
          const aHigh = code === 5;
          if (centreHigh === aHigh) {
            add(left(), top());
            add(bottom(), right());
          } else {
            add(left(), bottom());
            add(right(), top());
          }
          break;
        }
      }
    }
  }
  return out;
}

/**
 * Joins segments that share end points into polylines (a contour crossing many cells becomes one line).
 * End points are matched exactly: neighbouring cells compute a shared edge's crossing identically.
 */
export function joinSegments(segments: readonly [Point, Point][]): Point[][] {
  const key = (p: Point) => `${p[0]},${p[1]}`;
  const ends = new Map<string, number[]>();
  segments.forEach((s, k) => {
    for (const p of s) {
      const list = ends.get(key(p));
      if (list) list.push(k);
      else ends.set(key(p), [k]);
    }
  });
  const used = new Array<boolean>(segments.length).fill(false);
  const next = (p: Point): Point | null => {
    for (const k of ends.get(key(p)) ?? []) {
      if (used[k]) continue;
      used[k] = true;
      const s = segments[k]!;
      return key(s[0]) === key(p) ? s[1] : s[0];
    }
    return null;
  };
  const lines: Point[][] = [];
  for (let k = 0; k < segments.length; k++) {
    if (used[k]) continue;
    used[k] = true;
    const line: Point[] = [segments[k]![0], segments[k]![1]];
    for (let p = next(line[line.length - 1]!); p; p = next(line[line.length - 1]!)) line.push(p);
    for (let p = next(line[0]!); p; p = next(line[0]!)) line.unshift(p);
    lines.push(line);
  }
  return lines;
}

/** Polylines where the field equals `level` (segments joined). */
export function contourLines(field: GridField, level: number, opts: ContourOptions = {}): Point[][] {
  return joinSegments(contourSegments(field, level, opts));
}

function identity(v: number): number {
  return v;
}

function pow10(v: number): number {
  return 10 ** v;
}
