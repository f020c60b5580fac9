/**
 * Colours of graphics (progress bars, fit points and curves) per scheme, in one place so the
 * contrast test checks what is drawn: WCAG 2.1 SC 1.4.11 asks 3:1 for graphical objects against
 * what is next to them. In the dark scheme the filled shades (tide 8) are too dark for a bar on a
 * card, so bars and points use lighter shades there.
 */
import { ember, night, tide } from './palette.js';

export const graphics = {
  light: {
    card: '#ffffff',
    progressTrack: '#e9ecef', // Mantine's light track (gray 2)
    progressFill: tide[7],
    fitData: '#1f6f8b',
    fitCurve: '#c0612b',
  },
  dark: {
    card: night[7],
    progressTrack: night[4], // Mantine's dark track is dark 4
    progressFill: tide[3],
    fitData: tide[3],
    fitCurve: ember[4],
  },
} as const;

export type Scheme = keyof typeof graphics;

export function fitColours(scheme: Scheme): { data: string; curve: string } {
  return { data: graphics[scheme].fitData, curve: graphics[scheme].fitCurve };
}
