import { QUOTA_LABELS, QUOTA_KEYS, type QuotaKey } from '@driftgrid/domain';

/**
 * One audit entry as a sentence in our words: the action and what changed ("Changed the role of
 * rosa@example.com from researcher to reviewer"). The actor and time are shown beside it; the raw
 * details stay in the entry for whoever wants the JSON.
 */

type Details = Record<string, unknown> | null;

const record = (v: unknown): Record<string, unknown> =>
  v && typeof v === 'object' && !Array.isArray(v) ? (v as Record<string, unknown>) : {};
const text = (v: unknown): string => (typeof v === 'string' ? v : typeof v === 'number' ? String(v) : '');
const fmt = (n: unknown): string =>
  n === null || n === undefined
    ? 'the role default'
    : typeof n === 'number'
      ? n.toLocaleString('en-US')
      : typeof n === 'string'
        ? n
        : JSON.stringify(n);

const USER_FIELDS: Record<string, (before: unknown, after: unknown) => string> = {
  role: (b, a) => `role from ${text(b) || '?'} to ${text(a) || '?'}`,
  active: (_b, a) => (a === false ? 'deactivated the account' : 'reactivated the account'),
  name: (b, a) => `name from “${text(b)}” to “${text(a)}”`,
};

function quotaChanges(before: Record<string, unknown>, after: Record<string, unknown>): string[] {
  return (QUOTA_KEYS as readonly QuotaKey[])
    .filter((k) => before[k] !== after[k])
    .map((k) => `${QUOTA_LABELS[k].label} from ${fmt(before[k])} to ${fmt(after[k])}`);
}

const list = (parts: string[]): string =>
  parts.length <= 1 ? (parts[0] ?? '') : `${parts.slice(0, -1).join(', ')} and ${parts[parts.length - 1]}`;

/** What a target such as `user:7` or `role:researcher` names, for actions without details. */
function targetWords(target: string | null): string {
  if (!target) return '';
  const [kind, id] = target.split(':');
  if (kind === 'role') return `the ${id} role`;
  if (kind === 'user') return `user ${id}`;
  if (kind === 'invitation') return `invitation ${id}`;
  if (kind === 'sweep') return `sweep ${id}`;
  return target;
}

export function auditSummary(action: string, target: string | null, raw: Details): string {
  const d = record(raw);
  const email = text(d.email);
  switch (action) {
    case 'user.update': {
      const before = record(d.before);
      const after = record(d.after);
      const parts = Object.keys(after).map((k) => USER_FIELDS[k]?.(before[k], after[k]) ?? `${k} changed`);
      const who = email || targetWords(target);
      const changed = parts.filter((p) => !p.endsWith('account'));
      const account = parts.filter((p) => p.endsWith('account'));
      const sentences = [
        ...(changed.length ? [`Changed ${who}: ${list(changed)}`] : []),
        ...account.map((p) => `${p[0]!.toUpperCase()}${p.slice(1)} of ${who}`),
      ];
      return sentences.join('; ') || `Updated ${who}`;
    }
    case 'quota.role': {
      const role = target?.startsWith('role:') ? target.slice(5) : '?';
      const changes = quotaChanges(record(d.before), record(d.after));
      return `Changed the ${role} quota: ${changes.length ? list(changes) : 'no limit changed'}`;
    }
    case 'quota.user': {
      const changes = quotaChanges(record(d.before), record(d.after));
      return `Changed the quota of ${email || targetWords(target)}: ${changes.length ? list(changes) : 'no limit changed'}`;
    }
    case 'invitation.create':
      return `Invited ${email || 'someone'} as ${text(d.role) || 'a user'}`;
    case 'invitation.revoke':
      return `Withdrew the invitation of ${email || targetWords(target)}`;
    case 'invitation.accept':
      return `Accepted the invitation as ${email || 'a new user'} (${text(d.role) || 'role unknown'})`;
    case 'queue.pause':
      return 'Paused the queue: no new chunks handed out';
    case 'queue.resume':
      return 'Resumed the queue';
    case 'sweep.cancel':
      return `Cancelled ${targetWords(target)}`;
    default: {
      const words = action.replace(/[._-]+/g, ' ');
      return `${words[0]?.toUpperCase() ?? ''}${words.slice(1)}${target ? ` (${targetWords(target)})` : ''}`;
    }
  }
}
