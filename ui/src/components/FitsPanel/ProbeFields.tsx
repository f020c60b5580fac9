import { Group, SimpleGrid, Switch, Text, TextInput } from '@mantine/core';
import type { FitModel, ProbeOptions } from './builder-state.js';

/**
 * Probe options: collecting area and ion mass (for the density from I_is), the sheath factor h, the
 * retardation window (single probe; empty = chosen below the knee automatically) and the slope term.
 */
export function ProbeFields({
  model,
  probe,
  onChange,
  errorFor,
}: {
  model: FitModel;
  probe: ProbeOptions;
  onChange: (patch: Partial<ProbeOptions>) => void;
  errorFor: (key: string) => string | undefined;
}) {
  return (
    <div data-testid="fit-probe">
      <Text fz="sm" fw={500} mb={4}>
        Probe
      </Text>
      <SimpleGrid cols={{ base: 1, sm: 3 }} spacing="sm">
        <TextInput
          label="Collecting area (mm²)"
          data-testid="fit-probe-area"
          placeholder="e.g. 2"
          description="Needed for the density n"
          value={probe.areaMm2}
          onChange={(e) => onChange({ areaMm2: e.currentTarget.value })}
          error={errorFor('probe.area_m2')}
        />
        <TextInput
          label="Ion mass μ (proton masses)"
          data-testid="fit-probe-mu"
          description="Argon 39.948, deuterium 2.014"
          value={probe.mu}
          onChange={(e) => onChange({ mu: e.currentTarget.value })}
          error={errorFor('probe.mu')}
        />
        <TextInput
          label="Sheath factor h"
          data-testid="fit-probe-h"
          description="n at the sheath edge over n; 0.61 by default"
          value={probe.h}
          onChange={(e) => onChange({ h: e.currentTarget.value })}
          error={errorFor('probe.h')}
        />
      </SimpleGrid>
      <Group mt="sm" gap="sm" align="flex-end">
        {model === 'probe-retarding' ? (
          <>
            <TextInput
              label="Window from (V)"
              data-testid="fit-probe-vmin"
              placeholder="automatic"
              w={140}
              value={probe.vMin}
              onChange={(e) => onChange({ vMin: e.currentTarget.value })}
              error={errorFor('range')}
            />
            <TextInput
              label="to (V)"
              data-testid="fit-probe-vmax"
              placeholder="automatic"
              w={140}
              value={probe.vMax}
              onChange={(e) => onChange({ vMax: e.currentTarget.value })}
            />
          </>
        ) : null}
        <Switch
          label={model === 'probe-retarding' ? 'Sheath-expansion slope' : 'Slope term'}
          data-testid="fit-probe-slope"
          checked={probe.slope}
          onChange={(e) => onChange({ slope: e.currentTarget.checked })}
        />
      </Group>
      {model === 'probe-retarding' ? (
        <Text fz="xs" c="dimmed" mt={4}>
          Leave the window empty to fit the electron-retardation region below the knee, found from the trace.
        </Text>
      ) : null}
    </div>
  );
}
