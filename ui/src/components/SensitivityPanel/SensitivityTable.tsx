import { Table, Text } from '@mantine/core';
import type { SensitivityReport } from '@driftgrid/domain';
import { formatNumber } from '../../lib/format.js';

const fmt = (x: number | null) => (x === null ? '—' : formatNumber(x, 3));
const range = (v: [number, number] | null) => (v ? `${formatNumber(v[0], 3)} to ${formatNumber(v[1], 3)}` : '—');

/** Below this upper interval bound an input's total index counts as no measurable effect. */
const NEGLIGIBLE = 0.01;

/** How an input acts on the output, in words, from its two indices. */
export function reading(first: number | null, total: number | null, totalCI: [number, number] | null): string {
  if (first === null || total === null) return '—';
  if (totalCI && totalCI[1] < NEGLIGIBLE) return 'no measurable effect';
  if (total <= 0) return 'no measurable effect';
  const alone = first / total;
  if (alone >= 0.8) return 'mostly on its own';
  if (alone < 0.4) return 'mostly through interactions';
  return 'on its own and through interactions';
}

/** The indices as numbers: one row per swept input, in axis order. */
export function SensitivityTable({ report, labels }: { report: SensitivityReport; labels: Record<string, string> }) {
  const level = Math.round(report.bootstrap.level * 100);
  return (
    <Table.ScrollContainer minWidth={720}>
      <Table striped withTableBorder fz="sm" data-testid="sensitivity-table">
        <Table.Thead>
          <Table.Tr>
            <Table.Th>Input</Table.Th>
            <Table.Th ta="right" style={{ whiteSpace: 'nowrap' }}>
              First order
            </Table.Th>
            <Table.Th ta="right">{level} % interval</Table.Th>
            <Table.Th ta="right">Total</Table.Th>
            <Table.Th ta="right">{level} % interval</Table.Th>
            <Table.Th>How it acts</Table.Th>
          </Table.Tr>
        </Table.Thead>
        <Table.Tbody>
          {report.indices.map((ix) => (
            <Table.Tr
              key={ix.input}
              data-testid={`sensitivity-row-${ix.input}`}
              data-first={ix.first ?? ''}
              data-total={ix.total ?? ''}
            >
              <Table.Td style={{ whiteSpace: 'nowrap' }}>
                <Text fz="sm" component="span">
                  {labels[ix.input] ?? ix.input}
                </Text>
              </Table.Td>
              <Table.Td ta="right" ff="monospace">
                {fmt(ix.first)}
              </Table.Td>
              <Table.Td ta="right" ff="monospace" c="dimmed" style={{ whiteSpace: 'nowrap' }}>
                {range(ix.firstCI)}
              </Table.Td>
              <Table.Td ta="right" ff="monospace">
                {fmt(ix.total)}
              </Table.Td>
              <Table.Td ta="right" ff="monospace" c="dimmed" style={{ whiteSpace: 'nowrap' }}>
                {range(ix.totalCI)}
              </Table.Td>
              <Table.Td>{reading(ix.first, ix.total, ix.totalCI)}</Table.Td>
            </Table.Tr>
          ))}
        </Table.Tbody>
      </Table>
    </Table.ScrollContainer>
  );
}
