import { Alert, Group, Paper, SimpleGrid, Stack, Table, Text } from '@mantine/core';
import { IconAlertTriangle, IconCircleCheck } from '@tabler/icons-react';
import { Num } from '../Num/Num.js';
import { prettyUnit } from '../../lib/format.js';
import { FitStatus } from './FitStatus.js';
import { MODEL_LABEL, xList, type FitView } from './fit-types.js';

/** Readable parameter names: `exp_B_T` is "exponent of B_T". */
function paramLabel(name: string): string {
  if (name.startsWith('exp_')) return `exponent of ${name.slice(4)}`;
  if (name === 'gamma') return 'γ (polytropic index)';
  if (name === 'Te_eV') return 'Te';
  return name;
}

function Stat({ label, children, testId }: { label: string; children: React.ReactNode; testId?: string }) {
  return (
    <div data-testid={testId}>
      <Text fz="xs" c="dimmed">
        {label}
      </Text>
      <Text fz="sm" component="div">
        {children}
      </Text>
    </div>
  );
}

/**
 * A fit's result: parameters with value ± standard error and the 95 % interval, goodness of fit,
 * convergence in words and icon, points used and dropped. Test hooks: `fit-param-<name>` rows carry
 * data-value and data-stderr with full precision.
 */
export function FitResult({ fit }: { fit: FitView }) {
  const live = fit.status === 'queued' || fit.status === 'running';
  const level = Math.round((fit.confidence?.level ?? 0.95) * 100);
  return (
    <Paper withBorder p="md" radius="sm" data-testid="fit-result" data-fit-id={fit.id} data-status={fit.status}>
      <Stack gap="sm">
        <Group justify="space-between" wrap="wrap">
          <Text fw={600}>
            {MODEL_LABEL[fit.model] ?? fit.model}: {fit.y} against {xList(fit.x).join(', ')}
          </Text>
          <FitStatus fit={fit} />
        </Group>
        {live ? (
          <Text fz="sm" c="dimmed">
            This fit runs in the background; the result appears here when it is done.
          </Text>
        ) : null}
        {fit.error && !fit.parameters ? (
          <Alert color="red" variant="light" icon={<IconAlertTriangle size={16} />} title="The fit failed">
            {fit.error}
          </Alert>
        ) : null}
        {fit.parameters ? (
          <>
            {fit.converged === false ? (
              <Alert
                color="orange"
                variant="light"
                icon={<IconAlertTriangle size={16} />}
                title="Not converged — do not use these values"
              >
                {fit.message}
              </Alert>
            ) : null}
            <Table striped withTableBorder fz="sm" data-testid="fit-parameters">
              <Table.Thead>
                <Table.Tr>
                  <Table.Th>Parameter</Table.Th>
                  <Table.Th ta="right">Value ± standard error</Table.Th>
                  <Table.Th ta="right">{level} % confidence interval</Table.Th>
                  <Table.Th>Unit</Table.Th>
                </Table.Tr>
              </Table.Thead>
              <Table.Tbody>
                {fit.parameters.map((p) => (
                  <Table.Tr
                    key={p.name}
                    data-testid={`fit-param-${p.name}`}
                    data-value={String(p.value)}
                    data-stderr={String(p.stdError)}
                  >
                    <Table.Td>
                      <Text fz="sm" ff="monospace" span>
                        {p.name}
                      </Text>
                      {paramLabel(p.name) !== p.name ? (
                        <Text fz="xs" c="dimmed" span>
                          {' '}
                          — {paramLabel(p.name)}
                        </Text>
                      ) : null}
                    </Table.Td>
                    <Table.Td ta="right">
                      <Num value={p.value} sig={6} /> ± <Num value={p.stdError} sig={3} />
                    </Table.Td>
                    <Table.Td ta="right">
                      {p.ci95 ? (
                        <>
                          <Num value={p.ci95.low} sig={6} /> … <Num value={p.ci95.high} sig={6} />
                        </>
                      ) : (
                        '—'
                      )}
                    </Table.Td>
                    <Table.Td>{p.unit === '1' ? 'dimensionless' : p.unit ? prettyUnit(p.unit) : '—'}</Table.Td>
                  </Table.Tr>
                ))}
              </Table.Tbody>
            </Table>
            <SimpleGrid cols={{ base: 2, sm: 4 }} spacing="sm">
              <Stat label="Converged" testId="fit-converged">
                <Group gap={4} wrap="nowrap">
                  {fit.converged ? (
                    <IconCircleCheck size={16} color="var(--mantine-color-moss-6)" aria-hidden />
                  ) : (
                    <IconAlertTriangle size={16} color="var(--mantine-color-rust-6)" aria-hidden />
                  )}
                  {fit.converged ? 'Yes' : 'No'}
                </Group>
              </Stat>
              <Stat label="R²" testId="fit-r2">
                <Num value={fit.r2} sig={8} />
              </Stat>
              <Stat label="RMSE">
                <Num value={fit.rmse} />
              </Stat>
              <Stat label="Residual standard deviation">
                <Num value={fit.residualSd} />
              </Stat>
              {fit.chi2red !== undefined ? (
                <Stat label="Reduced χ²">
                  <Num value={fit.chi2red} />
                </Stat>
              ) : null}
              <Stat label="Degrees of freedom">
                <Num value={fit.dof} />
              </Stat>
              <Stat label="Iterations">
                <Num value={fit.iterations} />
              </Stat>
              <Stat label="Points used" testId="fit-n">
                <Num value={fit.n} />
              </Stat>
              <Stat label="Rows dropped (missing values)" testId="fit-dropped">
                <Num value={fit.dropped} />
              </Stat>
            </SimpleGrid>
            <Text fz="xs" c="dimmed">
              {fit.message}. Intervals: value ± t·(standard error), t = <Num value={fit.confidence?.t} sig={5} /> the
              Student-t quantile for {fit.dof} degrees of freedom. Standard errors from s²·(JᵀJ)⁻¹
              {fit.chi2red !== undefined ? ' scaled by the reduced χ² (weighted fit)' : ''}.
              {fit.signRestored
                ? ' y is negative everywhere: the power law was fitted to |y| and C carries the sign.'
                : ''}
            </Text>
          </>
        ) : null}
        <Text fz="xs" c="dimmed">
          Fit {fit.id} by {fit.owner.name}, {new Date(fit.createdAt).toLocaleString()} · app {fit.appVersion}
          {fit.modelVersion ? ` · source model version ${fit.modelVersion}` : ''}
        </Text>
      </Stack>
    </Paper>
  );
}
