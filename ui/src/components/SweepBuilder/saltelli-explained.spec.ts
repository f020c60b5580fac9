import { describe, expect, it } from 'vitest';
import { saltelliExplained } from './saltelli-explained.js';

describe('saltelliExplained', () => {
  it('gives N × (d + 2) points and suggests the nearest power of 2', () => {
    const text = saltelliExplained('1000', 4);
    expect(text).toContain('Here 1,000 × (4 + 2) = 6,000 points.');
    expect(text).toContain('Powers of 2 (e.g. 1,024) balance best.');
    expect(saltelliExplained(' 512 ', 3)).toContain('512 × (3 + 2) = 2,560 points.');
    expect(saltelliExplained('512', 3)).not.toContain('e.g.');
  });

  it('states only the rule while samples or axes are missing', () => {
    expect(saltelliExplained('', 3)).not.toContain('Here');
    expect(saltelliExplained('abc', 3)).not.toContain('Here');
    expect(saltelliExplained('100', 0)).not.toContain('Here');
  });
});
