import type { MantineColorsTuple } from '@mantine/core';

/**
 * Driftgrid's own palettes. Each scale was laid out by relative luminance (shade 0 ≈ 0.88 down to
 * shade 9 ≈ 0.033) so the shades Mantine puts text on meet WCAG AA in both schemes: shade 7 (light
 * scheme text/filled) against white, shades 3–4 (dark scheme text) against the dark body.
 * theme.spec.ts checks those pairs.
 */
// Petrol blue-green: the primary colour (field lines over a grid).
export const tide: MantineColorsTuple = [
  '#e5f3f9',
  '#c6e6f2',
  '#97d1e7',
  '#63bbda',
  '#30a3cc',
  '#2888ab',
  '#216e8b',
  '#1b5c73',
  '#16495c',
  '#103846',
];
// Warm copper: the accent (the marker in the name mark, queued work).
export const ember: MantineColorsTuple = [
  '#fbeee7',
  '#f7dccc',
  '#f0bea2',
  '#e89e74',
  '#e07d44',
  '#cb5f21',
  '#a54d1b',
  '#894016',
  '#6d3312',
  '#52270d',
];
export const moss: MantineColorsTuple = [
  '#e5f5ec',
  '#c8e8d5',
  '#99d6b2',
  '#67c18d',
  '#45aa6f',
  '#3a8e5d',
  '#2f734c',
  '#27603f',
  '#1f4c32',
  '#173a26',
];
export const rust: MantineColorsTuple = [
  '#fbeff0',
  '#f6dbdd',
  '#efbbc0',
  '#e79aa1',
  '#df7981',
  '#d6515d',
  '#c02d39',
  '#9f2530',
  '#801e26',
  '#63171d',
];
export const iris: MantineColorsTuple = [
  '#f2eff9',
  '#e4def2',
  '#cfc3e8',
  '#b7a7de',
  '#a18cd3',
  '#8a6fc9',
  '#7353be',
  '#6040a9',
  '#4d3387',
  '#3a2766',
];
export const slate: MantineColorsTuple = [
  '#f0f1f3',
  '#dde1e6',
  '#c3c9d1',
  '#a6b1bc',
  '#8b99a8',
  '#708193',
  '#5b6878',
  '#4a5663',
  '#3b454f',
  '#2d343b',
];
// Dark scheme surfaces, tinted towards the primary hue: 0 = text, 2 = dimmed text, 7 = body.
export const night: MantineColorsTuple = [
  '#d9dfe5',
  '#bac4ce',
  '#98a5b2',
  '#6f7d8c',
  '#48535f',
  '#343e49',
  '#27303a',
  '#1b232b',
  '#151c23',
  '#0f141a',
];

/** Shades Mantine uses for filled and text colours; kept here so the contrast test sees them too. */
export const primaryShade = { light: 7, dark: 8 } as const;

export const palettes = { tide, ember, moss, rust, iris, slate } as const;
export type PaletteName = keyof typeof palettes;
