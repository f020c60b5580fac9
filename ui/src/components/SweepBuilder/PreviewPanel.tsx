import { Alert, Badge, Group, Loader, Paper, Stack, Table, Text, Title } from '@mantine/core';
import { IconAlertTriangle, IconCircleCheck, IconClock, IconHandStop } from '@tabler/icons-react';
import { chunkCount, DEFAULT_CHUNK_SIZE, type CompiledSweep, type PointEvaluation } from '@driftgrid/domain';
import { Num } from '../Num/Num.js';
import { FlagList } from '../QuantityInput/ModelOutputs.js';
import { QuotaMeters } from '../QuotaMeters/QuotaMeters.js';
import { useMe } from '../../api/auth.js';
import type { SweepPreviewView } from '../../api/sweeps.js';
import { formatCount, formatNumber } from '../../lib/format.js';

export interface PreviewPanelProps {
  compiled: CompiledSweep | null;
  sample: PointEvaluation | null;
  sampleError: string | null;
  /** Problems shown beside their fields, each with the field's label. */
  localErrors: { path: string; label?: string; message: string }[];
  server: SweepPreviewView | undefined;
  serverLoading: boolean;
  serverError: string | null;
}

function seconds(s: number): string {
  if (s < 1) return 'under a second';
  if (s < 90) return `about ${formatNumber(s, 2)} s`;
  return `about ${formatNumber(s / 60, 2)} min`;
}

/**
 * Live preview of a definition: point and chunk counts and a sample point computed in the browser,
 * then the server's estimate and quota verdict. Test hooks: `preview-points`, `preview-chunks`,
 * `preview-sample`, `preview-errors`, `preview-estimate`, `quota-verdict`, `quota-violation`.
 */
export function PreviewPanel({
  compiled,
  sample,
  sampleError,
  localErrors,
  server,
  serverLoading,
  serverError,
}: PreviewPanelProps) {
  const violations = server?.quota?.violations ?? [];
  const me = useMe();
  return (
    <Paper withBorder p="md" radius="sm" data-testid="sweep-preview" id="sweep-preview">
      <Stack gap="sm">
        <Title order={2} fz="h4">
          Preview
        </Title>
        {localErrors.length ? (
          <Alert
            color="red"
            variant="light"
            icon={<IconAlertTriangle size={18} />}
            title={`${localErrors.length} problem${localErrors.length > 1 ? 's' : ''} to fix`}
            data-testid="preview-errors"
          >
            <Stack gap={2}>
              {localErrors.map((e, i) => (
                <Text fz="xs" key={i}>
                  <Text span fz="xs" fw={600}>
                    {e.label ?? 'Sweep definition'}:
                  </Text>{' '}
                  {e.message}
                </Text>
              ))}
            </Stack>
          </Alert>
        ) : null}
        {compiled ? (
          <>
            <Group gap="xl">
              <div>
                <Text fz="xs" c="dimmed">
                  Points
                </Text>
                <Text
                  fz="xl"
                  fw={600}
                  data-testid="preview-points"
                  data-value={compiled.totalPoints}
                  style={{ fontVariantNumeric: 'tabular-nums' }}
                >
                  {formatCount(compiled.totalPoints)}
                </Text>
              </div>
              <div>
                <Text fz="xs" c="dimmed">
                  Chunks
                </Text>
                <Text fz="xl" fw={600} data-testid="preview-chunks" style={{ fontVariantNumeric: 'tabular-nums' }}>
                  {formatCount(server?.chunks ?? chunkCount(compiled.totalPoints, DEFAULT_CHUNK_SIZE))}
                </Text>
              </div>
              <div>
                <Text fz="xs" c="dimmed">
                  Estimated run time
                </Text>
                <Text fz="sm" fw={500} data-testid="preview-estimate">
                  {server?.estimate ? (
                    <>
                      <IconClock size={14} style={{ verticalAlign: -2 }} /> {seconds(server.estimate.seconds)}
                    </>
                  ) : serverLoading ? (
                    <Loader size="xs" />
                  ) : (
                    '—'
                  )}
                </Text>
              </div>
            </Group>
            {serverError ? (
              <Alert color="yellow" variant="light" title="The server could not preview this sweep">
                {serverError}
              </Alert>
            ) : server?.quota ? (
              server.quota.allowed ? (
                <Alert
                  color="teal"
                  variant="light"
                  icon={<IconCircleCheck size={18} />}
                  title="Within your quota"
                  data-testid="quota-verdict"
                  data-allowed="true"
                >
                  {formatCount(compiled.totalPoints)} points fit every limit of your quota.
                </Alert>
              ) : (
                <Alert
                  color="red"
                  variant="filled"
                  icon={<IconHandStop size={18} />}
                  title="Refused by your quota"
                  data-testid="quota-verdict"
                  data-allowed="false"
                >
                  <Stack gap={2}>
                    {violations.map((v) => (
                      <Text fz="sm" key={v.limit} data-testid="quota-violation" data-limit={v.limit}>
                        <strong>{v.label}</strong>: {v.message}.
                      </Text>
                    ))}
                  </Stack>
                </Alert>
              )
            ) : serverLoading ? (
              <Group gap="xs">
                <Loader size="xs" />
                <Text fz="xs" c="dimmed">
                  Asking the server for the estimate and your quota…
                </Text>
              </Group>
            ) : null}
            {me.data?.quota ? (
              <QuotaMeters quota={me.data.quota} usage={me.data.usage} requested={compiled.totalPoints} />
            ) : null}
            <div data-testid="preview-sample">
              <Text fz="sm" fw={500} mb={4}>
                Sample point #0{' '}
                <Badge size="xs" variant="light" color="gray" tt="none">
                  computed in your browser
                </Badge>
              </Text>
              {sampleError ? (
                <Text fz="xs" c="red">
                  {sampleError}
                </Text>
              ) : null}
              {sample ? (
                <Stack gap="xs">
                  <Table withTableBorder verticalSpacing={2} fz="xs">
                    <Table.Tbody>
                      {compiled.columns
                        .filter((c) => c.kind === 'input' || c.kind === 'output' || c.kind === 'derived')
                        .map((c) => {
                          const v =
                            c.kind === 'input'
                              ? sample.inputs[c.name]
                              : c.kind === 'derived'
                                ? sample.derived[c.name]
                                : sample.outputs[c.name];
                          return (
                            <Table.Tr key={`${c.kind}-${c.name}`}>
                              <Table.Td ff="monospace">{c.name}</Table.Td>
                              <Table.Td c="dimmed">{c.kind}</Table.Td>
                              <Table.Td ta="right" data-testid={`sample-${c.name}`} data-value={String(v)}>
                                {typeof v === 'boolean' ? (
                                  v ? (
                                    'yes'
                                  ) : (
                                    'no'
                                  )
                                ) : (
                                  <Num value={typeof v === 'number' ? v : null} unit={c.unit} align="right" />
                                )}
                              </Table.Td>
                            </Table.Tr>
                          );
                        })}
                    </Table.Tbody>
                  </Table>
                  <FlagList flags={sample.flags} specs={compiled.model.flags} />
                </Stack>
              ) : null}
            </div>
          </>
        ) : localErrors.length === 0 ? (
          <Text fz="sm" c="dimmed">
            Choose a model and make at least one input an axis to see the point count and a sample point.
          </Text>
        ) : null}
      </Stack>
    </Paper>
  );
}
