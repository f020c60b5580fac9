/**
 * Viridis, a perceptually uniform colour map (SPEC §12), as ten evenly spaced samples of the
 * published map (common practice; values from memory of the matplotlib table).
 */
export const VIRIDIS = [
  '#440154',
  '#482878',
  '#3e4989',
  '#31688e',
  '#26828e',
  '#1f9e89',
  '#35b779',
  '#6ece58',
  '#b5de2b',
  '#fde725',
];
