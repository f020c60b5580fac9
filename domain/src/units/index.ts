export { math } from './math.js';
export { parseQuantity } from './parse.js';
export { densityFromPressure, pressureInPascal } from './pressure.js';
// The constants module sits at the package root; re-exported here so `@driftgrid/domain` exposes it.
export * from '../constants.js';
