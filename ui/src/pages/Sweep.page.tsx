import {
  Alert,
  Badge,
  Button,
  Card,
  Code,
  Group,
  MultiSelect,
  Progress,
  SegmentedControl,
  SimpleGrid,
  Skeleton,
  Stack,
  Table,
  Tabs,
  Text,
  Title,
} from '@mantine/core';
import { IconAlertTriangle, IconChartDots3, IconPlayerStop } from '@tabler/icons-react';
import { getModel } from '@driftgrid/domain';
import { lazy, Suspense, useEffect, useMemo, useState } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { useMe } from '../api/auth.js';
import { ApiError } from '../api/client.js';
import { useUserDirectory } from '../api/users.js';
import { EmptyState } from '../components/EmptyState/EmptyState.js';
import { Num } from '../components/Num/Num.js';
import { PageHeader } from '../components/PageHeader/PageHeader.js';
import { ResultsTable } from '../components/ResultsTable/ResultsTable.js';
import { ACTIVE, useCancelSweep, useSaveSharing, useSweep, type SweepView } from '../api/sweeps.js';
import { StatusBadge } from '../components/StatusBadge/StatusBadge.js';
import { formatCount, formatPercent, prettyUnit } from '../lib/format.js';
import { FitsPanel } from '../components/FitsPanel/FitsPanel.js';
import { ExportActions } from '../components/ExportActions/ExportActions.js';
import { SensitivityPanel } from '../components/SensitivityPanel/SensitivityPanel.js';
import { formatDateTime } from '../lib/formatDate.js';

/** Canonical unit of a model input, for showing fixed numbers with their unit. */
function inputUnit(model: string, name: string): string {
  try {
    return getModel(model).inputs.find((i) => i.name === name)?.unit ?? '';
  } catch {
    return '';
  }
}

// echarts is heavy: the plot loads with its tab.
const SweepPlot = lazy(() => import('../components/SweepPlot/SweepPlot.js').then((m) => ({ default: m.SweepPlot })));

const dateText = (iso: string | null) => formatDateTime(iso);

function duration(ms: number): string {
  if (ms < 1000) return `${Math.round(ms)} ms`;
  const s = ms / 1000;
  return s < 120 ? `${s.toFixed(1)} s` : `${Math.floor(s / 60)} min ${Math.round(s % 60)} s`;
}

function axisText(a: NonNullable<SweepView['definition']['axes']>[number]): string {
  if (a.kind === 'list') return `list of ${a.values.length}: ${a.values.join(', ')}${a.unit ? ` ${a.unit}` : ''}`;
  // Random designs draw along an axis without a count: only grid axes have one.
  return `${a.kind}, ${a.min} to ${a.max}${a.unit ? ` ${a.unit}` : ''}${a.count !== undefined ? `, ${a.count} values` : ''}`;
}

/** How many points are flagged and why, in the model's own words. */
function FlagsSummary({ sweep }: { sweep: SweepView }) {
  const flags = useMemo(() => {
    try {
      return getModel(sweep.model).flags;
    } catch {
      return [];
    }
  }, [sweep.model]);
  const done = sweep.progress.done;
  const { invalidPoints, byFlag } = sweep.flagsSummary;
  if (done === 0)
    return (
      <Text fz="sm" c="dimmed">
        No points stored yet.
      </Text>
    );
  return (
    <Stack gap={6} data-testid="flags-summary">
      <Text fz="sm">
        {invalidPoints === 0
          ? `All ${formatCount(done)} points lie inside the model's validity ordering.`
          : `${formatCount(invalidPoints)} of ${formatCount(done)} points (${((invalidPoints / done) * 100).toFixed(1)} %) fall outside the validity ordering:`}
      </Text>
      {flags
        .filter((f) => (byFlag[f.code] ?? 0) > 0)
        .map((f) => (
          <Group key={f.code} gap="xs" wrap="nowrap" align="flex-start">
            <IconAlertTriangle size={16} aria-hidden style={{ flexShrink: 0, marginTop: 2 }} />
            <Text fz="sm">
              <b>{formatCount(byFlag[f.code] ?? 0)}</b> points · <Code>{f.code}</Code> — {f.meaning}
              {f.invalidates ? '' : ' (informative; the point stays valid)'}
            </Text>
          </Group>
        ))}
    </Stack>
  );
}

