// When a reading counts: the tablet's time within a window around the server's (common practice:
// trust a device clock only within minutes ahead; the 7-day age matches how long the tablet keeps
// its data, DEVELOPERS.md "What is kept on the tablet").
import { describe, expect, test } from 'vitest';
import { decideTakenAt, MAX_AGE_MS, MAX_AHEAD_MS } from '../../shared/domain/reading-time';

const received = '2026-11-14T07:40:00.000Z';
const at = (msFromReceived: number) => new Date(Date.parse(received) + msFromReceived).toISOString();

describe('decideTakenAt', () => {
  test('when the tablet sends no time, then the reading counts when it arrived', () => {
    expect(decideTakenAt(undefined, received)).toEqual({ takenAt: received, source: 'server' });
    expect(decideTakenAt(null, received)).toEqual({ takenAt: received, source: 'server' });
  });

  test('when the tablet’s time is earlier, within seven days, then it counts at that time', () => {
    expect(decideTakenAt('2026-11-14T07:05:00.000Z', received)).toEqual({ takenAt: '2026-11-14T07:05:00.000Z', source: 'tablet' });
    expect(decideTakenAt(at(-MAX_AGE_MS), received)).toEqual({ takenAt: at(-MAX_AGE_MS), source: 'tablet' });
  });

  test('when the tablet’s time has an offset or no milliseconds, then it comes back in the server’s UTC form', () => {
    expect(decideTakenAt('2026-11-14T08:05:00+01:00', received)).toEqual({ takenAt: '2026-11-14T07:05:00.000Z', source: 'tablet' });
    expect(decideTakenAt('2026-11-14T07:05:00Z', received).takenAt).toBe('2026-11-14T07:05:00.000Z');
  });

  test('when the tablet is slightly ahead, then the reading counts at its arrival, never after it', () => {
    expect(decideTakenAt(at(MAX_AHEAD_MS), received)).toEqual({ takenAt: received, source: 'tablet' });
  });

  test('when the tablet is further ahead or older than seven days, then the arrival time is used and the claimed time is returned with the reason', () => {
    expect(decideTakenAt(at(MAX_AHEAD_MS + 1), received)).toEqual({
      takenAt: received,
      source: 'server',
      refused: { claimed: at(MAX_AHEAD_MS + 1), why: 'ahead' },
    });
    expect(decideTakenAt(at(-MAX_AGE_MS - 1), received)).toEqual({
      takenAt: received,
      source: 'server',
      refused: { claimed: at(-MAX_AGE_MS - 1), why: 'too-old' },
    });
    expect(decideTakenAt('not a time', received)).toEqual({
      takenAt: received,
      source: 'server',
      refused: { claimed: 'not a time', why: 'unreadable' },
    });
  });
});
