import { cronTimesAfter } from './cron';
import type { Schedule } from './schedule-schema';

/**
 * Slot expansion for the scheduler. Interval slots sit on a grid counted from the Unix epoch and
 * shifted by a stable per-journey offset (a hash of the journey id, within the interval), so
 * journeys with the same interval spread over it instead of all firing at :00. Cron slots are the
 * expression's times plus an offset within the first minute: cron has minute resolution, so any
 * instant in the named minute honours the expression, and 100 journeys on `*\/5 * * * *` do not
 * start in the same millisecond.
 */

const CRON_SPREAD_MS = 60_000;
export const DEFAULT_SLOT_LIMIT = 10_000;

/** FNV-1a, 32 bits, over the id's UTF-8 bytes: tiny, stable across processes and platforms. */
export function stableHash(id: string | number): number {
  let hash = 0x811c9dc5;
  for (const byte of new TextEncoder().encode(String(id))) {
    hash ^= byte;
    hash = Math.imul(hash, 0x01000193) >>> 0;
  }
  return hash;
}

export function scheduleOffsetMs(schedule: Schedule, journeyId: string | number): number {
  const span = schedule.kind === 'interval' ? schedule.everySeconds * 1000 : CRON_SPREAD_MS;
  return stableHash(journeyId) % span;
}

function* slotsFrom(schedule: Schedule, journeyId: string | number, from: Date): Generator<Date> {
  const offset = scheduleOffsetMs(schedule, journeyId);
  if (schedule.kind === 'interval') {
    const every = schedule.everySeconds * 1000;
    for (let k = Math.ceil((from.getTime() - offset) / every); ; k++) yield new Date(k * every + offset);
  }
  // Cron times strictly after (from − offset − 1 ms) are the times t with t + offset ≥ from.
  for (const t of cronTimesAfter(schedule.expression, new Date(from.getTime() - offset - 1))) {
    yield new Date(t.getTime() + offset);
  }
}

/** The first `count` slots at or after `from`. */
export function nextSlots(schedule: Schedule, journeyId: string | number, from: Date, count: number): Date[] {
  const out: Date[] = [];
  if (count <= 0) return out;
  for (const slot of slotsFrom(schedule, journeyId, from)) {
    out.push(slot);
    if (out.length >= count) break;
  }
  return out;
}

/**
 * Slots in the half-open window [from, to), so consecutive windows never share a slot. Throws a
 * RangeError past `limit` slots rather than silently dropping some (pick a shorter window).
 */
export function slotsBetween(
  schedule: Schedule,
  journeyId: string | number,
  from: Date,
  to: Date,
  limit: number = DEFAULT_SLOT_LIMIT,
): Date[] {
  const out: Date[] = [];
  for (const slot of slotsFrom(schedule, journeyId, from)) {
    if (slot.getTime() >= to.getTime()) break;
    if (out.length >= limit) throw new RangeError(`more than ${limit} slots between ${from.toISOString()} and ${to.toISOString()}`);
    out.push(slot);
  }
  return out;
}
