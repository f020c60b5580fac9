import { describe, expect, it } from 'vitest';
import { reading } from './SensitivityTable.js';

describe('reading of an input from its indices', () => {
  it('puts the two indices into words', () => {
    expect(reading(0, 0, [0, 0])).toBe('no measurable effect');
    expect(reading(0.001, 0.004, [0.002, 0.006])).toBe('no measurable effect');
    expect(reading(0.45, 0.5, [0.45, 0.55])).toBe('mostly on its own');
    expect(reading(0.1, 0.5, [0.45, 0.55])).toBe('mostly through interactions');
    expect(reading(0.3, 0.5, [0.45, 0.55])).toBe('on its own and through interactions');
    expect(reading(null, null, null)).toBe('—');
  });
});
