/**
 * Number and unit display for the ui (SPEC §12): 4 significant figures by default, scientific
 * notation outside [10⁻³, 10⁴), units beside the value, full precision kept for a hover title.
 * Exports carry full precision; these helpers are for the screen only.
 */

const SUPERSCRIPT: Record<string, string> = {
  '0': '⁰',
  '1': '¹',
  '2': '²',
  '3': '³',
  '4': '⁴',
  '5': '⁵',
  '6': '⁶',
  '7': '⁷',
  '8': '⁸',
  '9': '⁹',
  '-': '⁻',
  '+': '⁺',
};

/** Typographic minus (U+2212) so negative values line up with positive ones in tabular figures. */
export const MINUS = '\u2212';

export function toSuperscript(text: string): string {
  return Array.from(text, (ch) => {
    const sup = SUPERSCRIPT[ch];
    if (sup === undefined) throw new Error(`no superscript form for "${ch}"`);
    return sup;
  }).join('');
}

export interface NumberFormatOptions {
  /** `scientific` (default): exponent any integer; `engineering`: exponent a multiple of 3. */
  notation?: 'scientific' | 'engineering';
  /** Smallest and largest decimal exponent still written without a power of ten. */
  plainMinExp?: number;
  plainMaxExp?: number;
}

function trimZeros(s: string): string {
  return s.includes('.') ? s.replace(/\.?0+$/, '') : s;
}

/**
 * `formatNumber(12500)` → `1.25 × 10⁴`; `formatNumber(0.02134)` → `0.02134`; `formatNumber(-3.2e-7)`
 * → `−3.2 × 10⁻⁷`. Trailing zeros are dropped; NaN shows as `—`, infinities as `∞`.
 */
export function formatNumber(x: number | null | undefined, sig = 4, options: NumberFormatOptions = {}): string {
  if (x === null || x === undefined || Number.isNaN(x)) return '—';
  if (!Number.isInteger(sig) || sig < 1 || sig > 17) {
    throw new RangeError(`sig must be an integer from 1 to 17, got ${sig}`);
  }
  const sign = x < 0 ? MINUS : '';
  const ax = Math.abs(x);
  if (!Number.isFinite(ax)) return `${sign}∞`;
  if (ax === 0) return '0';

  // Round first, then read the exponent: 9999.7 at 4 figures is 1.000e+4 and must go scientific.
  const [mant, expText] = ax.toExponential(sig - 1).split('e') as [string, string];
  let exp = Number(expText);
  const minExp = options.plainMinExp ?? -3;
  const maxExp = options.plainMaxExp ?? 3;
  if (exp >= minExp && exp <= maxExp) {
    const decimals = Math.max(0, sig - 1 - exp);
    return sign + trimZeros(Number(`${mant}e${exp}`).toFixed(decimals));
  }
  let mantissa = Number(mant);
  if (options.notation === 'engineering') {
    const shift = ((exp % 3) + 3) % 3;
    exp -= shift;
    mantissa *= 10 ** shift;
    // Keep `sig` significant figures in the shifted mantissa (1 to 3 digits before the point).
    const digitsBefore = shift + 1;
    return `${sign}${trimZeros(mantissa.toFixed(Math.max(0, sig - digitsBefore)))} × 10${toSuperscript(String(exp))}`;
  }
  return `${sign}${trimZeros(mant)} × 10${toSuperscript(String(exp))}`;
}

/** Full precision for a `title` attribute: the shortest string that reads back as the same double. */
export function fullPrecision(x: number | null | undefined, unit?: string): string {
  if (x === null || x === undefined) return '';
  const value = Number.isNaN(x) ? 'NaN' : String(x);
  const u = unit ? prettyUnit(unit) : '';
  return u ? `${value} ${u}` : value;
}

/** Props to spread on an element showing a number: `<span {...numberTitle(x, 'm/s')}>`. */
export function numberTitle(x: number | null | undefined, unit?: string): { title: string } {
  return { title: fullPrecision(x, unit) };
}

const UNIT_WORDS: Record<string, string> = { ohm: 'Ω', degC: '°C', deg: '°', um: 'µm', us: 'µs', micro: 'µ' };

/**
 * Unit strings as mathjs writes them, for the screen: `m^-3` → `m⁻³`, `kg*m^2` → `kg·m²`,
 * `1` (dimensionless) → ``. Fractional exponents such as `^0.5` are left as written.
 */
