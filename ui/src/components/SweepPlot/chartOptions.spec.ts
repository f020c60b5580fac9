import { describe, expect, it } from 'vitest';
import type { HeatmapSeries, LineSeries } from '@driftgrid/domain';
import { heatmapOption, lineOption } from './chartOptions.js';

const axis = (name: string, unit: string) => ({ name, unit, kind: 'input', meaning: '' });
const line: LineSeries = {
  kind: 'line',
  x: axis('Te_eV', 'eV'),
  y: { ...axis('vDi_ms', 'm/s'), kind: 'output' },
  groupBy: null,
  groups: [{ value: null, points: [[1, 2, 0, 0]] }],
  method: 'stride',
  total: 1,
  returned: 1,
  slice: {},
  flags: [],
  invalidMask: 0,
};
const heat: HeatmapSeries = {
  kind: 'heatmap',
  x: { ...axis('Te_eV', 'eV'), values: [1, 2] },
  y: { ...axis('B_T', 'T'), values: [0.1, 0.2] },
  z: { ...axis('rho_i_over_Ln', '1'), kind: 'output' },
  cells: [[0, 0, 0.05, 0, 0, 0]],
  method: 'grid-slice',
  zRange: [0.05, 0.05],
  slice: {},
  flags: [],
  invalidMask: 0,
};
const symbols: Record<string, string> = { Te_eV: 'T_e', vDi_ms: 'v_Di', B_T: 'B', rho_i_over_Ln: 'ρ_i/L_n' };
const display = (n: string) => (symbols[n] ? `${symbols[n]} · ${n}` : n);

describe('axis titles and colour bar (the physics first)', () => {
  it('name a model column by its symbol and name, with the unit', () => {
    const o = lineOption(line, { x: true, y: false, z: false }, '#000', null, { label: display });
    expect(o.xAxis.name).toBe('T_e · Te_eV (eV)');
    expect(o.yAxis.name).toBe('v_Di · vDi_ms (m/s)');
    const h = heatmapOption(heat, { x: true, y: false, z: false }, '#000', {
      colour: 'linear',
      label: display,
      barLabel: (n) => symbols[n] ?? n,
    });
    expect(h.yAxis.name).toBe('B · B_T (T)');
    // The colour bar has little room: the symbol alone (the Colour picker above names the column).
    expect(JSON.stringify(h.visualMap)).toContain('"ρ_i/L_n"');
  });

  it('keep the bare column name without a label (derived columns, older callers)', () => {
    const o = lineOption(line, { x: false, y: false, z: false }, '#000');
    expect(o.xAxis.name).toBe('Te_eV (eV)');
  });
});
