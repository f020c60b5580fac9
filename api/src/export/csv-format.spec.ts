import { describe, expect, it } from 'vitest';
import { csvField, formatBatch, formatRow, slugify, textCell } from './csv-format.js';

describe('formatBatch', () => {
  it('writes exactly what the per-value reference formatter writes', () => {
    // Edge values of IEEE 754 doubles: subnormal, max, exponent switch-over points of Number::toString.
    const edge = [
      0,
      -0,
      1,
      -1,
      0.1,
      1 / 3,
      5e-324,
      1.7976931348623157e308,
      1e21,
      1e-7,
      123456789012345680000,
      9007199254740992, // 2^53, the last integer a double holds exactly
      null,
    ];
    const rows: (number | null)[][] = [];
    let seed = 7;
    const rnd = () => (seed = (seed * 16807) % 2147483647) / 2147483647;
    for (let i = 0; i < 500; i++)
      rows.push([
        i,
        Math.exp(rnd() * 80 - 40) * (rnd() < 0.5 ? -1 : 1),
        rnd() < 0.1 ? null : rnd(),
        rnd() < 0.5 ? 1 : 0,
        edge[i % edge.length],
      ]);
    const formats = ['number', 'number', 'number', 'boolean', 'number'] as const;
    const expected = rows.map((r) => formatRow(r, formats)).join('');
    expect(
      formatBatch(
        rows.map((r) => [...r]),
        [3],
      ),
    ).toBe(expected);
  });

  it('reads back to the same doubles', () => {
    const values = [Math.PI, Math.E * 1e-19, 2 / 3, 6.02214076e23];
    const text = formatBatch([values.slice()], []);
    expect(text.trim().split(',').map(Number)).toEqual(values);
  });

  it('writes NULL (stored NaN) as NaN, ±Infinity as words and booleans as words', () => {
    expect(
      formatBatch(
        [
          [1, null, 1],
          [2, 3, 0],
          [Infinity, -Infinity, 1],
        ],
        [2],
      ),
    ).toBe('1,NaN,true\n2,3,false\nInfinity,-Infinity,true\n');
    expect(formatBatch([], [])).toBe('');
  });
});

describe('text cells', () => {
  it('quotes per RFC 4180', () => {
    expect(csvField('plain')).toBe('plain');
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField('two\nlines')).toBe('"two\nlines"');
  });

  it('neutralises formula-looking text (OWASP CSV Injection advice)', () => {
    expect(textCell("=cmd|' /C calc'!A0")).toBe("'=cmd|' /C calc'!A0");
    expect(textCell('+1')).toBe("'+1");
    expect(textCell('-x')).toBe("'-x");
    expect(textCell('@SUM(A1)')).toBe("'@SUM(A1)");
    expect(textCell('=HYPERLINK("x","y")')).toBe('"\'=HYPERLINK(""x"",""y"")"');
    expect(textCell('tip-A')).toBe('tip-A');
  });

  it('makes safe file-name slugs', () => {
    expect(slugify('Argon column / export check')).toBe('argon-column-export-check');
    expect(slugify('../../etc/passwd')).toBe('etc-passwd');
    expect(slugify('Ünïcode — scan', 'sweep')).toBe('unicode-scan');
    expect(slugify('///', 'sweep')).toBe('sweep');
  });
});
