import { describe, expect, it } from 'vitest';
import { CATALOGUE_STATUSES } from './catalogue.js';
import { LIVE_FIT_STATUSES } from './fits.js';
import { compileSweep } from '../sweep/compile.js';
import {
  ACTIVE_STATES,
  cellNumber,
  isActiveState,
  resultCellSchema,
  SWEEP_STATUSES,
  sweepColumnViewSchema,
  sweepSubmissionSchema,
  sweepViewSchema,
} from './sweeps.js';

describe('sweep enums, declared once', () => {
  it('the catalogue filters by exactly the sweep statuses, and fits share the active states', () => {
    expect(CATALOGUE_STATUSES).toBe(SWEEP_STATUSES);
    expect(LIVE_FIT_STATUSES).toBe(ACTIVE_STATES);
  });

  it('active means queued or running, and nothing finished', () => {
    expect(SWEEP_STATUSES.filter(isActiveState)).toEqual(['queued', 'running']);
    expect(isActiveState('waiting')).toBe(false);
  });
});

describe('sweepSubmissionSchema', () => {
  it('takes any JSON object and refuses arrays, strings and null with a message a user can read', () => {
    expect(sweepSubmissionSchema.safeParse({ name: 'x', axes: 'not checked here' }).success).toBe(true);
    for (const bad of [[], 'x', null, 3]) {
      const r = sweepSubmissionSchema.safeParse(bad);
      expect(r.success).toBe(false);
      expect(r.error?.issues[0].message).toBe('the sweep definition must be a JSON object');
    }
  });
});

describe('sweep response contracts', () => {
  it('the compiled columns of a sweep are exactly sweepColumnViewSchema', () => {
    const compiled = compileSweep({
      name: 'Argon column contract',
      model: 'cross-field',
      fixed: { n_m3: 1e18, mu: 40, Z: 1, Er_Vm: 0, gamma_i: 1, gamma_e: 1, Ti_eV: 'Te_eV', Ln_m: 0.02 },
      axes: [{ param: 'Te_eV', kind: 'log', min: 1, max: 100, count: 3 }],
      derived: [{ name: 'hot', expr: 'Te_eV > 10' }],
    });
    for (const c of compiled.columns) expect(sweepColumnViewSchema.parse(c)).toEqual(c);
    expect(sweepColumnViewSchema.safeParse({ ...compiled.columns[0], slot: 'c0' }).success).toBe(false);
  });

  it('a result cell is a number, a boolean, null or one of the three non-finite words', () => {
    for (const ok of [0, -1.5e300, true, null, 'Infinity', '-Infinity', 'NaN'])
      expect(resultCellSchema.safeParse(ok).success).toBe(true);
    for (const bad of ['inf', '1', '', {}, [], undefined]) expect(resultCellSchema.safeParse(bad).success).toBe(false);
  });

  it('cellNumber reads the words back as IEEE 754 values and booleans as 0/1', () => {
    expect(cellNumber('Infinity')).toBe(Infinity);
    expect(cellNumber('-Infinity')).toBe(-Infinity);
    expect(cellNumber('NaN')).toBeNaN();
    expect(cellNumber(2.5)).toBe(2.5);
    expect(cellNumber(true)).toBe(1);
    expect(cellNumber(null)).toBeNull();
    expect(cellNumber(undefined)).toBeNull();
  });

  it('the sweep view refuses a definition that is not one, and a status it does not know', () => {
    const base = {
      id: 1,
      name: 'x',
      model: 'cross-field',
      status: 'completed',
      points: 1,
      progress: { done: 1, total: 1, fraction: 1 },
      chunks: 1,
      definition: { name: 'x', model: 'cross-field', axes: [{ kind: 'list', param: 'Te_eV', values: [1] }] },
      columns: [],
      tags: [],
      owner: { id: 1, name: 'Ruth', email: 'r@example.com' },
      visibility: 'private',
      sharedWith: [],
      createdAt: '2026-01-01T00:00:00.000Z',
      startedAt: null,
      finishedAt: null,
      error: null,
      flagsSummary: { invalidPoints: 0, byFlag: {} },
      provenance: { modelVersion: '1', appVersion: '0.1.0', computeMs: 0, workers: [] },
    };
    expect(sweepViewSchema.safeParse(base).success).toBe(true);
    expect(sweepViewSchema.safeParse({ ...base, definition: { axes: 'none' } }).success).toBe(false);
    expect(sweepViewSchema.safeParse({ ...base, status: 'waiting' }).success).toBe(false);
  });
});
