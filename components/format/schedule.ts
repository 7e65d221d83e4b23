import type { Schedule } from '../../shared/journey/schedule-schema';

function every(amount: number, unit: string, single: string): string {
  return amount === 1 ? `every ${single}` : `every ${amount} ${unit}`;
}

/** "every 5 min", "every 10 s", "cron 0 * * * * (UTC)". */
export function describeSchedule(schedule: Schedule): string {
  if (schedule.kind === 'cron') return `cron ${schedule.expression.trim()} (UTC)`;
  const s = schedule.everySeconds;
  if (s % 86_400 === 0) return every(s / 86_400, 'days', 'day');
  if (s % 3600 === 0) return every(s / 3600, 'h', 'hour');
  if (s % 60 === 0) return every(s / 60, 'min', 'minute');
  return every(s, 's', 'second');
}
