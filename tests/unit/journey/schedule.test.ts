import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { CronError, checkCronExpression, nextCronTimes } from '../../../shared/journey/cron';
import { nextSlots, scheduleOffsetMs, slotsBetween, stableHash } from '../../../shared/journey/schedule';
import type { Schedule } from '../../../shared/journey/schedule-schema';

const iso = (dates: Date[]) => dates.map((d) => d.toISOString());
const at = (s: string) => new Date(s);

describe('cron run times (POSIX crontab semantics, UTC)', () => {
  it('*/15 * * * * runs at minutes 0, 15, 30 and 45', () => {
    // POSIX crontab (IEEE Std 1003.1, crontab utility) defines lists and ranges; the */step form is
    // the common extension every cron accepts: */15 in the minute field = 0,15,30,45.
    expect(iso(nextCronTimes('*/15 * * * *', at('2024-01-01T00:07:00Z'), 5))).toEqual([
      '2024-01-01T00:15:00.000Z',
      '2024-01-01T00:30:00.000Z',
      '2024-01-01T00:45:00.000Z',
      '2024-01-01T01:00:00.000Z',
      '2024-01-01T01:15:00.000Z',
    ]);
    expect(iso(nextCronTimes('0,15,30,45 * * * *', at('2024-01-01T00:07:00Z'), 5))).toEqual(
      iso(nextCronTimes('*/15 * * * *', at('2024-01-01T00:07:00Z'), 5)),
    );
  });

  it('0 9 * * 1-5 runs at 09:00 on weekdays only', () => {
    // POSIX crontab: weekday 0-6 with 0 = Sunday; 1-5 = Monday to Friday. 2024-03-01 is a Friday.
    expect(iso(nextCronTimes('0 9 * * 1-5', at('2024-03-01T10:00:00Z'), 6))).toEqual([
      '2024-03-04T09:00:00.000Z',
      '2024-03-05T09:00:00.000Z',
      '2024-03-06T09:00:00.000Z',
      '2024-03-07T09:00:00.000Z',
      '2024-03-08T09:00:00.000Z',
      '2024-03-11T09:00:00.000Z',
    ]);
  });

  it('day of month and day of week both restricted: a day matching either runs', () => {
    // POSIX crontab (IEEE Std 1003.1, crontab utility): "If either the month or day of month is
    // specified as an element or list, and the day of week is also specified as an element or list,
    // then any day matching either the month and day of month, or the day of week, shall be matched."
    // Example in the style of crontab(5): 30 4 1,15 * 5 = 04:30 on the 1st and 15th, plus every Friday.
    expect(iso(nextCronTimes('30 4 1,15 * 5', at('2024-03-01T00:00:00Z'), 10))).toEqual([
      '2024-03-01T04:30:00.000Z', // Friday the 1st
      '2024-03-08T04:30:00.000Z', // Friday
      '2024-03-15T04:30:00.000Z', // Friday the 15th
      '2024-03-22T04:30:00.000Z',
      '2024-03-29T04:30:00.000Z',
      '2024-04-01T04:30:00.000Z', // Monday the 1st
      '2024-04-05T04:30:00.000Z',
      '2024-04-12T04:30:00.000Z',
      '2024-04-15T04:30:00.000Z', // Monday the 15th
      '2024-04-19T04:30:00.000Z',
    ]);
    // Only one restricted: only it counts (Sunday 13 October 2024 is not a Friday).
    expect(iso(nextCronTimes('0 0 * * 5', at('2024-10-10T00:00:00Z'), 2))).toEqual(['2024-10-11T00:00:00.000Z', '2024-10-18T00:00:00.000Z']);
    expect(iso(nextCronTimes('0 0 13 * *', at('2024-10-10T00:00:00Z'), 2))).toEqual(['2024-10-13T00:00:00.000Z', '2024-11-13T00:00:00.000Z']);
  });

  it('0 0 * * 0 is midnight on Sundays; run times are strictly after the start', () => {
    // POSIX crontab: 0 = Sunday. 2024-01-07 is a Sunday.
    expect(iso(nextCronTimes('0 0 * * 0', at('2024-01-01T00:00:00Z'), 2))).toEqual(['2024-01-07T00:00:00.000Z', '2024-01-14T00:00:00.000Z']);
    expect(iso(nextCronTimes('0 9 * * *', at('2024-01-01T09:00:00Z'), 1))).toEqual(['2024-01-02T09:00:00.000Z']);
  });

  it('accepts 5 POSIX fields and month/day names, and refuses the rest with a clear message', () => {
    expect(checkCronExpression(' 0  9 * JAN mon-fri ')).toEqual(['0', '9', '*', 'JAN', 'mon-fri']);
    expect(() => checkCronExpression('0 0 9 * * *')).toThrow(/needs 5 fields.*got 6/);
    expect(() => checkCronExpression('@daily')).toThrow(CronError);
    expect(() => checkCronExpression('0 0 L * *')).toThrow(/day of month field "L"/);
    expect(() => checkCronExpression('H * * * *')).toThrow(/minute field/);
    expect(() => checkCronExpression('0 0 * * 1#2')).toThrow(/day of week field/);
    expect(() => checkCronExpression('61 * * * *')).toThrow(/not valid/);
    expect(() => checkCronExpression('0 25 * * *')).toThrow(/not valid/);
    expect(() => checkCronExpression('0 0 30 2 *')).toThrow(/not valid/); // 30 February never comes
  });
});

