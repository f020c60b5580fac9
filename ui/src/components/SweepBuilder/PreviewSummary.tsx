import { Anchor, Group, Loader, Paper, Text } from '@mantine/core';
import { IconAlertTriangle, IconCircleCheck, IconFlag, IconHandStop } from '@tabler/icons-react';
import { formatCount } from '../../lib/format.js';
import type { SweepPreviewView } from '../../api/sweeps.js';
import classes from './SweepBuilder.module.css';

export interface PreviewSummaryProps {
  points: number | null;
  /** Problems currently shown beside fields. */
  problems: number;
  server: SweepPreviewView | undefined;
  serverLoading: boolean;
  /** Flags raised at the sample point; null without a sample. */
  sampleFlags: number | null;
}

/**
 * The preview in one line for windows narrower than 1200 px, pinned under the header while the
 * form scrolls: points, quota verdict and the sample point's flag count, with a link to the full
 * preview below the form. Test hooks: `preview-summary`, `summary-points`, `summary-quota`
 * (data-allowed), `summary-flags`, `summary-problems`.
 */
export function PreviewSummary({ points, problems, server, serverLoading, sampleFlags }: PreviewSummaryProps) {
  const quota = server?.quota ?? null;
  return (
    <Paper withBorder p="xs" radius="sm" className={classes.summary} data-testid="preview-summary" aria-live="polite">
      <Group gap="md" wrap="wrap" justify="space-between">
        <Group gap="md" wrap="wrap">
          <Text fz="sm" data-testid="summary-points">
            <Text span fw={600} style={{ fontVariantNumeric: 'tabular-nums' }}>
              {points === null ? '—' : formatCount(points)}
            </Text>{' '}
            points
          </Text>
          {problems > 0 ? (
            <Text fz="sm" c="red" data-testid="summary-problems">
              <IconAlertTriangle size={14} style={{ verticalAlign: -2 }} /> {problems} problem
              {problems > 1 ? 's' : ''} to fix
            </Text>
          ) : null}
          {points !== null && quota ? (
            <Text
              fz="sm"
              c={quota.allowed ? 'teal' : 'red'}
              data-testid="summary-quota"
              data-allowed={String(quota.allowed)}
            >
              {quota.allowed ? (
                <IconCircleCheck size={14} style={{ verticalAlign: -2 }} />
              ) : (
                <IconHandStop size={14} style={{ verticalAlign: -2 }} />
              )}{' '}
              {quota.allowed ? 'Within your quota' : `Refused: ${quota.violations.map((v) => v.label).join(', ')}`}
            </Text>
          ) : points !== null && serverLoading ? (
            <Loader size="xs" aria-label="Checking your quota" />
          ) : null}
          {sampleFlags !== null ? (
            <Text fz="sm" c={sampleFlags ? 'orange' : 'dimmed'} data-testid="summary-flags" data-count={sampleFlags}>
              <IconFlag size={14} style={{ verticalAlign: -2 }} />{' '}
              {sampleFlags === 0
                ? 'sample point valid'
                : `sample point: ${sampleFlags} flag${sampleFlags > 1 ? 's' : ''}`}
            </Text>
          ) : null}
        </Group>
        <Anchor href="#sweep-preview" fz="sm">
          Full preview
        </Anchor>
      </Group>
    </Paper>
  );
}
