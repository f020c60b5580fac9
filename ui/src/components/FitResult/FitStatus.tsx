import { Badge } from '@mantine/core';
import { IconAlertTriangle, IconCircleCheck, IconHourglass, IconPlayerPlay, type Icon } from '@tabler/icons-react';
import type { FitView } from './fit-types.js';
import { formatPercent } from '../../lib/format.js';

const LOOK: Record<string, { label: string; icon: Icon; color: string; meaning: string }> = {
  queued: {
    label: 'Queued',
    icon: IconHourglass,
    color: 'iris',
    meaning: 'Waiting to run (long fits run off the request)',
  },
  running: { label: 'Running', icon: IconPlayerPlay, color: 'tide', meaning: 'The optimiser is working' },
  completed: { label: 'Converged', icon: IconCircleCheck, color: 'moss', meaning: 'The fit converged' },
  failed: {
    label: 'Not converged',
    icon: IconAlertTriangle,
    color: 'rust',
    meaning: 'The fit stopped without converging, or failed',
  },
};

/** Fit status in words plus an icon (SPEC §12: never colour alone). */
export function FitStatus({ fit }: { fit: Pick<FitView, 'status' | 'progress' | 'converged'> }) {
  const key = fit.status === 'failed' && fit.converged === undefined ? 'failed' : fit.status;
  const look = LOOK[key] ?? LOOK.failed!;
  const label = fit.status === 'failed' && fit.converged === undefined ? 'Failed' : look.label;
  const Glyph = look.icon;
  const live = fit.status === 'queued' || fit.status === 'running';
  return (
    <Badge
      variant="light"
      color={look.color}
      radius="sm"
      tt="none"
      fw={500}
      leftSection={<Glyph size={13} stroke={2} aria-hidden />}
      title={look.meaning}
      // max-content: a table column never squeezes the label into an ellipsis ("Co…").
      style={{ flexShrink: 0, overflow: 'visible', minWidth: 'max-content' }}
      data-testid="fit-status"
      data-status={fit.status}
    >
      {live ? `${label} · ${formatPercent(fit.progress)}` : label}
    </Badge>
  );
}
