import { Table, Text } from '@mantine/core';
import { formatNumber } from '../../lib/format.js';

/** |r| above this is called out: the two parameters are nearly interchangeable in these data. */
export const STRONG_CORRELATION = 0.95;

/**
 * The parameter correlation matrix as a small table (lower triangle), strong pairs in bold with a
 * sentence naming them. Test hook: `fit-correlation`, cells carry data-r.
 */
export function FitCorrelation({ names, correlation }: { names: string[]; correlation: (number | null)[][] }) {
  if (names.length < 2) return null;
  const strong: string[] = [];
  names.forEach((a, i) =>
    names.slice(0, i).forEach((b, j) => {
      const r = correlation[i]?.[j];
      if (r !== null && r !== undefined && Math.abs(r) > STRONG_CORRELATION)
        strong.push(`${b}–${a} (${formatNumber(r, 4)})`);
    }),
  );
  return (
    <div data-testid="fit-correlation">
      <Text fz="sm" fw={500} mb={4}>
        Parameter correlations
      </Text>
      <Table withTableBorder fz="xs" verticalSpacing={2} horizontalSpacing={8} style={{ width: 'auto' }}>
        <Table.Thead>
          <Table.Tr>
            <Table.Th />
            {names.slice(0, -1).map((n) => (
              <Table.Th key={n} ff="monospace" ta="right">
                {n}
              </Table.Th>
            ))}
          </Table.Tr>
        </Table.Thead>
        <Table.Tbody>
          {names.slice(1).map((a, k) => {
            const i = k + 1;
            return (
              <Table.Tr key={a}>
                <Table.Th ff="monospace">{a}</Table.Th>
                {names.slice(0, -1).map((b, j) => {
                  const r = j < i ? correlation[i]?.[j] : undefined;
                  const hot = r !== null && r !== undefined && Math.abs(r) > STRONG_CORRELATION;
                  return (
                    <Table.Td key={b} ta="right" fw={hot ? 700 : undefined} data-r={r ?? ''}>
                      {j < i ? (r === null || r === undefined ? '—' : formatNumber(r, 3)) : ''}
                    </Table.Td>
                  );
                })}
              </Table.Tr>
            );
          })}
        </Table.Tbody>
      </Table>
      {strong.length ? (
        <Text fz="xs" c="orange.8" mt={4} data-testid="fit-strong-correlation">
          Strongly correlated (|r| &gt; {STRONG_CORRELATION}): {strong.join(', ')}. The data barely separate these
          parameters; consider fixing one or adding points where they act differently.
        </Text>
      ) : null}
    </div>
  );
}
