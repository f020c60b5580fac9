import { Badge, type BadgeProps } from '@mantine/core';
import {
  IconAlertTriangle,
  IconArchive,
  IconCircleCheck,
  IconCircleX,
  IconHourglass,
  IconHelpCircle,
  IconPencil,
  IconPlayerPlay,
  type Icon,
} from '@tabler/icons-react';

import { SWEEP_STATUSES, type SweepStatus } from '@driftgrid/domain';

// Declared once in the domain's contracts; re-exported for the badge's callers.
export { SWEEP_STATUSES, type SweepStatus };

interface StatusLook {
  label: string;
  icon: Icon;
  color: string;
  /** One line for the tooltip / screen readers. */
  meaning: string;
}

// Words and a distinct icon carry the meaning; colour only repeats it (SPEC §12).
export const STATUS_LOOK: Record<SweepStatus, StatusLook> = {
  draft: { label: 'Draft', icon: IconPencil, color: 'slate', meaning: 'Saved but not submitted' },
  queued: { label: 'Queued', icon: IconHourglass, color: 'iris', meaning: 'Waiting for a worker' },
  running: { label: 'Running', icon: IconPlayerPlay, color: 'tide', meaning: 'Chunks are being computed' },
  completed: { label: 'Completed', icon: IconCircleCheck, color: 'moss', meaning: 'Every point computed' },
  failed: { label: 'Failed', icon: IconAlertTriangle, color: 'rust', meaning: 'Stopped by an error' },
  cancelled: { label: 'Cancelled', icon: IconCircleX, color: 'ember', meaning: 'Stopped on request' },
  archived: { label: 'Archived', icon: IconArchive, color: 'slate', meaning: 'Frozen, with a checksum of its export' },
};

export function isSweepStatus(s: string): s is SweepStatus {
  return (SWEEP_STATUSES as readonly string[]).includes(s);
}

export interface StatusBadgeProps extends Omit<BadgeProps, 'color' | 'leftSection' | 'children'> {
  status: string;
  /** Running sweeps may show their progress, e.g. "42 %". */
  suffix?: string;
}

export function StatusBadge({ status, suffix, ...rest }: StatusBadgeProps) {
  const look: StatusLook = isSweepStatus(status)
    ? STATUS_LOOK[status]
    : {
        label: status || 'Unknown',
        icon: IconHelpCircle,
        color: 'slate',
        meaning: 'Status not recognised by this version of the ui',
      };
  const Glyph = look.icon;
  return (
    <Badge
      variant={status === 'archived' ? 'outline' : 'light'}
      color={look.color}
      radius="sm"
      tt="none"
      fw={500}
      leftSection={<Glyph size={13} stroke={2} aria-hidden />}
      title={look.meaning}
      data-status={status}
      // Beside a long truncated name the status word must stay whole.
      style={{ flexShrink: 0 }}
      {...rest}
    >
      {suffix ? `${look.label} · ${suffix}` : look.label}
    </Badge>
  );
}
