import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { ValidationError } from '../errors.js';
import { MAX_POINTS_HARD } from './limits.js';
import { parseSweepDefinition, safeParseSweepDefinition } from './parse.js';

const fixture = (name: string): unknown =>
  JSON.parse(readFileSync(new URL(`fixtures/${name}`, import.meta.url), 'utf8'));

function errorsOf(raw: unknown): Record<string, string> {
  const r = safeParseSweepDefinition(raw);
  if (r.ok) throw new Error('expected the definition to be rejected');
  return Object.fromEntries(r.errors.map((e) => [e.path, e.message]));
}

const base = {
  name: 'Scan',
  model: 'cross-field',
  axes: [{ param: 'Te_eV', kind: 'linear', min: 1, max: 10, count: 5 }],
};

describe('sweep definition schema', () => {
  it('accepts the fixtures and fills defaults', () => {
    for (const f of ['edge-deuterium-grid.json', 'argon-column-lhs.json', 'sheath-sobol.json']) {
      expect(safeParseSweepDefinition(fixture(f)).ok, f).toBe(true);
    }
    const def = parseSweepDefinition(base);
    expect(def.schemaVersion).toBe(1);
    expect(def.sampling).toEqual({ kind: 'grid' });
    expect(def.fixed).toEqual({});
    expect(def.derived).toEqual([]);
    expect(def.tags).toEqual([]);
  });

  it('names each bad field by its path', () => {
    const errors = errorsOf({
      name: '',
      model: 'cross-field',
      fixed: { Ti_eV: true },
      axes: [
        { param: 'Te_eV', kind: 'linear', min: 1, max: 10, count: 0 },
        { param: 'B_T', kind: 'spiral', min: 1, max: 2 },
        { param: 'Ln_m', kind: 'list', values: [] },
        { param: 'n_m3', kind: 'log', min: 1e18, max: 1e19 },
      ],
      sampling: { kind: 'latin-hypercube', samples: 0 },
      derived: [{ name: '1bad', expr: 'vE_ms' }],
      tags: ['Edge!'],
      schemaVersion: 2,
    });
    expect(Object.keys(errors).sort()).toEqual(
      [
        'name',
        'fixed.Ti_eV',
        'axes.0.count',
        'axes.1.kind',
        'axes.2.values',
        'sampling.samples',
        'sampling.seed',
        'derived.0.name',
        'tags.0',
        'schemaVersion',
      ].sort(),
    );
    expect(errors['axes.0.count']).toMatch(/at least 1/);
    expect(errors['axes.1.kind']).toMatch(/linear, log, list/);
    expect(errors['tags.0']).toMatch(/a-z/);
  });

  it('requires a count on linear and log axes only for grid sampling', () => {
    const noCount = { ...base, axes: [{ param: 'Te_eV', kind: 'log', min: 1, max: 10 }] };
    expect(errorsOf(noCount)['axes.0.count']).toMatch(/required for grid/);
    expect(safeParseSweepDefinition({ ...noCount, sampling: { kind: 'sobol', samples: 64 } }).ok).toBe(true);
  });

  it('caps the grid at MAX_POINTS_HARD points', () => {
    const axes = ['Te_eV', 'Ti_eV', 'B_T'].map((param) => ({ param, kind: 'linear', min: 1, max: 2, count: 10000 }));
    const errors = errorsOf({ ...base, axes });
    expect(errors['axes']).toMatch(/1,000,000,000,000 points/);
    expect(errors['axes']).toContain(MAX_POINTS_HARD.toLocaleString('en-US'));
  });

  it('limits tags, derived columns and text lengths', () => {
    const errors = errorsOf({
      ...base,
      description: 'x'.repeat(5001),
      tags: Array.from({ length: 21 }, (_, i) => `t${i}`),
      derived: Array.from({ length: 17 }, (_, i) => ({ name: `d${i}`, expr: 'vE_ms' })),
    });
    expect(errors['description']).toMatch(/5000/);
    expect(errors['tags']).toMatch(/20/);
    expect(errors['derived']).toMatch(/16/);
    expect(
      errorsOf({
        ...base,
        derived: [
          { name: 'a', expr: '1' },
          { name: 'a', expr: '2' },
        ],
      })['derived.1.name'],
    ).toMatch(/duplicates/);
  });

  it('throws one ValidationError carrying every detail', () => {
    try {
      parseSweepDefinition({ model: 3, axes: [] });
      expect.unreachable();
    } catch (err) {
      expect(err).toBeInstanceOf(ValidationError);
      const paths = (err as ValidationError).details!.map((d) => d.path).sort();
      expect(paths).toEqual(['axes', 'model', 'name']);
      expect((err as Error).message).toMatch(/^Invalid sweep definition: /);
    }
  });
});
