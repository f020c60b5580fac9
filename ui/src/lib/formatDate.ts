/**
 * The one way the ui writes a moment: "2 Dec 2026, 14:05 UTC" — day, short month, year, 24-hour
 * time to the minute and the time zone it is in (the browser's own zone by default). Dates alone
 * ("2 Dec 2026") use the same order. Every page uses these two; nothing else formats dates.
 */

export type Moment = string | number | Date | null | undefined;

export interface DateFormatOptions {
  /** IANA zone; the browser's own zone when omitted (tests pass one to be deterministic). */
  timeZone?: string;
}

function toDate(v: Moment): Date | null {
  if (v === null || v === undefined || v === '') return null;
  const d = v instanceof Date ? v : new Date(v);
  return Number.isNaN(d.getTime()) ? null : d;
}

const cache = new Map<string, Intl.DateTimeFormat>();
function formatter(kind: 'datetime' | 'date', timeZone: string | undefined): Intl.DateTimeFormat {
  const key = `${kind}|${timeZone ?? ''}`;
  let f = cache.get(key);
  if (!f) {
    f = new Intl.DateTimeFormat('en-GB', {
      day: 'numeric',
      month: 'short',
      year: 'numeric',
      ...(kind === 'datetime' ? { hour: '2-digit', minute: '2-digit', hourCycle: 'h23', timeZoneName: 'short' } : {}),
      timeZone,
    });
    cache.set(key, f);
  }
  return f;
}

/** "2 Dec 2026, 14:05 UTC"; "—" for no date. */
export function formatDateTime(v: Moment, options: DateFormatOptions = {}): string {
  const d = toDate(v);
  if (!d) return '—';
  const parts = formatter('datetime', options.timeZone).formatToParts(d);
  const get = (t: string) => parts.find((p) => p.type === t)?.value ?? '';
  return `${get('day')} ${get('month')} ${get('year')}, ${get('hour')}:${get('minute')} ${get('timeZoneName')}`;
}

/** "2 Dec 2026"; "—" for no date. */
export function formatDate(v: Moment, options: DateFormatOptions = {}): string {
  const d = toDate(v);
  if (!d) return '—';
  const parts = formatter('date', options.timeZone).formatToParts(d);
  const get = (t: string) => parts.find((p) => p.type === t)?.value ?? '';
  return `${get('day')} ${get('month')} ${get('year')}`;
}

/** The full ISO instant for a `title` attribute beside a formatted date. */
export function isoTitle(v: Moment): { title: string } | Record<string, never> {
  const d = toDate(v);
  return d ? { title: d.toISOString() } : {};
}
