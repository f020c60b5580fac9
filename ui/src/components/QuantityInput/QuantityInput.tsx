import { Text, TextInput, type TextInputProps } from '@mantine/core';
import { describeRange, type InputSpec } from '@driftgrid/domain';
import { prettyUnit, plainNumber } from '../../lib/format.js';

export interface QuantityInputProps extends Omit<TextInputProps, 'value' | 'onChange' | 'label' | 'error'> {
  spec: InputSpec;
  value: string;
  onChange: (text: string) => void;
  /** Message shown beside the field (parse or range error, or one the server named). */
  error?: string | null;
  /** Replaces the default label (symbol and name). */
  label?: string;
  /** Hide the one-line meaning (compact rows); the range is always shown. */
  compact?: boolean;
}

/**
 * One model input: symbol and key as label, the canonical unit beside the field, the allowed range
 * and the registry's one-line meaning underneath; accepts numbers in that unit or unit strings.
 * Test hook: `data-testid="input-<name>"` on the text field, `aria-label` = the input key.
 */
export function QuantityInput({ spec, value, onChange, error, label, compact, ...rest }: QuantityInputProps) {
  const unit = prettyUnit(spec.unit);
  return (
    <TextInput
      {...rest}
      label={label ?? `${spec.symbol}  (${spec.name})`}
      aria-label={spec.name}
      data-testid={`input-${spec.name}`}
      value={value}
      onChange={(e) => onChange(e.currentTarget.value)}
      error={error || undefined}
      placeholder={`${plainNumber(spec.default)}${unit ? ` ${spec.unit}` : ''}`}
      rightSection={
        unit ? (
          <Text fz="xs" c="dimmed" pr={6}>
            {unit}
          </Text>
        ) : undefined
      }
      rightSectionWidth={unit ? Math.max(36, unit.length * 8 + 14) : undefined}
      description={
        <>
          <span data-testid={`range-${spec.name}`}>Allowed {describeRange(spec)}</span>
          {compact ? null : <> · {spec.meaning}</>}
        </>
      }
      spellCheck={false}
      autoComplete="off"
      styles={{ input: { fontVariantNumeric: 'tabular-nums' } }}
    />
  );
}
