import { Alert, Group, List, Table, Text } from '@mantine/core';
import { IconAlertTriangle, IconCircleCheck, IconInfoCircle } from '@tabler/icons-react';
import type { ModelDefinition } from '@driftgrid/domain';
import { Num } from '../Num/Num.js';

/** An ordering without a threshold counts as large from here on (≪ 1 read as below 0.1, common practice). */
const LARGE_WITHOUT_THRESHOLD = 0.1;

type BannerModel = Pick<ModelDefinition, 'flags' | 'thresholds' | 'orderings' | 'outputs'>;

/**
 * The validity verdict of one point: the raised flags in words, then every ordering parameter of
 * the model with its value and its threshold, or "no threshold". It never says that every ordering
 * is below its threshold: an ordering without a threshold is shown with its value, and a large one
 * turns the verdict into "check". Test hooks: `flags` (data-count, data-state valid | check | invalid), `flag-<code>`, `ordering-<output>`.
 */
export function ValidityBanner({
  model,
  flags,
  values,
  thresholds,
}: {
  model: BannerModel;
  flags: readonly string[];
  values: Record<string, number | boolean>;
  thresholds?: Record<string, number>;
}) {
  const invalidating = flags.filter((c) => model.flags.find((f) => f.code === c)?.invalidates !== false);
  const notes = flags.filter((c) => !invalidating.includes(c));
  const limit = (name: string) => thresholds?.[name] ?? model.thresholds.find((t) => t.name === name)?.default;
  const largeUnwatched = model.orderings.filter(
    (o) => o.threshold === null && !(Math.abs(values[o.output] as number) < LARGE_WITHOUT_THRESHOLD),
  );
  const state = invalidating.length ? 'invalid' : largeUnwatched.length ? 'check' : 'valid';
  const title =
    state === 'invalid'
      ? `Outside the model's validity: ${invalidating.length} flag${invalidating.length > 1 ? 's' : ''} raised`
      : state === 'check'
        ? 'No flag raised, but an ordering without a threshold is not small'
        : 'No validity flag raised';
  const color = state === 'invalid' ? 'orange' : state === 'check' ? 'yellow' : 'teal';
  const Icon = state === 'valid' ? IconCircleCheck : IconAlertTriangle;
  const describe = (code: string) => model.flags.find((f) => f.code === code)?.meaning ?? 'flag raised';

  return (
    <Alert
      variant="light"
      color={color}
      icon={<Icon size={18} />}
      title={title}
      data-testid="flags"
      data-count={flags.length}
      data-state={state}
    >
      {flags.length ? (
        <List spacing={4} fz="sm">
          {[...invalidating, ...notes].map((code) => (
            <List.Item
              key={code}
              data-testid={`flag-${code}`}
              icon={notes.includes(code) ? <IconInfoCircle size={14} /> : <IconAlertTriangle size={14} />}
            >
              <Group gap={6} wrap="nowrap" align="baseline">
                <Text fz="sm" ff="monospace" fw={600} span>
                  {code}
                </Text>
                <Text fz="sm" span>
                  {notes.includes(code) ? '(note, the point stays valid) ' : ''}
                  {describe(code)}
                </Text>
              </Group>
            </List.Item>
          ))}
        </List>
      ) : null}
      {model.orderings.length ? (
        <Table fz="xs" verticalSpacing={2} mt={flags.length ? 'xs' : 0} data-testid="orderings">
          <Table.Thead>
            <Table.Tr>
              <Table.Th>Ordering</Table.Th>
              <Table.Th ta="right">Value</Table.Th>
              <Table.Th>Threshold</Table.Th>
            </Table.Tr>
          </Table.Thead>
          <Table.Tbody>
            {model.orderings.map((o) => {
              const spec = model.outputs.find((x) => x.name === o.output);
              const v = values[o.output];
              const t = o.threshold ? limit(o.threshold) : undefined;
              const large = o.threshold === null && largeUnwatched.includes(o);
              return (
                <Table.Tr key={o.output} data-testid={`ordering-${o.output}`} data-large={large || undefined}>
                  <Table.Td>
                    <Text fz="xs" span fw={500}>
                      {spec?.symbol ?? o.output}
                    </Text>{' '}
                    <Text fz="xs" c="dimmed" ff="monospace" span>
                      {o.output}
                    </Text>
                  </Table.Td>
                  <Table.Td ta="right">
                    <Num value={typeof v === 'number' ? v : null} unit="1" align="right" />
                  </Table.Td>
                  <Table.Td>
                    {t !== undefined ? (
                      <Text fz="xs" span>
                        flags at ≥ {t}
                      </Text>
                    ) : (
                      <Text fz="xs" span fw={large ? 600 : undefined}>
                        no threshold{large ? ' — not small here, judge it yourself' : ''}
                      </Text>
                    )}
                  </Table.Td>
                </Table.Tr>
              );
            })}
          </Table.Tbody>
        </Table>
      ) : (
        <Text fz="xs" c="dimmed">
          This model has no ordering parameters; its flags mark conditions where the relation has no usable value.
        </Text>
      )}
      {invalidating.length ? (
        <Text fz="xs" c="dimmed" mt={6}>
          The values are still computed; they come from a reduced fluid model used outside the range where it applies.
        </Text>
      ) : null}
    </Alert>
  );
}
