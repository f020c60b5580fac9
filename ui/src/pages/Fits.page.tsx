import { Button, Paper, Stack, Text, Title } from '@mantine/core';
import { IconMathFunction } from '@tabler/icons-react';
import { useState } from 'react';
import { CREATOR_ROLES } from '@driftgrid/domain';
import { Link, useSearchParams } from 'react-router-dom';
import { hasRole } from '../api/auth.js';
import { useDatasetList } from '../api/datasets.js';
import { useFitList } from '../api/fits.js';
import { useSession } from '../auth/session.js';
import { EmptyState } from '../components/EmptyState/EmptyState.js';
import { PageHeader } from '../components/PageHeader/PageHeader.js';
import type { FitSourceKind } from '../components/FitResult/fit-types.js';
import { FitsPanel } from '../components/FitsPanel/FitsPanel.js';
import { SavedFits } from '../components/FitsPanel/SavedFits.js';
import { SourcePicker, useSourceColumns } from '../components/FitsPanel/SourcePicker.js';

/** New fit: choose a source, then the fits panel for it (the same panel the sweep and dataset pages show). */
function NewFit() {
  const [params, setParams] = useSearchParams();
  const [kind, setKind] = useState<FitSourceKind>(params.get('sourceKind') === 'dataset' ? 'dataset' : 'sweep');
  const initial = Number(params.get('sourceId'));
  // `from`: a saved fit to start again from (the saved-fit page's "start again" link).
  const from = Number(params.get('from'));
  const [id, setId] = useState<number | null>(Number.isInteger(initial) && initial > 0 ? initial : null);
  const datasets = useDatasetList({ pageSize: 200 }, kind === 'dataset');
  const columns = useSourceColumns(kind, id, datasets.data?.items);
  const choose = (next: number | null) => {
    setId(next);
    const p = new URLSearchParams(params);
    if (next === null) p.delete('sourceId');
    else p.set('sourceId', String(next));
    p.set('sourceKind', kind);
    setParams(p, { replace: true });
  };
  return (
    <Paper withBorder p="md" radius="sm" mb="lg">
      <Title order={2} fz="h4" mb="sm">
        New fit
      </Title>
      <SourcePicker
        kind={kind}
        id={id}
        onKind={(k) => {
          setKind(k);
        }}
        onId={choose}
      />
      {id !== null && columns ? (
        <div style={{ marginTop: 16 }}>
          <FitsPanel
            key={`${kind}-${id}`}
            source={{ kind, id }}
            columns={columns}
            startFromFit={Number.isInteger(from) && from > 0 ? from : null}
          />
        </div>
      ) : (
        <Text fz="sm" c="dimmed" mt="sm">
          Choose a finished sweep or an uploaded dataset; its numeric columns become the y and x choices.
        </Text>
      )}
    </Paper>
  );
}

export default function FitsPage() {
  const session = useSession();
  const canFit = hasRole(session?.user, CREATOR_ROLES);
  const any = useFitList({ page: 1, pageSize: 1 });
  return (
    <>
      <PageHeader
        title="Fits"
        description="Reduced models fitted to sweep results or datasets, with standard errors and 95 % intervals."
      />
      {canFit ? <NewFit /> : null}
      {any.data && any.data.total === 0 ? (
        <EmptyState
          icon={IconMathFunction}
          title="No fits saved yet"
          actions={
            <>
              <Button component={Link} to="/catalogue" variant="light">
                Pick a sweep to fit
              </Button>
              {canFit ? (
                <Button component={Link} to="/datasets" variant="default">
                  Upload measurements
                </Button>
              ) : null}
            </>
          }
        >
          Fit a power law, an exponential (Boltzmann) form, the polytropic relation or your own expression to a sweep's
          points or an uploaded dataset, and read each parameter with its standard error, R², RMSE and a residual plot.
          Saved fits of every source you can see are listed here.
        </EmptyState>
      ) : (
        <Stack gap="xs">
          <Title order={2} fz="h4">
            All fits you can see
          </Title>
          <SavedFits showSource />
        </Stack>
      )}
    </>
  );
}
