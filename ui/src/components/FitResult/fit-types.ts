// The fit shapes and calls live in ui/src/api/fits.ts; re-exported for the fit components.
export {
  LIVE_FIT,
  type FitCreated,
  type FitParameterView,
  type FitPlotData,
  type FitRequestBody,
  type FitSourceKind,
  type FitView,
} from '../../api/fits.js';

export const MODEL_LABEL: Record<string, string> = {
  'power-law': 'Power law',
  exponential: 'Exponential (Boltzmann)',
  polytropic: 'Polytropic',
  expression: 'Expression',
};

export function xList(x: string | string[]): string[] {
  return Array.isArray(x) ? x : [x];
}