describe('slots', () => {
  const every30s: Schedule = { kind: 'interval', everySeconds: 30 };

  it('give each journey a stable offset inside its interval', () => {
    expect(stableHash('journey-1')).toBe(stableHash('journey-1'));
    // FNV-1a 32-bit test vectors (Fowler/Noll/Vo reference list, from memory): "" → 0x811c9dc5, "a" → 0xe40c292c.
    expect(stableHash('')).toBe(0x811c9dc5);
    expect(stableHash('a')).toBe(0xe40c292c);
    const offsets = new Set(Array.from({ length: 50 }, (_, i) => scheduleOffsetMs(every30s, i)));
    expect(offsets.size).toBeGreaterThan(40); // spread, not all on :00
    for (const o of offsets) expect(o).toBeGreaterThanOrEqual(0), expect(o).toBeLessThan(30_000);
  });

  it('interval slots sit on the offset grid, in the half-open window [from, to)', () => {
    const offset = scheduleOffsetMs(every30s, 42);
    const from = at('2024-05-01T12:00:00Z');
    const slots = slotsBetween(every30s, 42, from, at('2024-05-01T12:05:00Z'));
    expect(slots).toHaveLength(10);
    for (const s of slots) expect((s.getTime() - offset) % 30_000).toBe(0);
    expect(slots[0].getTime()).toBe(from.getTime() + offset);
    // A slot exactly at `from` belongs to this window, one exactly at `to` to the next.
    const exact = slots[3];
    expect(slotsBetween(every30s, 42, exact, new Date(exact.getTime() + 30_000))).toEqual([exact]);
    expect(nextSlots(every30s, 42, from, 3)).toEqual(slots.slice(0, 3));
  });

  it('consecutive windows never share or lose a slot (property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 10, max: 3600 }),
        fc.string({ maxLength: 12 }),
        fc.integer({ min: 1_600_000_000_000, max: 1_900_000_000_000 }),
        fc.integer({ min: 0, max: 7_200_000 }),
        fc.integer({ min: 0, max: 7_200_000 }),
        (everySeconds, id, start, a, b) => {
          const schedule: Schedule = { kind: 'interval', everySeconds };
          const from = new Date(start);
          const mid = new Date(start + a);
          const to = new Date(start + a + b);
          const whole = slotsBetween(schedule, id, from, to);
          const split = [...slotsBetween(schedule, id, from, mid), ...slotsBetween(schedule, id, mid, to)];
          expect(iso(split)).toEqual(iso(whole));
          const expected = Math.floor((a + b) / (everySeconds * 1000));
          expect(whole.length === expected || whole.length === expected + 1).toBe(true);
        },
      ),
      { numRuns: 200 },
    );
  });

  it('cron slots are the cron times shifted by an offset under a minute', () => {
    const cron: Schedule = { kind: 'cron', expression: '*/15 * * * *' };
    const offset = scheduleOffsetMs(cron, 'checkout');
    expect(offset).toBeLessThan(60_000);
    const slots = slotsBetween(cron, 'checkout', at('2024-01-01T00:00:00Z'), at('2024-01-01T01:00:00Z'));
    expect(slots.map((s) => s.getTime() - offset)).toEqual(
      ['00:00', '00:15', '00:30', '00:45'].map((hm) => at(`2024-01-01T${hm}:00Z`).getTime()),
    );
    // A window starting just after a slot does not include it; one starting at it does.
    expect(slotsBetween(cron, 'checkout', new Date(slots[1].getTime() + 1), slots[2])).toEqual([]);
    expect(slotsBetween(cron, 'checkout', slots[1], slots[2])).toEqual([slots[1]]);
    expect(nextSlots(cron, 'checkout', at('2024-01-01T00:00:00Z'), 4)).toEqual(slots);
  });

  it('refuses to expand an unbounded number of slots', () => {
    expect(() => slotsBetween({ kind: 'interval', everySeconds: 10 }, 1, at('2024-01-01T00:00:00Z'), at('2024-01-03T00:00:00Z'))).toThrow(RangeError);
    expect(slotsBetween({ kind: 'interval', everySeconds: 10 }, 1, at('2024-01-01T00:00:00Z'), at('2024-01-03T00:00:00Z'), 20_000)).toHaveLength(17_280);
  });
});
