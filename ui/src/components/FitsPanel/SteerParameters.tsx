import { Checkbox, Table, Text, TextInput } from '@mantine/core';
import { EMPTY_STEER, type SteerRow } from './builder-state.js';

/**
 * One row per model parameter: hold it at a value, or keep it inside [lowest, highest] (either side may
 * stay open). Fixed parameters are not fitted and count no degree of freedom. Test hooks: `steer-<name>`.
 */
export function SteerParameters({
  names,
  steer,
  onChange,
  errorFor,
}: {
  names: string[];
  steer: Record<string, SteerRow>;
  onChange: (name: string, row: SteerRow) => void;
  errorFor: (key: string) => string | undefined;
}) {
  if (names.length === 0)
    return (
      <Text fz="xs" c="dimmed">
        Parameters appear here once the model has them (for an expression: once start values are given).
      </Text>
    );
  return (
    <Table fz="sm" verticalSpacing={4} withTableBorder data-testid="fit-steer">
      <Table.Thead>
        <Table.Tr>
          <Table.Th>Parameter</Table.Th>
          <Table.Th>Hold fixed</Table.Th>
          <Table.Th>Fixed value</Table.Th>
          <Table.Th>Lowest</Table.Th>
          <Table.Th>Highest</Table.Th>
        </Table.Tr>
      </Table.Thead>
      <Table.Tbody>
        {names.map((name) => {
          const row = steer[name] ?? EMPTY_STEER;
          const set = (patch: Partial<SteerRow>) => onChange(name, { ...row, ...patch });
          const boundError = errorFor(`bounds.${name}`);
          return (
            <Table.Tr key={name} data-testid={`steer-${name}`}>
              <Table.Td ff="monospace">{name}</Table.Td>
              <Table.Td>
                <Checkbox
                  aria-label={`Hold ${name} fixed`}
                  checked={row.fixed}
                  onChange={(e) => set({ fixed: e.currentTarget.checked })}
                />
              </Table.Td>
              <Table.Td>
                <TextInput
                  aria-label={`${name} fixed value`}
                  size="xs"
                  w={110}
                  disabled={!row.fixed}
                  value={row.value}
                  onChange={(e) => set({ value: e.currentTarget.value })}
                  error={errorFor(`fixed.${name}`)}
                />
              </Table.Td>
              <Table.Td>
                <TextInput
                  aria-label={`${name} lowest value`}
                  size="xs"
                  w={110}
                  placeholder="open"
                  disabled={row.fixed}
                  value={row.lo}
                  onChange={(e) => set({ lo: e.currentTarget.value })}
                  error={boundError}
                />
              </Table.Td>
              <Table.Td>
                <TextInput
                  aria-label={`${name} highest value`}
                  size="xs"
                  w={110}
                  placeholder="open"
                  disabled={row.fixed}
                  value={row.hi}
                  onChange={(e) => set({ hi: e.currentTarget.value })}
                  error={boundError ? ' ' : undefined}
                />
              </Table.Td>
            </Table.Tr>
          );
        })}
      </Table.Tbody>
    </Table>
  );
}
