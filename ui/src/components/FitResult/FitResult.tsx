import { Alert, Badge, Button, Group, Paper, SimpleGrid, Stack, Table, Text } from '@mantine/core';
import { IconAlertTriangle, IconCircleCheck } from '@tabler/icons-react';
import { Num } from '../Num/Num.js';
import { prettyUnit } from '../../lib/format.js';
import { FitCorrelation } from './FitCorrelation.js';
import { FitStatus } from './FitStatus.js';
import { MODEL_LABEL, xList, type FitView } from './fit-types.js';
import { formatDateTime } from '../../lib/formatDate.js';
import { parameterLabel, parameterUnit } from './param-units.js';

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
export function FitResult({
  fit,
  onStartFrom,
  startFromLabel = 'Fill the form with the last iterate as start values',
}: {
  fit: FitView;
  /** Fills the fit form with these start values (offered when the fit did not converge). */
  onStartFrom?: (values: Record<string, number>) => void;
  /** The button's words where the form is elsewhere (the saved-fit page opens the Fits page's form). */
  startFromLabel?: string;
}) {
  const live = fit.status === 'queued' || fit.status === 'running';
  const level = Math.round((fit.confidence?.level ?? 0.95) * 100);
  const yUnit = fit.units?.[fit.y];
  const inY = yUnit && yUnit !== '1' ? ` ${prettyUnit(yUnit)}` : '';
  const unitLabel = (u: string | null | undefined) => (u === '1' ? 'dimensionless' : u ? prettyUnit(u) : '—');
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
                {fit.advice ? (
                  <Stack gap={6} mt="xs" data-testid="fit-advice" data-suspect={fit.advice.suspect}>
                    <Text fz="sm" fw={600}>
                      Suspect the {fit.advice.suspect === 'start' ? 'start values' : 'data'}.
                    </Text>
                    <Text fz="xs" ff="monospace">
                      Last iterate:{' '}
                      {Object.entries(fit.advice.lastIterate)
                        .map(([k, v]) => `${k} = ${v.toPrecision(6)}`)
                        .join(', ')}
                    </Text>
                    {onStartFrom ? (
                      <Group>
                        <Button
                          size="compact-sm"
                          variant="light"
                          data-testid="fit-start-from-last"
                          onClick={() => onStartFrom(fit.advice!.lastIterate)}
                        >
                          {startFromLabel}
                        </Button>
                      </Group>
                    ) : null}
                  </Stack>
                ) : null}
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
                    data-fixed={String(p.fixed === true)}
                  >
                    <Table.Td>
                      <Text fz="sm" ff="monospace" span>
                        {p.name}
                      </Text>
                      {parameterLabel(fit, p.name) !== p.name ? (
                        <Text fz="xs" c="dimmed" span>
                          {' '}
                          — {parameterLabel(fit, p.name)}
                        </Text>
                      ) : null}
                      {p.fixed ? (
                        <Badge size="xs" variant="outline" color="gray" ml={6} tt="none">
                          held fixed
                        </Badge>
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
                    <Table.Td data-testid={`fit-param-unit-${p.name}`}>{unitLabel(parameterUnit(fit, p))}</Table.Td>
                  </Table.Tr>
                ))}
              </Table.Tbody>
            </Table>
            {fit.derived?.length ? (
              <Table withTableBorder fz="sm" data-testid="fit-derived">
                <Table.Thead>
                  <Table.Tr>
                    <Table.Th>Derived quantity</Table.Th>
                    <Table.Th ta="right">Value ± standard error</Table.Th>
                    <Table.Th>Unit</Table.Th>
                  </Table.Tr>
                </Table.Thead>
                <Table.Tbody>
                  {fit.derived.map((d) => (
                    <Table.Tr
                      key={d.name}
                      data-testid={`fit-derived-${d.name}`}
                      data-value={String(d.value)}
                      data-stderr={String(d.stdError)}
                    >
                      <Table.Td>
                        <Text fz="sm" ff="monospace" span>
                          {d.name}
                        </Text>
                        <Text fz="xs" c="dimmed">
                          {d.method}
                        </Text>
                      </Table.Td>
                      <Table.Td ta="right">
                        <Num value={d.value} sig={4} /> ± <Num value={d.stdError} sig={2} />
                      </Table.Td>
                      <Table.Td>{unitLabel(d.unit)}</Table.Td>
                    </Table.Tr>
                  ))}
                </Table.Tbody>
              </Table>
            ) : null}
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
              <Stat label={`RMSE${inY ? ` (${inY.trim()})` : ''}`} testId="fit-rmse">
                <Num value={fit.rmse} />
                {inY}
              </Stat>
              <Stat label={`Residual standard deviation${inY ? ` (${inY.trim()})` : ''}`}>
                <Num value={fit.residualSd} />
                {inY}
              </Stat>
              {fit.chi2 !== undefined ? (
                <Stat label="χ² (dimensionless)" testId="fit-chi2">
                  <Num value={fit.chi2} />
                </Stat>
              ) : null}
              {fit.chi2PValue !== undefined ? (
                <Stat label="p-value of χ²" testId="fit-chi2-p">
                  <Num value={fit.chi2PValue} sig={3} />
                </Stat>
              ) : null}
              {fit.chi2red !== undefined ? (
                <Stat label="Reduced χ² (dimensionless)">
                  <Num value={fit.chi2red} />
                </Stat>
              ) : null}
              {fit.sigmaMode ? (
                <Stat label="σ taken as" testId="fit-sigma-mode-used">
                  {fit.sigmaMode === 'absolute' ? 'absolute errors' : 'relative weights'}
                </Stat>
              ) : null}
              <Stat label="AIC (dimensionless)" testId="fit-aic">
                <Num value={fit.aic} sig={6} />
              </Stat>
              <Stat label="BIC (dimensionless)" testId="fit-bic">
                <Num value={fit.bic} sig={6} />
              </Stat>
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
            {fit.correlation ? (
              <FitCorrelation names={fit.parameters.map((p) => p.name)} correlation={fit.correlation} />
            ) : null}
            {fit.region ? (
              <Text fz="xs" c="dimmed" data-testid="fit-region">
                Fitted window: {fit.region.vMin} V to <Num value={fit.region.vMax} sig={4} /> V (
                {fit.region.automatic ? 'retardation region found below the knee' : 'as requested'}), {fit.region.used}{' '}
                of {fit.region.of} points.
              </Text>
            ) : null}
            <Text fz="xs" c="dimmed">
              {fit.message}. Intervals: value ± t·(standard error), t = <Num value={fit.confidence?.t} sig={5} /> the
              Student-t quantile for {fit.dof} degrees of freedom. Standard errors from s²·(JᵀJ)⁻¹
              {fit.sigmaMode === 'absolute'
                ? ': σ taken as the true errors, covariance (JᵀWJ)⁻¹ unscaled'
                : fit.chi2red !== undefined
                  ? ' scaled by the reduced χ² (weighted fit, relative σ)'
                  : ''}
              . AIC = n·ln(χ²/n) + 2k and BIC = n·ln(χ²/n) + k·ln n with k free parameters (compare fits of the same
              data only; lower is better).
              {fit.signRestored
                ? ' y is negative everywhere: the power law was fitted to |y| and C carries the sign.'
                : ''}
            </Text>
          </>
        ) : null}
        <Text fz="xs" c="dimmed">
          Fit {fit.id} by {fit.owner.name}, {formatDateTime(fit.createdAt)} · app {fit.appVersion}
          {fit.modelVersion ? ` · source model version ${fit.modelVersion}` : ''}
        </Text>
      </Stack>
    </Paper>
  );
}
