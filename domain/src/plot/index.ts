export {
  contourSegments,
  contourLines,
  joinSegments,
  type ContourOptions,
  type GridField,
  type Point,
} from './contour.js';
export { regimeBoundaries, type RegimeBoundary } from './regimes.js';
export {
  COLUMN_GROUPS,
  COLUMN_GROUP_LABELS,
  columnGroup,
  outputGroup,
  type ColumnGroup,
  type GroupableColumn,
} from './columns.js';
export { evenlySpread } from './selection.js';
