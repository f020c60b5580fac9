import { Group, Paper, SegmentedControl, Select, SimpleGrid, Text, TextInput } from '@mantine/core';
import { describeRange, type InputSpec } from '@driftgrid/domain';
import { prettyUnit, plainNumber } from '../../lib/format.js';
import type { AxisKind, InputChoice, InputMode } from './builderState.js';

export interface InputRowProps {
  spec: InputSpec;
  choice: InputChoice;
  onChange: (next: InputChoice) => void;
  /** Errors keyed `input.<name>.<field>` (value, min, max, count, values, param) or `input.<name>`. */
  errors: Record<string, string>;
  /** Position in the axes list when this input is an axis. */
  axisIndex: number | null;
}

const MODES: { value: InputMode; label: string }[] = [
  { value: 'default', label: 'Default' },
  { value: 'fixed', label: 'Fixed' },
  { value: 'axis', label: 'Axis' },
];

/**
 * One model input in the builder: keep the default, fix it (number, unit string or expression
 * over other inputs such as `Te_eV`) or sweep it along a linear, log or list axis.
 * Test hooks: `input-row-<name>`, `mode-<name>` (segmented control), `fixed-<name>`,
 * `axis-kind-<name>`, `axis-min-<name>`, `axis-max-<name>`, `axis-count-<name>`, `axis-values-<name>`.
 */
export function InputRow({ spec, choice, onChange, errors, axisIndex }: InputRowProps) {
  const unit = prettyUnit(spec.unit);
  const err = (f: string) => errors[`input.${spec.name}.${f}`];
  const set = (patch: Partial<InputChoice>) => onChange({ ...choice, ...patch });
  const whole = errors[`input.${spec.name}`] ?? err('param');
  const unitHint = unit ? ` (${unit}, or with units)` : '';
  return (
    <Paper withBorder p="sm" radius="sm" data-testid={`input-row-${spec.name}`}>
      <Group justify="space-between" align="flex-start" wrap="wrap" gap="xs">
        <div style={{ minWidth: 200, flex: '1 1 240px' }}>
          <Text fz="sm" fw={600}>
            {spec.symbol}{' '}
            <Text span fz="xs" c="dimmed" ff="monospace">
              {spec.name}
            </Text>
            {unit ? (
              <Text span fz="xs" c="dimmed">
                {' '}
                · {unit}
              </Text>
            ) : null}
            {axisIndex !== null ? (
              <Text span fz="xs" c="tide" fw={600}>
                {' '}
                · axis {axisIndex + 1}
              </Text>
            ) : null}
          </Text>
          <Text fz="xs" c="dimmed">
            {spec.meaning} Allowed {describeRange(spec)}; default {plainNumber(spec.default)}
            {unit ? ` ${unit}` : ''}.
          </Text>
        </div>
        <SegmentedControl
          size="xs"
          data-testid={`mode-${spec.name}`}
          aria-label={`How ${spec.name} is set`}
          value={choice.mode}
          onChange={(v) => set({ mode: v as InputMode })}
          data={MODES}
        />
      </Group>
      {whole ? (
        <Text fz="xs" c="red" mt={4} role="alert">
          {whole}
        </Text>
      ) : null}
      {choice.mode === 'fixed' ? (
        <TextInput
          mt="xs"
          size="xs"
          label={`Value${unitHint} or expression over other inputs`}
          aria-label={`${spec.name} fixed value`}
          data-testid={`fixed-${spec.name}`}
          placeholder={`${plainNumber(spec.default)}${unit ? ` ${spec.unit}` : ''}, or e.g. Te_eV`}
          value={choice.value}
          onChange={(e) => set({ value: e.currentTarget.value })}
          error={err('value')}
          spellCheck={false}
        />
      ) : null}
      {choice.mode === 'axis' ? (
        <SimpleGrid mt="xs" cols={{ base: 1, sm: choice.kind === 'list' ? 2 : 4 }} spacing="xs">
          <Select
            size="xs"
            label="Spacing"
            aria-label={`${spec.name} axis kind`}
            data-testid={`axis-kind-${spec.name}`}
            value={choice.kind}
            onChange={(v) => v && set({ kind: v as AxisKind })}
            data={[
              { value: 'linear', label: 'Linear' },
              { value: 'log', label: 'Logarithmic' },
              { value: 'list', label: 'List of values' },
            ]}
            allowDeselect={false}
            error={err('kind')}
          />
          {choice.kind === 'list' ? (
            <TextInput
              size="xs"
              label={`Values${unitHint}, comma-separated`}
              aria-label={`${spec.name} axis values`}
              data-testid={`axis-values-${spec.name}`}
              placeholder="0.01, 0.02, 0.05"
              value={choice.values}
              onChange={(e) => set({ values: e.currentTarget.value })}
              error={err('values')}
              spellCheck={false}
            />
          ) : (
            <>
              <TextInput
                size="xs"
                label={`From${unit ? ` (${unit})` : ''}`}
                aria-label={`${spec.name} axis min`}
                data-testid={`axis-min-${spec.name}`}
                value={choice.min}
                onChange={(e) => set({ min: e.currentTarget.value })}
                error={err('min')}
                spellCheck={false}
              />
              <TextInput
                size="xs"
                label={`To${unit ? ` (${unit})` : ''}`}
                aria-label={`${spec.name} axis max`}
                data-testid={`axis-max-${spec.name}`}
                value={choice.max}
                onChange={(e) => set({ max: e.currentTarget.value })}
                error={err('max')}
                spellCheck={false}
              />
              <TextInput
                size="xs"
                label="Points (grid)"
                aria-label={`${spec.name} axis count`}
                data-testid={`axis-count-${spec.name}`}
                value={choice.count}
                onChange={(e) => set({ count: e.currentTarget.value })}
                error={err('count')}
                inputMode="numeric"
              />
            </>
          )}
        </SimpleGrid>
      ) : null}
    </Paper>
  );
}
