import { describe, expect, it } from 'vitest';
import { editDistance, nearestName, unknownSymbolMessage } from './suggest.js';

describe('nearest name', () => {
  // Levenshtein distances worked by hand (common practice: kitten → sitting is the textbook example, 3).
  it('computes edit distances', () => {
    expect(editDistance('kitten', 'sitting')).toBe(3);
    expect(editDistance('', 'abc')).toBe(3);
    expect(editDistance('Te_eVV', 'Te_eV')).toBe(1);
    expect(editDistance('Ti_eV', 'Te_eV')).toBe(1);
  });

  it('suggests the closest name, ignoring case, and nothing for an unrelated word', () => {
    const names = ['Te_eV', 'Ti_eV', 'B_T', 'n_m3', 'L_n_m'];
    expect(nearestName('Te_eVV', names)).toBe('Te_eV');
    expect(nearestName('b_t', names)).toBe('B_T');
    expect(nearestName('pressure', names)).toBeNull();
    expect(unknownSymbolMessage('Te_eVV', names)).toBe('unknown input or output `Te_eVV`; did you mean `Te_eV`?');
    expect(unknownSymbolMessage('zzzzzz', ['a'])).toBe('unknown input or output `zzzzzz`; known names: a');
  });
});
