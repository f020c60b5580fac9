import { describe, expect, it } from 'vitest';
import { compileFilter, compileSort, parseFilter } from './results-query.js';
import { layoutColumns } from './sweep-layout.js';

const layout = layoutColumns([
  { name: 'idx', kind: 'index', unit: '1', meaning: '', type: 'int' },
  { name: 'Te_eV', kind: 'input', unit: 'eV', meaning: '', type: 'float' },
  { name: 'valid', kind: 'output', unit: '1', meaning: '', type: 'boolean' },
  { name: 'flags', kind: 'flags', unit: '1', meaning: '', type: 'mask' },
]);

describe('results filter and sort (whitelisted, never spliced)', () => {
  it('compiles ranges to placeholders on slot columns inside the sweep range', () => {
    const f = parseFilter('{"Te_eV":{"gte":10,"lte":100},"valid":{"eq":true}}', layout);
    const q = compileFilter(3, layout, f);
    expect(q.where).toBe('id BETWEEN ? AND ? AND c0 >= ? AND c0 <= ? AND c1 = ?');
    expect(q.params).toEqual([3 * 2 ** 32, 4 * 2 ** 32 - 1, 10, 100, 1]);
  });

  it('rejects unknown columns, unknown operators, non-numbers and bad JSON with the path', () => {
    expect(() => parseFilter('{"Te_eV; DROP TABLE results":{"gte":1}}', layout)).toThrow(/Unknown column/);
    expect(() => parseFilter('{"Te_eV":{"like":"%"}}', layout)).toThrow(/filter/);
    expect(() => parseFilter('{"Te_eV":{"gte":"1 OR 1=1"}}', layout)).toThrow(/filter\.Te_eV\.gte/);
    expect(() => parseFilter('{oops', layout)).toThrow(/not valid JSON/);
  });

  it('sorts by whitelisted names only', () => {
    expect(compileSort(layout, 'Te_eV:desc')).toBe('c0 IS NULL, c0 DESC, id ASC');
    expect(compileSort(layout, 'idx:desc')).toBe('id DESC');
    expect(compileSort(layout, undefined)).toBe('id ASC');
    expect(() => compileSort(layout, 'Te_eV:desc; DELETE FROM users')).toThrow(/sort/);
    expect(() => compileSort(layout, 'password_hash:asc')).toThrow(/Unknown column/);
  });
});
