// Number formatting the way Redis's Lua 5.1 prints numbers (C printf "%.14g").

/** `%.14g` of a double: 14 significant digits, trailing zeros dropped, no ".0" on whole values. */
export function formatLuaNumber(n: number): string {
  if (Number.isNaN(n)) return 'nan';
  if (n === Infinity) return 'inf';
  if (n === -Infinity) return '-inf';
  if (n === 0) return Object.is(n, -0) ? '-0' : '0';
  const expForm = n.toExponential(13); // d.ddddddddddddde±X, rounded to 14 digits
  const eAt = expForm.indexOf('e');
  const exp = Number(expForm.slice(eAt + 1));
  if (exp < -4 || exp >= 14) {
    const mantissa = stripZeros(expForm.slice(0, eAt));
    const sign = exp < 0 ? '-' : '+';
    const digits = String(Math.abs(exp)).padStart(2, '0');
    return `${mantissa}e${sign}${digits}`;
  }
  return stripZeros(n.toFixed(13 - exp));
}

function stripZeros(s: string): string {
  if (!s.includes('.')) return s;
  return s.replace(/0+$/, '').replace(/\.$/, '');
}

/**
 * A Lua number given to redis.call as an argument. Redis converts with a shortest
 * round-trip conversion, so whole numbers come out as plain digits.
 */
export function numberToRedisArg(n: number): string {
  if (n === Infinity) return 'inf';
  if (n === -Infinity) return '-inf';
  if (Number.isInteger(n) && Math.abs(n) < 1e21) return n.toFixed(0);
  return String(n);
}