function SharePanel({ sweep }: { sweep: SweepView }) {
  const [visibility, setVisibility] = useState(sweep.visibility);
  const [users, setUsers] = useState(sweep.sharedWith.map(String));
  useEffect(() => {
    setVisibility(sweep.visibility);
    setUsers(sweep.sharedWith.map(String));
  }, [sweep.visibility, sweep.sharedWith]);
  const directory = useUserDirectory();
  const save = useSaveSharing(sweep.id);
  const options = (directory.data?.items ?? [])
    .filter((u) => u.id !== sweep.owner.id)
    .map((u) => ({ value: String(u.id), label: `${u.name} · ${u.role}` }));
  return (
    <Stack gap="xs">
      <SegmentedControl
        size="xs"
        value={visibility}
        onChange={(v) => setVisibility(v as typeof visibility)}
        data={[
          { value: 'private', label: 'Only named people' },
          { value: 'group', label: 'Everyone in the group' },
        ]}
        aria-label="Who may read this sweep"
      />
      <MultiSelect
        label="Share read-only with"
        placeholder="Pick people"
        data={options}
        value={users}
        onChange={setUsers}
        searchable
        clearable
        disabled={visibility === 'group'}
      />
      {save.error ? (
        <Text c="red" fz="sm">
          {(save.error as Error).message}
        </Text>
      ) : null}
      <Group>
        <Button
          size="xs"
          onClick={() => save.mutate({ visibility, userIds: users.map(Number) })}
          loading={save.isPending}
        >
          Save sharing
        </Button>
        {save.isSuccess ? (
          <Text fz="xs" c="dimmed">
            Saved.
          </Text>
        ) : null}
      </Group>
    </Stack>
  );
}

