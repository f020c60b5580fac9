/** Columns that look like a probe's bias voltage and current, by unit first, then by name. */
export function probeColumns(columns: { name: string; unit: string }[]): { v: string; i: string } | null {
  const byUnit = (u: string) => columns.filter((c) => c.unit === u).map((c) => c.name);
  const byName = (re: RegExp) => columns.filter((c) => re.test(c.name)).map((c) => c.name);
  const v = byUnit('V')[0] ?? byName(/^(v|u|bias|voltage|v_bias|v_probe)(_v)?$/i)[0];
  const i = byUnit('A')[0] ?? byName(/^(i|current|i_probe)(_a|_ma)?$/i)[0];
  return v && i && v !== i ? { v, i } : null;
}
