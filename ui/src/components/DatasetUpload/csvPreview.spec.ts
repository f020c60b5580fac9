import { describe, expect, it } from 'vitest';
import { guessUnit, looksNumeric, parseCsvPreview } from './csvPreview.js';

describe('parseCsvPreview', () => {
  it('reads a header and the first rows, with RFC 4180 quotes', () => {
    const p = parseCsvPreview('\ufeffr,phi,note\r\n0,0,"tip ""A"", left"\n0.5,-0.075,"two\nlines"\n', 10);
    expect(p.header).toEqual(['r', 'phi', 'note']);
    expect(p.rows).toEqual([
      ['0', '0', 'tip "A", left'],
      ['0.5', '-0.075', 'two\nlines'],
    ]);
    expect(p.truncated).toBe(false);
  });

  it('stops after maxRows', () => {
    const p = parseCsvPreview('x\n1\n2\n3\n4\n', 2);
    expect(p.rows).toEqual([['1'], ['2']]);
    expect(p.truncated).toBe(true);
  });

  it('tells numeric columns from text and guesses units from names', () => {
    const p = parseCsvPreview('n_m3,probe\n1e18,tip-A\n2.5e17,tip-B\n');
    expect(looksNumeric(p, 0)).toBe(true);
    expect(looksNumeric(p, 1)).toBe(false);
    expect(guessUnit('n_m3')).toBe('m^-3');
    expect(guessUnit('phi_V')).toBe('V');
    expect(guessUnit('probe')).toBe('');
  });
});