function Overview({ sweep, canManage }: { sweep: SweepView; canManage: boolean }) {
  const cancel = useCancelSweep(sweep.id);
  const d = sweep.definition;
  const active = ACTIVE.includes(sweep.status);
  const pct = Math.floor(sweep.progress.fraction * 1000) / 10;
  return (
    <SimpleGrid cols={{ base: 1, lg: 2 }} spacing="md">
      <Card withBorder radius="md">
        <Title order={2} fz="h4" mb="xs">
          Progress
        </Title>
        <Progress
          value={pct}
          size="lg"
          animated={active}
          aria-label={`${formatPercent(sweep.progress.fraction)} of the points computed`}
          data-testid="sweep-progress"
        />
        <Group justify="space-between" mt={6}>
          <Text fz="sm" className="dg-num">
            {formatCount(sweep.progress.done)} of {formatCount(sweep.progress.total)} points ·{' '}
            {formatPercent(sweep.progress.fraction)}
          </Text>
          {canManage && active ? (
            <Button
              size="xs"
              color="rust"
              variant="light"
              leftSection={<IconPlayerStop size={14} />}
              onClick={() => cancel.mutate()}
              loading={cancel.isPending}
            >
              Cancel sweep
            </Button>
          ) : null}
        </Group>
        {sweep.error ? (
          <Alert color="red" mt="sm" title="The sweep stopped with an error">
            {sweep.error}
          </Alert>
        ) : null}
        {cancel.error ? (
          <Text c="red" fz="sm">
            {(cancel.error as Error).message}
          </Text>
        ) : null}
        <Title order={3} fz="h5" mt="md" mb={4}>
          Validity
        </Title>
        <FlagsSummary sweep={sweep} />
      </Card>

      <Card withBorder radius="md">
        <Title order={2} fz="h4" mb="xs">
          Definition
        </Title>
        {d.description ? (
          <Text fz="sm" mb="xs">
            {d.description}
          </Text>
        ) : null}
        <Table fz="sm" withRowBorders={false} verticalSpacing={2}>
          <Table.Tbody>
            <Table.Tr>
              <Table.Td c="dimmed" w={130}>
                Model
              </Table.Td>
              <Table.Td>
                {sweep.model} (version {sweep.provenance.modelVersion})
              </Table.Td>
            </Table.Tr>
            <Table.Tr>
              <Table.Td c="dimmed">Sampling</Table.Td>
              <Table.Td>
                {d.sampling?.kind ?? 'grid'}
                {d.sampling && 'samples' in d.sampling ? `, ${formatCount(d.sampling.samples)} samples` : ''}
                {d.sampling?.kind === 'latin-hypercube' ? `, seed ${d.sampling.seed}` : ''}
              </Table.Td>
            </Table.Tr>
            {(d.axes ?? []).map((a) => (
              <Table.Tr key={a.param}>
                <Table.Td c="dimmed">Swept {a.param}</Table.Td>
                <Table.Td>{axisText(a)}</Table.Td>
              </Table.Tr>
            ))}
            {Object.entries(d.fixed ?? {}).map(([k, v]) => (
              <Table.Tr key={k}>
                <Table.Td c="dimmed">Fixed {k}</Table.Td>
                <Table.Td>
                  {typeof v === 'number' ? (
                    <Num value={v} unit={inputUnit(sweep.model, k)} />
                  ) : (
                    <Code>{String(v)}</Code>
                  )}
                </Table.Td>
              </Table.Tr>
            ))}
            {(d.derived ?? []).map((x) => (
              <Table.Tr key={x.name}>
                <Table.Td c="dimmed">Derived {x.name}</Table.Td>
                <Table.Td>
                  <Code>{x.expr}</Code>
                </Table.Td>
              </Table.Tr>
            ))}
            <Table.Tr>
              <Table.Td c="dimmed">Tags</Table.Td>
              <Table.Td>
                {sweep.tags.length
                  ? sweep.tags.map((t) => (
                      <Badge key={t} size="sm" variant="default" tt="none" mr={4}>
                        {t}
                      </Badge>
                    ))
                  : '—'}
              </Table.Td>
            </Table.Tr>
          </Table.Tbody>
        </Table>
      </Card>

      <Card withBorder radius="md">
        <Title order={2} fz="h4" mb="xs">
          Provenance
        </Title>
        <Table fz="sm" withRowBorders={false} verticalSpacing={2}>
          <Table.Tbody>
            <Table.Tr>
              <Table.Td c="dimmed" w={130}>
                Owner
              </Table.Td>
              <Table.Td>{sweep.owner.name}</Table.Td>
            </Table.Tr>
            <Table.Tr>
              <Table.Td c="dimmed">Created</Table.Td>
              <Table.Td>{dateText(sweep.createdAt)}</Table.Td>
            </Table.Tr>
            <Table.Tr>
              <Table.Td c="dimmed">Started</Table.Td>
              <Table.Td>{dateText(sweep.startedAt)}</Table.Td>
            </Table.Tr>
            <Table.Tr>
              <Table.Td c="dimmed">Finished</Table.Td>
              <Table.Td>{dateText(sweep.finishedAt)}</Table.Td>
            </Table.Tr>
            <Table.Tr>
              <Table.Td c="dimmed">Compute time</Table.Td>
              <Table.Td>{duration(sweep.provenance.computeMs)} (summed over chunks)</Table.Td>
            </Table.Tr>
            <Table.Tr>
              <Table.Td c="dimmed">App version</Table.Td>
              <Table.Td>{sweep.provenance.appVersion}</Table.Td>
            </Table.Tr>
            <Table.Tr>
              <Table.Td c="dimmed">Chunks</Table.Td>
              <Table.Td>{formatCount(sweep.chunks)}</Table.Td>
            </Table.Tr>
          </Table.Tbody>
        </Table>
        {sweep.provenance.workers.length ? (
          <Table fz="sm" mt="sm" striped aria-label="Workers">
            <Table.Thead>
              <Table.Tr>
                <Table.Th>Worker (host:pid)</Table.Th>
                <Table.Th ta="right">Chunks</Table.Th>
                <Table.Th ta="right">Points</Table.Th>
              </Table.Tr>
            </Table.Thead>
            <Table.Tbody>
              {sweep.provenance.workers.map((w) => (
                <Table.Tr key={w.id}>
                  <Table.Td>
                    <Code>{w.id}</Code>
                  </Table.Td>
                  <Table.Td ta="right" className="dg-num">
                    {formatCount(w.chunks)}
                  </Table.Td>
                  <Table.Td ta="right" className="dg-num">
                    {formatCount(w.points)}
                  </Table.Td>
                </Table.Tr>
              ))}
            </Table.Tbody>
          </Table>
        ) : null}
      </Card>

      {canManage ? (
        <Card withBorder radius="md">
          <Title order={2} fz="h4" mb="xs">
            Sharing
          </Title>
          {sweep.status === 'archived' ? (
            <Text fz="sm">Archived: everyone signed in can find and download it; sharing no longer changes.</Text>
          ) : (
            <SharePanel sweep={sweep} />
          )}
        </Card>
      ) : null}
    </SimpleGrid>
  );
}