export function prettyUnit(unit: string | null | undefined): string {
  if (!unit) return '';
  const u = unit.trim();
  if (u === '1' || u === '') return '';
  return u
    .replace(/\b(ohm|degC|deg|um|us)\b/g, (w) => UNIT_WORDS[w] ?? w)
    .replace(/\s*\*\s*/g, '·')
    .replace(/\^\(?([+-]?\d+)\)?(?![.\d])/g, (_m, e: string) => toSuperscript(e.replace(/^\+/, '')));
}

/** `formatQuantity(12500, 'm/s')` → `1.25 × 10⁴ m/s`; a dimensionless unit gives the bare number. */
export function formatQuantity(x: number | null | undefined, unit: string | null | undefined, sig = 4): string {
  const n = formatNumber(x, sig);
  const u = prettyUnit(unit);
  return u && n !== '—' ? `${n} ${u}` : n;
}

/** Byte counts for uploads and exports: `1.5 MB` (decimal prefixes, as file browsers show). */
export function formatBytes(bytes: number): string {
  if (!Number.isFinite(bytes) || bytes < 0) return '—';
  const units = ['B', 'kB', 'MB', 'GB', 'TB'];
  let v = bytes;
  let i = 0;
  while (v >= 1000 && i < units.length - 1) {
    v /= 1000;
    i++;
  }
  return i === 0 ? `${v} B` : `${formatNumber(v, 3)} ${units[i]}`;
}

/** Counts such as points or rows, grouped in thousands as the spec writes them: `1,550`. */
export function formatCount(n: number): string {
  if (!Number.isFinite(n)) return '—';
  const sign = n < 0 ? MINUS : '';
  return (
    sign +
    Math.round(Math.abs(n))
      .toString()
      .replace(/\B(?=(\d{3})+(?!\d))/g, ',')
  );
}

/**
 * A number as plain text someone could type back in: `1e19` rather than 10000000000000000000,
 * `0.02` as is. Used in placeholders and defaults, where superscripts would not parse.
 */
export function plainNumber(x: number): string {
  if (!Number.isFinite(x) || x === 0) return String(x);
  const a = Math.abs(x);
  if (a >= 1e-3 && a < 1e6) return String(x);
  return x
    .toExponential()
    .replace(/\.?0+e/, 'e')
    .replace('e+', 'e');
}

/**
 * A fraction done as a percentage that agrees wherever it appears: rounded down (a bar never reads
 * 100 % before the last point), one decimal below 10 % ("2.5 %"), whole numbers above ("42 %"),
 * and "< 0.1 %" rather than a misleading 0 once anything is done.
 */
export function formatPercent(fraction: number | null | undefined): string {
  if (fraction === null || fraction === undefined || !Number.isFinite(fraction)) return '—';
  const pct = Math.min(100, Math.max(0, fraction * 100));
  if (pct === 0) return '0 %';
  if (pct < 0.1) return '< 0.1 %';
  // Nudge by a hair before flooring so 0.29 × 100 = 28.999… reads 29, not 28.
  const v = pct < 10 ? Math.floor(pct * 10 + 1e-9) / 10 : Math.floor(pct + 1e-9);
  return `${v} %`;
}

/**
 * A count for meters and summaries: exact with thousands separators up to a million (13,950), then
 * in words with three significant figures, rounded half up on the exact integer ("14.0 million"),
 * never truncated ("13.9 thousand" for 13,950 was a rounding error).
 */
export function formatCountWords(n: number): string {
  if (!Number.isFinite(n)) return '—';
  const a = Math.abs(n);
  if (a < 1e6) return formatCount(n);
  const steps: [number, string][] = [
    [1e12, 'trillion'],
    [1e9, 'billion'],
    [1e6, 'million'],
  ];
  for (const [size, word] of steps) {
    if (a >= size) {
      if (a % size === 0) return `${n < 0 ? MINUS : ''}${formatCount(a / size)} ${word}`;
      const v = a / size;
      const decimals = v < 10 ? 2 : v < 100 ? 1 : 0;
      // Integer arithmetic on the scaled count avoids binary-fraction rounding (13.95 → "13.9").
      const unit = size / 10 ** decimals;
      const rounded = Math.round(a / unit) / 10 ** decimals;
      return `${n < 0 ? MINUS : ''}${rounded.toFixed(decimals)} ${word}`;
    }
  }
  return formatCount(n);
}
