// What the tablet keeps of a strip once the server has confirmed a reading: the saved copy is what
// an offline reload shows, so its status and counts must agree with its steps.
import { describe, expect, test } from 'vitest';
import { stripDetailSchema, type StripDetail } from '../../shared/contracts/strips';
import type { ReadingDto } from '../../shared/schemas/readings';
import { withRecordedReading } from '../../src/features/testing/api/show-recorded-reading';

const step = (id: string, required = true) => ({
  id,
  testKind: 'continuity' as const,
  conductors: 'A',
  required,
  instruction: 'Meter across line A, end to end.',
  latest: null,
});

function strip(status: StripDetail['status'] = 'not-started'): StripDetail {
  return stripDetailSchema.parse({
    id: 'strip-1',
    label: 'Strip 22',
    status,
    zone: null,
    conductivePiste: false,
    sparePool: false,
    withdrawnReason: null,
    venueId: 'venue-1',
    venueName: 'Riverside Sports Hall',
    venueStatus: 'testing',
    profile: null,
    counts: { total: 3, done: 0, passed: 0, nearLimit: 0, failed: 0 },
    venueProgress: { stepsDone: 0, stepsTotal: 3, stripsClear: 0, stripCount: 1 },
    previousStripId: null,
    nextStripId: null,
    positions: [
      { id: 'p1', name: 'Left floor cable', equipmentKind: 'floor-cable', equipment: null, steps: [step('s1'), step('s2')] },
      { id: 'p2', name: 'Left reel', equipmentKind: 'reel', equipment: null, steps: [step('s3'), step('s4', false)] },
    ],
    openFaults: [],
  });
}

const reading = (stepId: string, verdict: ReadingDto['verdict'], extra: Partial<ReadingDto> = {}): ReadingDto => ({
  id: `r-${stepId}`,
  stepId,
  equipmentId: null,
  valueText: verdict === 'fail' ? '9' : '0.5',
  valueOhm: verdict === 'fail' ? 9 : 0.5,
  overRange: false,
  leadOffsetOhm: null,
  leadNullId: null,
  temperatureC: null,
  verdict,
  limitOhm: 1,
  limitKind: 'max',
  source: 'FIE material rules',
  ruleId: null,
  profileId: 'profile-1',
  profileVersion: 1,
  explanation: '',
  supersedesId: null,
  correctionReason: null,
  takenAt: '2026-11-21T09:00:00.000Z',
  receivedAt: '2026-11-21T09:00:01.000Z',
  takenBy: 'u1',
  takenByName: 'Sam',
  ...extra,
});

describe('a strip on the tablet after the server confirmed a reading', () => {
  test('a first reading on a strip not started makes it in progress, with its count', () => {
    const after = withRecordedReading(strip(), reading('s1', 'pass'));
    expect(after.positions[0].steps[0].latest?.id).toBe('r-s1');
    expect(after.status).toBe('in-progress');
    expect(after.counts).toEqual({ total: 3, done: 1, passed: 1, nearLimit: 0, failed: 0 });
  });

  test('the last required step makes it clear; a step not required does not count', () => {
    let s = strip();
    for (const id of ['s1', 's2']) s = withRecordedReading(s, reading(id, 'pass'));
    expect(s.status).toBe('in-progress');
    s = withRecordedReading(s, reading('s3', 'near-limit'));
    expect(s.status).toBe('clear');
    expect(s.counts).toMatchObject({ total: 3, done: 3, nearLimit: 1 });
  });

  test('a failing reading opens a fault at once, before the fault record reaches the tablet', () => {
    const after = withRecordedReading(strip('in-progress'), reading('s2', 'fail'));
    expect(after.status).toBe('fault-open');
    expect(after.counts.failed).toBe(1);
  });

  test('a withdrawn strip stays withdrawn, and a reading that suspended its strip puts it out of service', () => {
    expect(withRecordedReading(strip('withdrawn'), reading('s1', 'pass')).status).toBe('withdrawn');
    expect(withRecordedReading(strip('clear'), reading('s1', 'pass', { stripSuspended: true })).status).toBe('out-of-service');
  });
});