export default function SweepPage() {
  const { id = '' } = useParams();
  const { data: me } = useMe();
  const { data: sweep, error, isLoading } = useSweep(id);
  // The tab is in the URL, with the plot's own choices, so a view can be bookmarked and shared.
  const [params, setParams] = useSearchParams();
  const tab = params.get('tab') ?? 'overview';
  const setTab = (t: string | null) =>
    setParams(
      (p) => {
        const next = new URLSearchParams(p);
        next.set('tab', t ?? 'overview');
        return next;
      },
      { replace: true },
    );
  if (isLoading) return <Skeleton h={240} />;
  if (error || !sweep) {
    const notFound = error instanceof ApiError && (error.status === 404 || error.status === 400);
    return (
      <EmptyState
        icon={IconChartDots3}
        title={notFound ? `No sweep ${id} for you` : 'The sweep could not be loaded'}
        actions={
          <Button component={Link} to="/catalogue" variant="light">
            Back to the catalogue
          </Button>
        }
      >
        {notFound
          ? 'It does not exist, or it is private to its owner. Ask the owner to share it, or pick one from the catalogue.'
          : (error as Error | null)?.message}
      </EmptyState>
    );
  }
  const canManage = !!me && (me.role === 'admin' || me.id === sweep.owner.id);
  const flagBits = (() => {
    try {
      return getModel(sweep.model).flags.map((f) => ({ bit: f.bit, code: f.code }));
    } catch {
      return [];
    }
  })();
  return (
    <>
      <PageHeader
        title={sweep.name}
        description={
          <Group gap="xs" component="span">
            <StatusBadge
              status={sweep.status}
              suffix={ACTIVE.includes(sweep.status) ? formatPercent(sweep.progress.fraction) : undefined}
              data-testid="sweep-status"
            />
            <span>
              {sweep.model} · {formatCount(sweep.points)} points · {sweep.owner.name}
            </span>
          </Group>
        }
      />
      <Tabs value={tab} onChange={setTab} keepMounted={false}>
        <Tabs.List mb="md">
          <Tabs.Tab value="overview">Overview</Tabs.Tab>
          <Tabs.Tab value="results">Results</Tabs.Tab>
          <Tabs.Tab value="plots">Plots</Tabs.Tab>
          <Tabs.Tab value="fits">Fits</Tabs.Tab>
          {sweep.definition.sampling?.kind === 'saltelli' ? <Tabs.Tab value="sensitivity">Sensitivity</Tabs.Tab> : null}
          <Tabs.Tab value="export">Export and archive</Tabs.Tab>
        </Tabs.List>
        <Tabs.Panel value="overview">
          <Overview sweep={sweep} canManage={canManage} />
        </Tabs.Panel>
        <Tabs.Panel value="results">
          <ResultsTable sweep={sweep} flagNames={flagBits} />
          <Text fz="xs" c="dimmed" mt="xs">
            Values show 4 significant figures; hover a value for full precision. Units:{' '}
            {sweep.columns
              .filter((c) => prettyUnit(c.unit))
              .slice(0, 3)
              .map((c) => `${c.name} in ${prettyUnit(c.unit)}`)
              .join(', ')}
            …
          </Text>
        </Tabs.Panel>
        <Tabs.Panel value="plots">
          <Suspense fallback={<Skeleton h={480} />}>
            <SweepPlot sweep={sweep} />
          </Suspense>
        </Tabs.Panel>
        <Tabs.Panel value="fits">
          <FitsPanel source={{ kind: 'sweep', id: sweep.id }} columns={sweep.columns} />
        </Tabs.Panel>
        <Tabs.Panel value="sensitivity">
          <SensitivityPanel sweep={sweep} />
        </Tabs.Panel>
        <Tabs.Panel value="export">
          <ExportActions sweep={sweep} />
        </Tabs.Panel>
      </Tabs>
    </>
  );
}
