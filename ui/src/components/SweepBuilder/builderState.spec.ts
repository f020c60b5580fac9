import { checkSweep } from '@driftgrid/domain';
import { describe, expect, it } from 'vitest';
import { errorsByField, fieldKeyOf, fromDefinition, initialState, toDefinition } from './builderState.js';
import { exampleDefinitions } from './examples.js';

describe('builder state ↔ sweep definition', () => {
  it('bundles the examples and round-trips each to an equivalent definition', () => {
    expect(exampleDefinitions.length).toBeGreaterThanOrEqual(4);
    for (const ex of exampleDefinitions) {
      const original = checkSweep(ex.definition);
      expect(original.ok, ex.file).toBe(true);
      const again = checkSweep(toDefinition(fromDefinition(ex.definition)));
      expect(again.ok, ex.file).toBe(true);
      if (!original.ok || !again.ok) continue;
      // Same design: same point count and the same inputs at the first and last point.
      expect(again.compiled.totalPoints).toBe(original.compiled.totalPoints);
      for (const i of [0, original.compiled.totalPoints - 1]) {
        const a = original.compiled.pointAt(i);
        const b = again.compiled.pointAt(i);
        for (const k of Object.keys(a))
          expect(Math.abs(b[k]! - a[k]!), `${ex.file} ${k}`).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(a[k]!)));
      }
    }
  });

  it('keeps numbers as numbers and unit strings and expressions as text', () => {
    const s = fromDefinition({
      name: 'x',
      model: 'cross-field',
      fixed: { Ti_eV: 'Te_eV', mu: 2 },
      axes: [
        { param: 'Ln_m', kind: 'list', values: [1, 2], unit: 'cm' },
        { param: 'B_T', kind: 'linear', min: '500 G', max: 0.2, count: 3 },
      ],
    });
    const d = toDefinition(s) as { fixed: Record<string, unknown>; axes: Record<string, unknown>[] };
    expect(d.fixed).toEqual({ Ti_eV: 'Te_eV', mu: 2 });
    expect(d.axes[0]).toEqual({ param: 'Ln_m', kind: 'list', values: ['1 cm', '2 cm'] });
    expect(d.axes[1]).toEqual({ param: 'B_T', kind: 'linear', min: '500 G', max: 0.2, count: 3 });
  });

  it('puts error paths beside the right field', () => {
    const s = fromDefinition({
      name: 'x',
      model: 'cross-field',
      fixed: { Ti_eV: 'Te_eV' },
      axes: [
        { param: 'Te_eV', kind: 'log', min: 1, max: 10, count: 3 },
        { param: 'B_T', kind: 'linear', min: 0.1, max: 500, count: 3 },
      ],
    });
    expect(fieldKeyOf('axes.1.max', s)).toBe('input.B_T.max');
    expect(fieldKeyOf('axes.0.values.2', s)).toBe('input.Te_eV.values');
    expect(fieldKeyOf('fixed.Ti_eV', s)).toBe('input.Ti_eV.value');
    expect(fieldKeyOf('derived.0.expr', s)).toBe('derived.0.expr');
    const res = checkSweep(toDefinition(s));
    expect(res.ok).toBe(false);
    if (!res.ok) expect(errorsByField(res.errors, s)['input.B_T.max']).toMatch(/B_T|100/);
  });

  it('rejects an unknown model on import, naming the known ones', () => {
    expect(() => fromDefinition({ model: 'nope' })).toThrow(/cross-field/);
    expect(toDefinition(initialState()).axes).toEqual([]);
  });
});
