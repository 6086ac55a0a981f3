import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { DEFAULT_LIMIT_PROFILE } from '../../shared/domain/limits';
import { describeReadingValue, judgeTypedReading, parseLeadNull, readingValueView } from '../../shared/domain/typed-reading';
import { LEAD_NULL_MAX_OHM } from '../../shared/domain/units';

const reelContinuity = {
  profile: DEFAULT_LIMIT_PROFILE,
  equipmentKind: 'reel',
  testKind: 'continuity',
  conductors: 'A',
  lengthM: 20,
} as const;

describe('judgeTypedReading: one parse-and-judge for server, tablet, demo data and benchmarks', () => {
  test('the lead null is subtracted before judging: 3.05 Ω typed on a reel fails the 3 Ω limit, 2.95 Ω after a 0.1 Ω null passes near the limit', () => {
    // FIE Material Rules m.55.1: ≤ 3 Ω per wire (reel wire, socket to socket); near limit above 90 % is a house rule.
    const bare = judgeTypedReading('3.05', reelContinuity);
    expect(bare).toMatchObject({ ok: true, valueOhm: 3.05, leadNullOhm: null, verdict: { verdict: 'fail', limitOhm: 3 } });
    const nulled = judgeTypedReading('3.05', reelContinuity, 0.1);
    expect(nulled).toMatchObject({ ok: true, valueOhm: 2.95, leadNullOhm: 0.1, display: '2.95 Ω', verdict: { verdict: 'near-limit' } });
  });

  test('no default null: nothing is subtracted unless one is given', () => {
    expect(judgeTypedReading('0.8', reelContinuity)).toMatchObject({ ok: true, valueOhm: 0.8, leadNullOhm: null });
  });

  test('a null above 1 Ω is refused (common practice: such leads are replaced), whatever the reading', () => {
    expect(LEAD_NULL_MAX_OHM).toBe(1);
    const r = judgeTypedReading('12.9', reelContinuity, 9.9);
    expect(r).toMatchObject({ ok: false, field: 'leadNullId', code: 'bad-lead-null' });
    expect(judgeTypedReading('12.9', reelContinuity, 1)).toMatchObject({ ok: true, valueOhm: 11.9, verdict: { verdict: 'fail' } });
  });

  test('a null above the reading is refused on the value; over range ignores the null', () => {
    expect(judgeTypedReading('0.2', reelContinuity, 0.3)).toMatchObject({ ok: false, field: 'value' });
    expect(judgeTypedReading('OL', { ...reelContinuity, testKind: 'insulation', conductors: 'A-B' }, 0.3)).toMatchObject({
      ok: true,
      overRange: true,
      valueOhm: null,
      verdict: { verdict: 'pass' },
    });
  });

  test('the engine’s refusals come back as a field and a message, not as exceptions', () => {
    expect(judgeTypedReading('1', { ...reelContinuity, conductors: 'A-B' })).toMatchObject({ ok: false, field: 'conductors' });
    expect(judgeTypedReading('1', { ...reelContinuity, equipmentKind: 'piste' })).toMatchObject({
      ok: false,
      field: 'stepId',
      code: 'no-limit-rule',
    });
    expect(judgeTypedReading('1', { ...reelContinuity, temperatureC: 200 })).toMatchObject({ ok: false, field: 'temperatureC' });
  });

  test('property: with a null n ≤ 1 Ω and a reading r ≥ n, the value judged is r − n', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 100 }), fc.integer({ min: 0, max: 500 }), (nullCenti, extraCenti) => {
        const r = judgeTypedReading(String((nullCenti + extraCenti) / 100), reelContinuity, nullCenti / 100);
        expect(r.ok && r.valueOhm).toBeCloseTo(extraCenti / 100, 9);
      }),
    );
  });
});

describe('parseLeadNull', () => {
  test('takes what the meter shows with the tips touching, up to 1 Ω', () => {
    expect(parseLeadNull('0,12')).toEqual({ ok: true, valueOhm: 0.12, display: '0.12 Ω' });
    expect(parseLeadNull('120m')).toMatchObject({ ok: true, valueOhm: 0.12 });
    expect(parseLeadNull('1.01')).toMatchObject({ ok: false, message: expect.stringMatching(/Replace them/) });
    expect(parseLeadNull('OL')).toMatchObject({ ok: false, message: expect.stringMatching(/broken/) });
    expect(parseLeadNull('-0.1')).toMatchObject({ ok: false });
  });
});

describe('readingValueView: the value with its unit, and both figures when a null was subtracted', () => {
  test('with and without a null', () => {
    expect(readingValueView({ valueText: '0.8', valueOhm: 0.8, overRange: false, leadOffsetOhm: null })).toEqual({
      value: '0.8 Ω',
      typed: null,
      leadNull: null,
    });
    expect(readingValueView({ valueText: '850m', valueOhm: 0.75, overRange: false, leadOffsetOhm: 0.1 })).toEqual({
      value: '0.75 Ω',
      typed: '0.85 Ω',
      leadNull: '0.1 Ω',
    });
    expect(readingValueView({ valueText: 'OL', valueOhm: null, overRange: true, leadOffsetOhm: 0.1 })).toEqual({
      value: 'OL',
      typed: null,
      leadNull: null,
    });
    expect(describeReadingValue({ valueText: '1.3', valueOhm: 1.2, overRange: false, leadOffsetOhm: 0.1 })).toBe(
      '1.2 Ω (typed 1.3 Ω − 0.1 Ω lead null)',
    );
    expect(describeReadingValue({ valueText: '22 MΩ', valueOhm: 22e6, overRange: false, leadOffsetOhm: 0 })).toBe('22 MΩ');
    // A null too small to change the figure shown is not spelled out.
    expect(readingValueView({ valueText: '54 MΩ', valueOhm: 54e6 - 0.05, overRange: false, leadOffsetOhm: 0.05 })).toEqual({
      value: '54 MΩ',
      typed: null,
      leadNull: null,
    });
  });
});
