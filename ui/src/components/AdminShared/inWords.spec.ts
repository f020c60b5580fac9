import { describe, expect, it } from 'vitest';
import { inWords } from './inWords.js';

describe('inWords', () => {
  it('keeps small counts exact and names large ones', () => {
    expect(inWords(950)).toBe('950');
    expect(inWords(9_999)).toBe('9,999');
    expect(inWords(12_500)).toBe('12.5 thousand');
    expect(inWords(2_000_000)).toBe('2 million');
    expect(inWords(1_234_567)).toBe('1.23 million');
    expect(inWords(50_000_000)).toBe('50 million');
  });
});
