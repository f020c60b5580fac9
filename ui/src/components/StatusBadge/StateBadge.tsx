import { Badge } from '@mantine/core';
import { IconBan, IconCircleCheck, IconClockCancel, IconHourglass, IconKey, type Icon } from '@tabler/icons-react';

interface Look {
  label: string;
  icon: Icon;
  color: string;
  meaning: string;
}

// Token and invitation states as words with an icon, in sentence case like the sweep statuses.
const LOOKS: Record<string, Look> = {
  'token:active': { label: 'Active', icon: IconKey, color: 'moss', meaning: 'Accepted by the api' },
  'token:expired': { label: 'Expired', icon: IconClockCancel, color: 'slate', meaning: 'Past its expiry date' },
  'token:revoked': { label: 'Revoked', icon: IconBan, color: 'slate', meaning: 'Withdrawn; no longer accepted' },
  'invitation:pending': { label: 'Pending', icon: IconHourglass, color: 'iris', meaning: 'Sent; the link is unused' },
  'invitation:accepted': { label: 'Accepted', icon: IconCircleCheck, color: 'moss', meaning: 'An account was made' },
  'invitation:expired': { label: 'Expired', icon: IconClockCancel, color: 'slate', meaning: 'The link ran out' },
  'invitation:revoked': { label: 'Withdrawn', icon: IconBan, color: 'slate', meaning: 'Withdrawn by an admin' },
};

/** The state of an API token or an invitation: word, icon and colour (colour only repeats the word). */
export function StateBadge({ kind, state }: { kind: 'token' | 'invitation'; state: string }) {
  const look = LOOKS[`${kind}:${state}`] ?? { label: state, icon: IconHourglass, color: 'slate', meaning: state };
  const Glyph = look.icon;
  return (
    <Badge
      variant="light"
      color={look.color}
      radius="sm"
      tt="none"
      fw={500}
      leftSection={<Glyph size={13} stroke={2} aria-hidden />}
      title={look.meaning}
      data-state={state}
      style={{ flexShrink: 0 }}
    >
      {look.label}
    </Badge>
  );
}
