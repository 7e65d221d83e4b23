// Times as people read them. Figures are drawn in the mono face by the caller.

const SECOND = 1000;
const MINUTE = 60 * SECOND;
const HOUR = 60 * MINUTE;
const DAY = 24 * HOUR;

/** "just now", "42 s ago", "5 min ago", "3 h ago", "12 d ago"; future times read "in …". */
export function formatRelative(iso: string, now: number = Date.now()): string {
  const at = Date.parse(iso);
  if (Number.isNaN(at)) return 'unknown';
  const diff = now - at;
  const span = Math.abs(diff);
  let amount: string;
  if (span < 5 * SECOND) return 'just now';
  if (span < MINUTE) amount = `${Math.round(span / SECOND)} s`;
  else if (span < HOUR) amount = `${Math.round(span / MINUTE)} min`;
  else if (span < DAY) amount = `${Math.round(span / HOUR)} h`;
  else amount = `${Math.round(span / DAY)} d`;
  return diff >= 0 ? `${amount} ago` : `in ${amount}`;
}

const dateTime = new Intl.DateTimeFormat(undefined, {
  year: 'numeric',
  month: 'short',
  day: 'numeric',
  hour: '2-digit',
  minute: '2-digit',
});

const dateOnly = new Intl.DateTimeFormat(undefined, { year: 'numeric', month: 'short', day: 'numeric' });

const timeOnly = new Intl.DateTimeFormat(undefined, { hour: '2-digit', minute: '2-digit', second: '2-digit' });

export function formatDateTime(iso: string): string {
  const at = Date.parse(iso);
  return Number.isNaN(at) ? 'unknown' : dateTime.format(at);
}

export function formatDate(iso: string): string {
  const at = Date.parse(iso);
  return Number.isNaN(at) ? 'unknown' : dateOnly.format(at);
}

export function formatTime(iso: string): string {
  const at = Date.parse(iso);
  return Number.isNaN(at) ? 'unknown' : timeOnly.format(at);
}

const dateTimeSeconds = new Intl.DateTimeFormat(undefined, {
  weekday: 'short',
  month: 'short',
  day: 'numeric',
  hour: '2-digit',
  minute: '2-digit',
  second: '2-digit',
});

/** "Tue, Dec 2, 14:05:07": slots fall on exact seconds, so the seconds matter. */
export function formatSlot(iso: string): string {
  const at = Date.parse(iso);
  return Number.isNaN(at) ? 'unknown' : dateTimeSeconds.format(at);
}
