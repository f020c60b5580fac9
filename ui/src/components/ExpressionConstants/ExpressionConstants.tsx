import { Group, Text, Tooltip } from '@mantine/core';
import { EXPRESSION_CONSTANTS } from '@driftgrid/domain';

/**
 * The physical constants an expression may use (CODATA 2018, the domain's one constant scope),
 * listed beside derived-column and fit expression fields. Each name shows its value on hover.
 * Test hook: `expression-constants`.
 */
export function ExpressionConstants() {
  return (
    <Group gap={6} data-testid="expression-constants" wrap="wrap">
      <Text fz="xs" c="dimmed" span>
        Constants (SI):
      </Text>
      {EXPRESSION_CONSTANTS.map((c) => (
        <Tooltip key={c.name} label={`${c.meaning}: ${c.value} ${c.unit}`} withArrow>
          <Text fz="xs" ff="monospace" span tabIndex={0} aria-label={`${c.name}, ${c.meaning}, ${c.value} ${c.unit}`}>
            {c.name}
          </Text>
        </Tooltip>
      ))}
      <Text fz="xs" c="dimmed" span>
        pi; write exp(1) for Euler&apos;s number (a bare e is refused).
      </Text>
    </Group>
  );
}
