import { describe, expect, test } from 'vitest';
import { venueReadiness, type ReadinessStep, type ReadinessStripInput } from '../../shared/domain/readiness';

let n = 0;
const step = (verdict: 'pass' | 'near-limit' | 'fail' | null, extra: Partial<ReadinessStep> = {}): ReadinessStep => {
  n += 1;
  return {
    stepId: `step-${n}`,
    positionId: 'pos-1',
    positionName: 'Left floor cable',
    equipmentId: 'item-1',
    assetTag: 'FC-001',
    testKind: 'continuity',
    conductors: 'A',
    required: true,
    latest: verdict
      ? {
          readingId: `r-${n}`,
          verdict,
          valueText: '0.5',
          valueOhm: 0.5,
          overRange: false,
          limitOhm: 2.5,
          limitKind: 'max',
          source: 'FIE Material Rules, art. m.55.5',
          equipmentId: 'item-1',
          takenAt: '2026-11-21T07:00:00.000Z',
          takenByName: 'Lee Varga',
        }
      : null,
    ...extra,
  };
};
const strip = (id: string, steps: ReadinessStep[], extra: Partial<ReadinessStripInput> = {}): ReadinessStripInput => ({
  stripId: id,
  label: `Strip ${id}`,
  withdrawn: false,
  withdrawnReason: null,
  steps,
  openFaults: [],
  ...extra,
});

describe('venue readiness', () => {
  test('when every required step passes or is near limit, then the venue is ready and the near-limit reading is listed', () => {
    const r = venueReadiness([strip('1', [step('pass'), step('near-limit')])]);
    expect(r.ready).toBe(true);
    expect(r.nearLimit).toHaveLength(1);
    expect(r.strips[0].state).toBe('ready');
  });

  test('a missing or failing required step blocks; an optional one does not', () => {
    const r = venueReadiness([
      strip('1', [step('pass'), step(null)]),
      strip('2', [step('fail')]),
      strip('3', [step('pass'), step(null, { required: false })]),
    ]);
    expect(r.ready).toBe(false);
    expect(r.strips.map((s) => s.state)).toEqual(['missing', 'failing', 'ready']);
    expect(r.issues.map((i) => i.kind)).toEqual(['missing', 'failing']);
  });

  test('a reading taken on an item that has since been swapped out does not count', () => {
    const r = venueReadiness([strip('1', [step('pass', { equipmentId: 'item-2' })])]);
    expect(r.strips[0].missing[0].why).toBe('item-swapped');
    expect(r.ready).toBe(false);
  });

  test('an open fault blocks even when the latest readings pass', () => {
    const r = venueReadiness([
      strip('1', [step('pass')], {
        openFaults: [{ faultId: 'f', positionName: 'Left reel', kind: 'short', conductors: 'A-B', status: 'located' }],
      }),
    ]);
    expect(r.ready).toBe(false);
    expect(r.issues[0]).toMatchObject({ kind: 'open-fault', faultKind: 'short' });
  });

  test('a withdrawn strip, or one given as an exception at sign-off, is left out with its reason', () => {
    const r = venueReadiness(
      [strip('1', [step('pass')]), strip('2', [step('fail')], { withdrawn: true, withdrawnReason: 'Not used' }), strip('3', [step(null)])],
      [{ stripId: '3', reason: 'Reserve strip, not in use' }],
    );
    expect(r.ready).toBe(true);
    expect(r.exceptions).toEqual([
      { stripId: '2', label: 'Strip 2', reason: 'Not used', source: 'withdrawn' },
      { stripId: '3', label: 'Strip 3', reason: 'Reserve strip, not in use', source: 'sign-off' },
    ]);
  });

  test('when every strip is left out, then there is nothing to certify', () => {
    const r = venueReadiness([strip('1', [step(null)])], [{ stripId: '1', reason: 'Not used' }]);
    expect(r.ready).toBe(false);
    expect(r.issues).toEqual([{ kind: 'nothing-to-certify' }]);
  });
});
