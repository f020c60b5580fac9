import { axisValueAt, type ResolvedAxis } from './axes.js';
import { gridDigits, gridIncrement } from './sampling/grid.js';
import { LatinHypercube } from './sampling/latin-hypercube.js';
import { saltelliCoordinate } from './sampling/saltelli.js';
import { sobolCoordinate } from './sampling/sobol.js';
import type { SweepSampling } from './schema.js';

/** Fills the swept input columns for points [i0, i0 + n), one column per axis. */
export type AxisFiller = (i0: number, n: number, columns: Float64Array[]) => void;

/**
 * The sampling design as a pure function of the point index.
 * - grid: mixed radix, last axis fastest; a chunk decodes i0 once and steps an odometer.
 * - latin-hypercube: u from the seeded stateless design (sampling/latin-hypercube.ts).
 * - sobol: u = Sobol point (index + skip), unscrambled, Gray-code order, origin first when skip = 0.
 * - saltelli: u = row of A, A_B^(i) or B for the index (sampling/saltelli.ts), groups of d + 2 points.
 * Random designs map u to the axis (log axes in log space, lists by floor(u·count)).
 */
export function makeAxisFiller(sampling: SweepSampling, axes: readonly ResolvedAxis[]): AxisFiller {
  const dims = axes.length;
  if (sampling.kind === 'grid') {
    const radices = axes.map((a) => a.count);
    const values = axes.map((a) => a.values!);
    return (i0, n, columns) => {
      if (n === 0) return;
      const digits = gridDigits(i0, radices);
      for (let k = 0; k < n; k++) {
        for (let a = 0; a < dims; a++) columns[a]![k] = values[a]![digits[a]!]!;
        if (k + 1 < n) gridIncrement(digits, radices);
      }
    };
  }
  if (sampling.kind === 'latin-hypercube') {
    const lhs = new LatinHypercube(sampling.samples, dims, sampling.seed);
    return (i0, n, columns) => {
      for (let a = 0; a < dims; a++) {
        const col = columns[a]!;
        const axis = axes[a]!;
        for (let k = 0; k < n; k++) col[k] = axisValueAt(axis, lhs.coordinate(i0 + k, a));
      }
    };
  }
  if (sampling.kind === 'saltelli') {
    return (i0, n, columns) => {
      for (let a = 0; a < dims; a++) {
        const col = columns[a]!;
        const axis = axes[a]!;
        for (let k = 0; k < n; k++) col[k] = axisValueAt(axis, saltelliCoordinate(i0 + k, a, dims));
      }
    };
  }
  const skip = sampling.skip ?? 0;
  return (i0, n, columns) => {
    for (let a = 0; a < dims; a++) {
      const col = columns[a]!;
      const axis = axes[a]!;
      for (let k = 0; k < n; k++) col[k] = axisValueAt(axis, sobolCoordinate(i0 + k + skip, a));
    }
  };
}
