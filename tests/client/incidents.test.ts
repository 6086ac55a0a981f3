import { describe, expect, test } from 'vitest';
import { ApiError } from '../../src/lib/api-client';
import { minutesText } from '../../src/lib/minutes';
import { minutesOutOfService } from '../../shared/domain/out-of-service';
import { missingFromError } from '../../src/features/incidents/utils/missing-steps';
import { retestStepSchema } from '../../shared/contracts/incidents';

describe('minutes out of service', () => {
  const opened = '2026-11-21T10:00:00.000Z';
  test('count whole minutes rounded up, as the incidents contract defines minutesOutOfService', () => {
    expect(minutesOutOfService(opened, Date.parse('2026-11-21T10:00:20.000Z'))).toBe(1);
    expect(minutesOutOfService(opened, Date.parse('2026-11-21T10:12:00.000Z'))).toBe(12);
    expect(minutesOutOfService(opened, Date.parse('2026-11-21T10:12:01.000Z'))).toBe(13);
  });

  test('a resolved incident stops counting at its resolution, and a tablet clock behind the server never gives a negative', () => {
    expect(minutesOutOfService(opened, '2026-11-21T10:30:00.000Z')).toBe(30);
    expect(minutesOutOfService(opened, Date.parse('2026-11-21T09:58:00.000Z'))).toBe(0);
  });

  test('an hour and more reads in hours and minutes', () => {
    expect(minutesText(59)).toBe('59 min');
    expect(minutesText(65)).toBe('1 h 05 min');
  });
});

describe('a refused resolve', () => {
  const step = retestStepSchema.parse({
    stepId: 's1',
    positionId: 'p1',
    positionName: 'Left reel',
    assetTag: 'RL-S01',
    testKind: 'continuity',
    conductors: 'B',
    why: 'after-swap',
    done: false,
    readingId: null,
    verdict: null,
    takenAt: null,
    message: 'No passing reading since the swap.',
  });

  test('names each missing step by its item, test and line, with the server’s sentence', () => {
    const err = new ApiError(409, 'retest-incomplete', 'Not every step passes.', [], { missing: [step] });
    expect(missingFromError(err)).toEqual(['Left reel · Continuity B: No passing reading since the swap.']);
  });

  test('any other refusal has no list (its own message is shown instead)', () => {
    expect(missingFromError(new ApiError(403, 'forbidden', 'Not assigned.'))).toEqual([]);
    expect(missingFromError(new ApiError(409, 'retest-incomplete', 'x', [], {}))).toEqual([]);
    expect(missingFromError(new Error('offline'))).toEqual([]);
  });
});
