import { describe, expect, it } from 'vitest';
import { compileSweep, type SweepDefinitionInput } from '@driftgrid/domain';
import { DEFAULT_VISIBLE, loadVisibleGroups, saveVisibleGroups, tableLayout, varyingInputs } from './tableLayout.js';

const definition: SweepDefinitionInput = {
  name: 'Argon table layout',
  model: 'cross-field',
  fixed: { n_m3: 1e19, mu: 40, Z: 1, Er_Vm: 0, gamma_i: 1, gamma_e: 1, Ti_eV: 'Te_eV' },
  axes: [
    { param: 'B_T', kind: 'linear', min: 0.05, max: 0.5, count: 5 },
    { param: 'Te_eV', kind: 'log', min: 1, max: 100, count: 7 },
    { param: 'Ln_m', kind: 'list', values: [0.01, 0.02] },
  ],
  sampling: { kind: 'grid' },
  derived: [{ name: 'drift_ratio', expr: 'vE_ms / vDe_ms' }],
};
const compiled = compileSweep(definition);
const columns = compiled.columns.map((c) => ({ ...c, meaning: '', type: 'float' as const })) as never;

describe('results table layout', () => {
  const layout = tableLayout({ model: 'cross-field', definition, columns });
  const names = layout.columns.map((c) => c.column.name);

  it('leads with the swept inputs in axis order, then outputs, derived, flags', () => {
    expect(names.slice(0, 4)).toEqual(['B_T', 'Te_eV', 'Ln_m', 'Ti_eV']);
    const order = layout.columns.map((c) => c.group);
    expect(order.indexOf('drifts')).toBeGreaterThan(order.lastIndexOf('swept'));
    expect(order.indexOf('derived')).toBeGreaterThan(order.lastIndexOf('orderings'));
    expect(order.at(-1)).toBe('flags');
    expect(names).toContain('drift_ratio');
    expect(names).not.toContain('idx');
  });

  it('lists inputs held fixed over the whole sweep once, with their values, and drops them from the table', () => {
    const held = Object.fromEntries(layout.held.map((h) => [h.name, h.value]));
    expect(held).toMatchObject({ n_m3: 1e19, mu: 40, Z: 1, Er_Vm: 0, gamma_i: 1, gamma_e: 1 });
    // Inputs left at their defaults are held fixed too: every input that is neither swept nor tied.
    const others = compiled.model.inputs
      .map((i) => i.name)
      .filter((n) => !['B_T', 'Te_eV', 'Ln_m', 'Ti_eV'].includes(n));
    expect(Object.keys(held).sort()).toEqual(others.sort());
    for (const h of layout.held) expect(names).not.toContain(h.name);
    // Ti_eV follows Te_eV: it varies, so it stays.
    expect(names).toContain('Ti_eV');
    expect(layout.held.find((h) => h.name === 'n_m3')?.symbol).toBe('n_e');
  });

  it('remembers the chosen groups per model', () => {
    const store = new Map<string, string>();
    const storage = {
      getItem: (k: string) => store.get(k) ?? null,
      setItem: (k: string, v: string) => void store.set(k, v),
    };
    expect(loadVisibleGroups('cross-field', storage)).toEqual(DEFAULT_VISIBLE);
    saveVisibleGroups('cross-field', ['swept', 'scales'], storage);
    expect(loadVisibleGroups('cross-field', storage)).toEqual(['swept', 'scales']);
    expect(loadVisibleGroups('parallel-balance', storage)).toEqual(DEFAULT_VISIBLE);
    store.set('driftgrid.results.groups.cross-field', '{broken');
    expect(loadVisibleGroups('cross-field', storage)).toEqual(DEFAULT_VISIBLE);
  });
});

describe('which inputs vary with the axes', () => {
  it('keeps inputs tied to a swept one by an expression, directly or through another, and holds the rest', () => {
    const fixed = {
      Ti_eV: 'Te_eV / 20',
      gamma_i: 'Ti_eV > 1 ? 3 : 1',
      Ln_m: '2 cm',
      mu: '39.948 * m_u / m_p',
      Er_Vm: '-200 V/m',
      n_m3: 1e18,
    };
    expect([...varyingInputs(['Te_eV', 'B_T'], fixed)].sort()).toEqual(['B_T', 'Te_eV', 'Ti_eV', 'gamma_i']);
  });

  it('lists unit-carrying and constant-only fixed values as held, not as table columns', () => {
    const def: SweepDefinitionInput = {
      name: 'held with units',
      model: 'cross-field',
      fixed: { Ti_eV: 'Te_eV / 20', Ln_m: '2 cm', mu: '39.948 * m_u / m_p', n_m3: '1e18 m^-3' },
      axes: [{ param: 'Te_eV', kind: 'log', min: 1, max: 20, count: 3 }],
      sampling: { kind: 'grid' },
    };
    const c = compileSweep(def);
    const cols = c.columns.map((x) => ({ ...x, meaning: '', type: 'float' as const })) as never;
    const l = tableLayout({ model: 'cross-field', definition: def, columns: cols });
    const held = Object.fromEntries(l.held.map((h) => [h.name, h.value]));
    expect(held.Ln_m).toBeCloseTo(0.02, 15);
    expect(held.n_m3).toBe(1e18);
    expect(held.mu).toBeCloseTo(39.948 * (1.6605390666e-27 / 1.67262192369e-27), 9); // CODATA 2018 m_u, m_p
    expect(l.columns.filter((x) => x.group === 'swept').map((x) => x.column.name)).toEqual(['Te_eV', 'Ti_eV']);
  });
});
