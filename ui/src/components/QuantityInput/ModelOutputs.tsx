import { Alert, Group, List, Table, Text, ThemeIcon } from '@mantine/core';
import { IconAlertTriangle, IconCircleCheck } from '@tabler/icons-react';
import type { FlagSpec, OutputSpec } from '@driftgrid/domain';
import { Num } from '../Num/Num.js';
import { fullPrecision } from '../../lib/format.js';

/**
 * A point's outputs as a compact table (4 significant figures, unit beside, full value on hover)
 * and its validity flags in words. Test hooks: `output-<name>` cells carry `data-value` (full
 * precision), `flags` holds one `flag-<code>` item per raised flag.
 */
export function OutputsTable({
  outputs,
  values,
}: {
  outputs: readonly OutputSpec[];
  values: Record<string, number | boolean>;
}) {
  return (
    <Table striped highlightOnHover withTableBorder verticalSpacing={4} fz="sm" data-testid="outputs-table">
      <Table.Thead>
        <Table.Tr>
          <Table.Th>Output</Table.Th>
          <Table.Th ta="right">Value</Table.Th>
          <Table.Th>Meaning</Table.Th>
        </Table.Tr>
      </Table.Thead>
      <Table.Tbody>
        {outputs.map((o) => {
          const v = values[o.name];
          return (
            <Table.Tr key={o.name}>
              <Table.Td>
                <Text fz="sm" fw={500} span>
                  {o.symbol}
                </Text>{' '}
                <Text fz="xs" c="dimmed" span ff="monospace">
                  {o.name}
                </Text>
              </Table.Td>
              <Table.Td
                ta="right"
                data-testid={`output-${o.name}`}
                data-value={typeof v === 'number' ? String(v) : String(v)}
                data-unit={o.unit}
              >
                {o.kind === 'boolean' ? (
                  <Text fz="sm" span>
                    {v ? 'yes' : 'no'}
                  </Text>
                ) : (
                  <Num value={typeof v === 'number' ? v : null} unit={o.unit} align="right" />
                )}
              </Table.Td>
              <Table.Td>
                <Text fz="xs" c="dimmed" title={typeof v === 'number' ? fullPrecision(v, o.unit) : undefined}>
                  {o.meaning}
                </Text>
              </Table.Td>
            </Table.Tr>
          );
        })}
      </Table.Tbody>
    </Table>
  );
}

export function FlagList({ flags, specs }: { flags: readonly string[]; specs: readonly FlagSpec[] }) {
  if (flags.length === 0) {
    return (
      <Alert
        variant="light"
        color="teal"
        icon={<IconCircleCheck size={18} />}
        title="Inside the model's validity"
        data-testid="flags"
        data-count={0}
      >
        No validity flag is raised at this point (orderings without a threshold are not judged here).
      </Alert>
    );
  }
  return (
    <Alert
      variant="light"
      color="orange"
      icon={<IconAlertTriangle size={18} />}
      title={`Outside the model's validity: ${flags.length} flag${flags.length > 1 ? 's' : ''} raised`}
      data-testid="flags"
      data-count={flags.length}
    >
      <List
        spacing={4}
        fz="sm"
        icon={
          <ThemeIcon size={16} radius="xl" color="orange" variant="light">
            <IconAlertTriangle size={11} />
          </ThemeIcon>
        }
      >
        {flags.map((code) => {
          const spec = specs.find((f) => f.code === code);
          return (
            <List.Item key={code} data-testid={`flag-${code}`}>
              <Group gap={6} wrap="nowrap" align="baseline">
                <Text fz="sm" ff="monospace" fw={600} span>
                  {code}
                </Text>
                <Text fz="sm" span>
                  {spec?.meaning ?? 'flag raised'}
                </Text>
              </Group>
            </List.Item>
          );
        })}
      </List>
      <Text fz="xs" c="dimmed" mt={6}>
        The values are still computed; they come from a reduced fluid model used outside the range where it applies.
      </Text>
    </Alert>
  );
}
