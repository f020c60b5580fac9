import { Alert, Progress, Stack, Text, Title } from '@mantine/core';
import { IconEye } from '@tabler/icons-react';
import { CREATOR_ROLES } from '@driftgrid/domain';
import { hasRole, useMe } from '../../api/auth.js';
import { useState } from 'react';
import { useCreateFit, useFit } from '../../api/fits.js';
import { FitPlot } from '../FitPlot/FitPlot.js';
import { FitResult } from '../FitResult/FitResult.js';
import { LIVE_FIT, type FitSourceKind, type FitView } from '../FitResult/fit-types.js';
import { FitBuilder, type FitColumn } from './FitBuilder.js';
import { fromRequest, type BuilderState } from './builder-state.js';
import { SavedFits } from './SavedFits.js';

export interface FitsPanelProps {
  source: { kind: FitSourceKind; id: number };
  columns: FitColumn[];
  /**
   * A saved fit of this source to start again from (the saved-fit page links here): the form opens
   * filled with its request, and with its last iterate as start values when it did not converge.
   */
  startFromFit?: number | null;
}

/** A fit's result with its plots, or its progress while it runs. */
export function FitDetail({
  fit,
  columns,
  onStartFrom,
  startFromLabel,
}: {
  fit: FitView;
  columns?: FitColumn[];
  onStartFrom?: (values: Record<string, number>) => void;
  startFromLabel?: string;
}) {
  const live = LIVE_FIT.has(fit.status);
  const unitOf = (name: string) => {
    const u = fit.units?.[name] ?? columns?.find((c) => c.name === name)?.unit;
    return u && u !== '1' ? u : undefined;
  };
  return (
    <Stack gap="sm">
      {live ? (
        <Progress value={fit.progress * 100} animated aria-label="Fit progress" data-testid="fit-progress" />
      ) : null}
      <FitResult fit={fit} onStartFrom={onStartFrom} startFromLabel={startFromLabel} />
      {fit.plot ? (
        <FitPlot
          plot={fit.plot}
          yName={fit.y}
          unit={unitOf(fit.y)}
          xUnit={fit.plot.xNames.length === 1 ? unitOf(fit.plot.xNames[0]!) : undefined}
        />
      ) : null}
    </Stack>
  );
}

/**
 * The fit builder and the saved fits of one sweep or dataset, as the sweep and dataset pages show it:
 * run a fit, read its parameters with errors and its plots, pick an earlier fit from the list.
 */
export function FitsPanel({ source, columns, startFromFit = null }: FitsPanelProps) {
  const [selected, setSelected] = useState<number | null>(null);
  const create = useCreateFit({ onSuccess: (created) => setSelected(created.id) });
  const current = useFit(selected);
  // "Start again from the last iterate": the builder is re-keyed with the failed fit's request.
  const [prefill, setPrefill] = useState<{ state: BuilderState; nonce: number } | null>(null);
  const hasValid = source.kind === 'sweep' && columns.some((c) => c.name === 'valid');
  const startFrom = (fit: FitView) => (values: Record<string, number>) =>
    setPrefill((prev) => ({ state: fromRequest(fit.request, hasValid, values), nonce: (prev?.nonce ?? 0) + 1 }));
  // The fit to start from when the page was opened from a saved fit (only one of this very source).
  const origin = useFit(startFromFit);
  const fromOrigin =
    origin.data && origin.data.source.kind === source.kind && origin.data.source.id === source.id
      ? fromRequest(origin.data.request, hasValid, origin.data.advice?.lastIterate)
      : undefined;
  // Reviewers read fits; the server refuses their runs, so the form is not offered at all.
  const { data: me } = useMe();
  const mayFit = hasRole(me, CREATOR_ROLES);
  return (
    <Stack gap="md" data-testid="fits-panel" data-source-kind={source.kind} data-source-id={source.id}>
      {mayFit ? (
        <FitBuilder
          key={prefill ? prefill.nonce : fromOrigin ? `from-${startFromFit}` : 0}
          initial={prefill?.state ?? fromOrigin}
          source={source}
          columns={columns}
          pending={create.isPending}
          error={create.error}
          onSubmit={(b) => create.mutate(b)}
        />
      ) : me ? (
        <Alert variant="light" color="gray" icon={<IconEye size={18} />} data-testid="fits-read-only">
          Reviewers read fits here; running a new fit is for researchers and administrators.
        </Alert>
      ) : null}
      {current.data ? (
        <FitDetail fit={current.data} columns={columns} onStartFrom={mayFit ? startFrom(current.data) : undefined} />
      ) : selected !== null && current.isLoading ? (
        <Text fz="sm" c="dimmed">
          Loading the fit…
        </Text>
      ) : null}
      <div>
        <Title order={3} fz="h4" mb="xs">
          Saved fits
        </Title>
        <SavedFits source={source} selectedId={selected} onSelect={setSelected} />
      </div>
    </Stack>
  );
}
