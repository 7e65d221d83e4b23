import { CronExpressionParser } from 'cron-parser';

/**
 * Five-field cron (minute hour day-of-month month day-of-week), evaluated in UTC, as in POSIX
 * crontab: `*`, lists, ranges, steps and English month/day names. The library's extensions
 * (seconds field, `L`, `#`, `H`, `?`, `@daily`) are refused so an expression means the same thing
 * here as in any crontab. When day of month and day of week are both restricted, a day matching
 * either runs (the POSIX rule; cron-parser implements it).
 */

const NAMES = new Set([
  'JAN', 'FEB', 'MAR', 'APR', 'MAY', 'JUN', 'JUL', 'AUG', 'SEP', 'OCT', 'NOV', 'DEC',
  'SUN', 'MON', 'TUE', 'WED', 'THU', 'FRI', 'SAT',
]);
const FIELD_NAMES = ['minute', 'hour', 'day of month', 'month', 'day of week'] as const;

export class CronError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'CronError';
  }
}

/** Throws CronError naming what is wrong; returns the expression's fields otherwise. */
export function checkCronExpression(expression: string): string[] {
  const fields = expression.trim().split(/\s+/).filter(Boolean);
  if (fields.length !== 5) {
    throw new CronError(`cron expression needs 5 fields (minute hour day-of-month month day-of-week), got ${fields.length}`);
  }
  fields.forEach((field, i) => {
    const words = field.match(/[A-Za-z]+/g) ?? [];
    if (!/^[0-9A-Za-z*,/-]+$/.test(field) || words.some((w) => !NAMES.has(w.toUpperCase()))) {
      throw new CronError(`cron ${FIELD_NAMES[i]} field "${field}" may use only digits, * , - / and month or day names`);
    }
  });
  try {
    CronExpressionParser.parse(fields.join(' '), { tz: 'UTC', currentDate: new Date(0) }).next();
  } catch (error) {
    throw new CronError(`cron expression "${expression}" is not valid: ${error instanceof Error ? error.message : String(error)}`);
  }
  return fields;
}

/** Iterates the cron's run times strictly after `after`, in UTC. */
export function* cronTimesAfter(expression: string, after: Date): Generator<Date> {
  const fields = checkCronExpression(expression);
  const iterator = CronExpressionParser.parse(fields.join(' '), { tz: 'UTC', currentDate: after });
  for (;;) yield iterator.next().toDate();
}

export function nextCronTimes(expression: string, after: Date, count: number): Date[] {
  const times = cronTimesAfter(expression, after);
  return Array.from({ length: Math.max(0, count) }, () => times.next().value as Date);
}
