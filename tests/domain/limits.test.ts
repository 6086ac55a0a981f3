import { describe, test, expect } from 'vitest';
import fc from 'fast-check';
import {
  CONDUCTORS,
  correctTo20C,
  DEFAULT_LIMIT_PROFILE,
  EQUIPMENT_KINDS,
  evaluateReading,
  findRule,
  NoRuleError,
  PAIRS,
  ReadingInputError,
  TEST_KINDS,
  temperatureCorrectionFactor,
  temperatureRuleText,
  type EquipmentKind,
  type LimitProfile,
  type ReadingToEvaluate,
  type TestKind,
  type Verdict,
} from '../../shared/domain/limits';
import { limitProfileRulesSchema, limitProfileSchema } from '../../shared/schemas/limit-profile';

const profile = DEFAULT_LIMIT_PROFILE;

function evaluate(partial: Partial<ReadingToEvaluate> & Pick<ReadingToEvaluate, 'equipmentKind' | 'testKind'>): Verdict {
  return evaluateReading({ profile, conductors: 'A', valueOhm: null, overRange: false, ...partial });
}

const HOUSE = 'House rule (no published value)';

describe('constants', () => {
  test('kinds, tests, conductors and pairs', () => {
    expect(EQUIPMENT_KINDS).toEqual(['floor-cable', 'reel', 'piste', 'body-wire', 'apparatus', 'other']);
    expect(TEST_KINDS).toEqual(['continuity', 'insulation', 'loop', 'piste-end-to-end', 'piste-earth']);
    expect(CONDUCTORS).toEqual(['A', 'B', 'C']);
    expect(PAIRS).toEqual(['A-B', 'A-C', 'B-C']);
  });
});

describe('DEFAULT_LIMIT_PROFILE', () => {
  test('is “Competition default”, version 1, and passes its own schema', () => {
    expect(profile.name).toBe('Competition default');
    expect(profile.version).toBe(1);
    expect(limitProfileSchema.parse(profile)).toEqual(profile);
  });

  test('floor cable continuity ≤ 2.5 Ω per wire', () => {
    // FIE Material Rules m.55.5
    const rule = findRule(profile, 'floor-cable', 'continuity')!;
    expect(rule.maxOhm).toBe(2.5);
    expect(rule.source).toBe('FIE Material Rules, art. m.55.5');
    expect(rule.houseRule).toBe(false);
  });

  test('reel continuity ≤ 3 Ω per wire', () => {
    // FIE Material Rules m.55.1
    const rule = findRule(profile, 'reel', 'continuity')!;
    expect(rule.maxOhm).toBe(3);
    expect(rule.source).toBe('FIE Material Rules, art. m.55.1');
  });

  test('body wire continuity ≤ 1 Ω per conductor', () => {
    // FIE Material Rules m.29.1c, m.31.1b
    const rule = findRule(profile, 'body-wire', 'continuity')!;
    expect(rule.maxOhm).toBe(1);
    expect(rule.source).toMatch(/^FIE Material Rules, art\. m\.29\.1c/);
    expect(rule.source).toMatch(/m\.31\.1b/);
  });

  test('conductive piste end to end ≤ 5 Ω', () => {
    // FIE Material Rules m.57.1
    const rule = findRule(profile, 'piste', 'piste-end-to-end')!;
    expect(rule.maxOhm).toBe(5);
    expect(rule.source).toBe('FIE Material Rules, art. m.57.1');
  });

  test('piste earth is a house rule that cites m.56.4 for the requirement', () => {
    // FIE Material Rules m.56.4: earthed at the centre, no value
    const rule = findRule(profile, 'piste', 'piste-earth')!;
    expect(rule.houseRule).toBe(true);
    expect(rule.source).toBe(HOUSE);
    expect(rule.note).toMatch(/m\.56\.4/);
    expect(rule.maxOhm).toBe(5);
  });

  test.each<EquipmentKind>(['floor-cable', 'reel', 'body-wire', 'apparatus', 'other'])(
    'insulation on %s: house rule, fail below 100 kΩ, near limit below 1 MΩ',
    (kind) => {
      // FIE Material Rules m.29.1a, m.31.1a: "well insulated" (no value) → house rule
      const rule = findRule(profile, kind, 'insulation')!;
      expect(rule.minOhm).toBe(100_000);
      expect(rule.nearMinOhm).toBe(1_000_000);
      expect(rule.houseRule).toBe(true);
      expect(rule.source).toBe(HOUSE);
      expect(rule.note).toMatch(/m\.29\.1a/);
    },
  );

  test.each<[EquipmentKind, number]>([
    ['floor-cable', 2.5],
    ['reel', 3],
    ['body-wire', 1],
  ])('loop on %s is a house rule at twice the per-wire maximum of %d Ω', (kind, perWire) => {
    const rule = findRule(profile, kind, 'loop')!;
    expect(rule.maxOhm).toBe(2 * perWire);
    expect(rule.houseRule).toBe(true);
    expect(rule.source).toBe(HOUSE);
  });

  test('near-limit band is 90 % on every maximum (house rule)', () => {
    for (const rule of profile.rules.filter((r) => r.maxOhm !== undefined)) {
      expect(rule.nearLimitFraction).toBe(0.9);
    }
  });

  test('loop steps are asked for floor cables and reels', () => {
    expect(profile.loopRequired).toEqual(['floor-cable', 'reel']);
  });
});

describe('evaluateReading: maxima', () => {
  test('2.6 Ω on a floor cable fails and says why', () => {
    // FIE Material Rules m.55.5
    const v = evaluate({ equipmentKind: 'floor-cable', testKind: 'continuity', conductors: 'A', valueOhm: 2.6 });
    expect(v.verdict).toBe('fail');
    expect(v.limitOhm).toBe(2.5);
    expect(v.limitKind).toBe('max');
    expect(v.ruleId).toBe('floor-cable.continuity');
    expect(v.source).toBe('FIE Material Rules, art. m.55.5');
    expect(v.explanation).toContain('2.6 Ω is over the 2.5 Ω limit per wire for floor cables — FIE Material Rules, art. m.55.5');
  });

  test.each<[number, Verdict['verdict']]>([
    [0, 'pass'],
    [0.8, 'pass'],
    [2.25, 'pass'], // exactly 90 %: not above it
    [2.26, 'near-limit'],
    [2.5, 'near-limit'], // the limit itself passes (≤)
    [2.51, 'fail'],
  ])('floor cable %d Ω → %s', (ohm, verdict) => {
    expect(evaluate({ equipmentKind: 'floor-cable', testKind: 'continuity', valueOhm: ohm }).verdict).toBe(verdict);
  });

  test('near limit says it passes but should be watched', () => {
    const v = evaluate({ equipmentKind: 'reel', testKind: 'continuity', conductors: 'B', valueOhm: 2.8 });
    expect(v.verdict).toBe('near-limit');
    expect(v.explanation).toMatch(
      /2\.8 Ω is within the 3 Ω limit per wire for reels but above 90 %.*watched — FIE Material Rules, art\. m\.55\.1/,
    );
  });

  test('over range on continuity is an open conductor: fail', () => {
    const v = evaluate({ equipmentKind: 'floor-cable', testKind: 'continuity', conductors: 'C', overRange: true });
    expect(v.verdict).toBe('fail');
    expect(v.explanation).toMatch(/open/);
    expect(v.explanation).toMatch(/conductor C/);
  });

  test('over range on a loop is a fail', () => {
    const v = evaluate({ equipmentKind: 'reel', testKind: 'loop', conductors: 'A-B', overRange: true });
    expect(v.verdict).toBe('fail');
    expect(v.explanation).toMatch(/loop A-B is open/);
  });

  test('loop readings are judged against twice the per-wire limit', () => {
    expect(evaluate({ equipmentKind: 'floor-cable', testKind: 'loop', conductors: 'A-B', valueOhm: 4.4 }).verdict).toBe('pass');
    expect(evaluate({ equipmentKind: 'floor-cable', testKind: 'loop', conductors: 'B-A', valueOhm: 4.6 }).verdict).toBe('near-limit');
    expect(evaluate({ equipmentKind: 'floor-cable', testKind: 'loop', conductors: 'A–B', valueOhm: 5.1 }).verdict).toBe('fail');
  });

  test('piste end to end and piste earth', () => {
    expect(evaluate({ equipmentKind: 'piste', testKind: 'piste-end-to-end', conductors: '', valueOhm: 4 }).verdict).toBe('pass');
    expect(evaluate({ equipmentKind: 'piste', testKind: 'piste-end-to-end', conductors: '', valueOhm: 5.5 }).verdict).toBe('fail');
    const earth = evaluate({ equipmentKind: 'piste', testKind: 'piste-earth', conductors: '', overRange: true });
    expect(earth.verdict).toBe('fail');
    expect(earth.explanation).toMatch(/not connected to the apparatus earth/);
  });

  test('body wire ≤ 1 Ω', () => {
    // FIE Material Rules m.29.1c, m.31.1b
    expect(evaluate({ equipmentKind: 'body-wire', testKind: 'continuity', valueOhm: 1.2 }).verdict).toBe('fail');
    expect(evaluate({ equipmentKind: 'body-wire', testKind: 'continuity', valueOhm: 0.5 }).verdict).toBe('pass');
  });
});

describe('evaluateReading: insulation', () => {
  test.each<[number | null, Verdict['verdict']]>([
    [null, 'pass'], // OL
    [50e6, 'pass'],
    [1e6, 'pass'],
    [999e3, 'near-limit'],
    [100e3, 'near-limit'],
    [99e3, 'fail'],
    [0.3, 'fail'],
  ])('%s Ω between A and B → %s', (ohm, verdict) => {
    const v = evaluate({ equipmentKind: 'floor-cable', testKind: 'insulation', conductors: 'A-B', valueOhm: ohm, overRange: ohm === null });
    expect(v.verdict).toBe(verdict);
    expect(v.limitKind).toBe('min');
    expect(v.limitOhm).toBe(100_000);
    expect(v.source).toBe(HOUSE);
  });

  test('below 500 Ω the explanation says the apparatus can register a hit', () => {
    // FIE Material Rules Annex B, foil: a valid hit always registers below 500 Ω
    const v = evaluate({ equipmentKind: 'reel', testKind: 'insulation', conductors: 'A-C', valueOhm: 320 });
    expect(v.verdict).toBe('fail');
    expect(v.explanation).toMatch(/register a hit/);
    expect(v.explanation).toMatch(/500 Ω/);
  });

  test('between 500 Ω and 100 kΩ it fails without the hit warning', () => {
    const v = evaluate({ equipmentKind: 'reel', testKind: 'insulation', conductors: 'A-C', valueOhm: 5000 });
    expect(v.verdict).toBe('fail');
    expect(v.explanation).not.toMatch(/register a hit/);
    expect(v.explanation).toContain(
      '5 kΩ between A and C is below the 100 kΩ minimum insulation for reels — House rule (no published value)',
    );
  });

  test('property: a lower insulation reading is never judged better', () => {
    const rank = { pass: 0, 'near-limit': 1, fail: 2 } as const;
    fc.assert(
      fc.property(fc.double({ min: 0, max: 2e9, noNaN: true }), fc.double({ min: 0, max: 2e9, noNaN: true }), (a, b) => {
        const [lo, hi] = a < b ? [a, b] : [b, a];
        const vLo = evaluate({ equipmentKind: 'floor-cable', testKind: 'insulation', conductors: 'A-B', valueOhm: lo });
        const vHi = evaluate({ equipmentKind: 'floor-cable', testKind: 'insulation', conductors: 'A-B', valueOhm: hi });
        expect(rank[vLo.verdict]).toBeGreaterThanOrEqual(rank[vHi.verdict]);
      }),
    );
  });
});

describe('evaluateReading: properties of maxima', () => {
  const rank = { pass: 0, 'near-limit': 1, fail: 2 } as const;
  const maxima: Array<[EquipmentKind, TestKind, string]> = [
    ['floor-cable', 'continuity', 'A'],
    ['reel', 'continuity', 'B'],
    ['body-wire', 'continuity', 'C'],
    ['floor-cable', 'loop', 'A-B'],
    ['piste', 'piste-end-to-end', ''],
    ['piste', 'piste-earth', ''],
  ];
  test('a higher resistance is never judged better (monotone)', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...maxima),
        fc.double({ min: 0, max: 100, noNaN: true }),
        fc.double({ min: 0, max: 100, noNaN: true }),
        ([equipmentKind, testKind, conductors], a, b) => {
          const [lo, hi] = a < b ? [a, b] : [b, a];
          const vLo = evaluate({ equipmentKind, testKind, conductors, valueOhm: lo });
          const vHi = evaluate({ equipmentKind, testKind, conductors, valueOhm: hi });
          expect(rank[vLo.verdict]).toBeLessThanOrEqual(rank[vHi.verdict]);
        },
      ),
    );
  });

  test('fail exactly when above the limit; near limit exactly when above 90 % of it', () => {
    fc.assert(
      fc.property(fc.constantFrom(...maxima), fc.double({ min: 0, max: 20, noNaN: true }), ([equipmentKind, testKind, conductors], ohm) => {
        const v = evaluate({ equipmentKind, testKind, conductors, valueOhm: ohm });
        const limit = findRule(profile, equipmentKind, testKind)!.maxOhm!;
        const expected = ohm > limit ? 'fail' : ohm > 0.9 * limit ? 'near-limit' : 'pass';
        expect(v.verdict).toBe(expected);
      }),
    );
  });
});

describe('per-metre rules', () => {
  const perMetre: LimitProfile = {
    name: 'Per metre',
    version: 3,
    rules: [
      {
        id: 'reel.continuity',
        equipmentKind: 'reel',
        testKind: 'continuity',
        maxOhmPerMetre: 0.1,
        connectorAllowanceOhm: 0.5,
        nearLimitFraction: 0.9,
        source: 'Handbook, p. 12',
        houseRule: false,
      },
    ],
  };

  test('limit = Ω/m × length + connector allowance, explained', () => {
    const v = evaluateReading({
      profile: perMetre,
      equipmentKind: 'reel',
      testKind: 'continuity',
      conductors: 'A',
      valueOhm: 2.6,
      overRange: false,
      lengthM: 20,
    });
    // 0.1 × 20 + 0.5 = 2.5 Ω
    expect(v.limitOhm).toBeCloseTo(2.5, 12);
    expect(v.verdict).toBe('fail');
    expect(v.explanation).toMatch(/0\.1 Ω\/m × 20 m \+ 0\.5 Ω for the connectors/);
  });

  test('without a length the rule cannot be applied', () => {
    expect(() =>
      evaluateReading({ profile: perMetre, equipmentKind: 'reel', testKind: 'continuity', conductors: 'A', valueOhm: 1, overRange: false }),
    ).toThrow(ReadingInputError);
  });
});

describe('temperature correction', () => {
  test('k_t(30 °C) = 0.9622 and k_t(10 °C) = 1.0409', () => {
    // IEC 60228 Annex B
    expect(temperatureCorrectionFactor(30)).toBeCloseTo(0.9622, 4);
    expect(temperatureCorrectionFactor(10)).toBeCloseTo(1.0409, 4);
    expect(temperatureCorrectionFactor(20)).toBe(1);
  });

  test('k_t agrees with the copper temperature coefficient 0.00393 /°C near 20 °C', () => {
    // IEC 60228 Annex B; copper coefficient 0.00393 /°C
    const slope = (temperatureCorrectionFactor(20.5) - temperatureCorrectionFactor(19.5)) / 1;
    expect(-slope).toBeCloseTo(0.00393, 5);
  });

  test('correctTo20C', () => {
    // IEC 60228 Annex B: 2.6 Ω at 30 °C × 0.9622
    expect(correctTo20C(2.6, 30)).toBeCloseTo(2.6 * 0.9622, 3);
  });

  test('by default a reading is judged as measured: 2.55 Ω at 35 °C fails the 2.5 Ω floor-cable limit, and the explanation says why it was not corrected', () => {
    // FIE Material Rules, art. m.55.5: ≤ 2.5 Ω per wire; the rules give no reference temperature
    expect(DEFAULT_LIMIT_PROFILE.temperatureReferenceC).toBeNull();
    const v = evaluate({ equipmentKind: 'floor-cable', testKind: 'continuity', valueOhm: 2.55, temperatureC: 35 });
    expect(v.verdict).toBe('fail');
    expect(v.correctedOhm).toBeUndefined();
    expect(v.explanation).toMatch(
      /^Read 2\.55 Ω at 35 °C and judged as measured \(the FIE Material Rules give no reference temperature\)\. 2\.55 Ω is over/,
    );
  });

  test('a profile that corrects to 20 °C passes the same warm cable once corrected, and calls the correction a house rule', () => {
    const correcting: LimitProfile = { ...DEFAULT_LIMIT_PROFILE, temperatureReferenceC: 20 };
    const v = evaluateReading({
      profile: correcting,
      equipmentKind: 'floor-cable',
      testKind: 'continuity',
      conductors: 'A',
      valueOhm: 2.55,
      overRange: false,
      temperatureC: 35,
    });
    // 2.55 × 254.5 / 269.5 = 2.408 Ω (IEC 60228 Annex B)
    expect(v.correctedOhm).toBeCloseTo((2.55 * 254.5) / 269.5, 9);
    expect(v.verdict).toBe('near-limit');
    expect(v.explanation).toMatch(/Read 2\.55 Ω at 35 °C, which is 2\.408 Ω corrected to 20 °C \(house rule of this profile/);
  });

  test('to another reference temperature the same copper law: k(35 → 25 °C) is k_t(35) / k_t(25)', () => {
    // IEC 60228 Annex B: both corrections to 20 °C, chained
    expect(temperatureCorrectionFactor(35, 25)).toBeCloseTo(temperatureCorrectionFactor(35) / temperatureCorrectionFactor(25), 12);
    const v = evaluateReading({
      profile: { ...DEFAULT_LIMIT_PROFILE, temperatureReferenceC: 25 },
      equipmentKind: 'reel',
      testKind: 'continuity',
      conductors: 'B',
      valueOhm: 3.05,
      overRange: false,
      temperatureC: 35,
    });
    expect(v.correctedOhm).toBeCloseTo(3.05 * (259.5 / 269.5), 9);
    expect(v.explanation).toMatch(/corrected to 25 °C/);
  });

  test('the choice in one sentence, as the certificate prints it', () => {
    expect(temperatureRuleText(DEFAULT_LIMIT_PROFILE)).toBe('Judged as measured (no correction)');
    expect(temperatureRuleText({ temperatureReferenceC: 20 })).toBe('Copper corrected to 20 °C (IEC 60228 Annex B): house rule');
  });

  test('the reference temperature is checked like a reading’s: −40 … 70 °C or null', () => {
    expect(limitProfileSchema.safeParse({ ...DEFAULT_LIMIT_PROFILE, temperatureReferenceC: 20 }).success).toBe(true);
    expect(limitProfileSchema.safeParse({ ...DEFAULT_LIMIT_PROFILE, temperatureReferenceC: null }).success).toBe(true);
    expect(limitProfileSchema.safeParse({ ...DEFAULT_LIMIT_PROFILE, temperatureReferenceC: 200 }).success).toBe(false);
  });

  test('pistes and insulation are not corrected', () => {
    expect(
      evaluate({ equipmentKind: 'piste', testKind: 'piste-end-to-end', conductors: '', valueOhm: 4, temperatureC: 35 }).correctedOhm,
    ).toBeUndefined();
    expect(
      evaluate({ equipmentKind: 'reel', testKind: 'insulation', conductors: 'A-B', valueOhm: 4e6, temperatureC: 35 }).correctedOhm,
    ).toBeUndefined();
  });

  test('an implausible temperature is refused', () => {
    expect(() => evaluate({ equipmentKind: 'reel', testKind: 'continuity', valueOhm: 1, temperatureC: 200 })).toThrow(ReadingInputError);
  });
});

describe('refusals', () => {
  test('no rule for the kind and test → NoRuleError naming the profile', () => {
    expect(() => evaluate({ equipmentKind: 'piste', testKind: 'insulation', conductors: 'A-B', valueOhm: 1 })).toThrow(NoRuleError);
    try {
      evaluate({ equipmentKind: 'apparatus', testKind: 'continuity', valueOhm: 1 });
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(NoRuleError);
      expect((error as Error).message).toMatch(/Competition default.*version 1.*continuity.*scoring apparatus/);
    }
    expect(findRule(profile, 'apparatus', 'continuity')).toBeNull();
  });

  test.each<[TestKind, string]>([
    ['continuity', 'A-B'],
    ['continuity', 'D'],
    ['insulation', 'A'],
    ['insulation', 'A-A'],
    ['loop', 'ABC'],
  ])('%s with conductors “%s” is refused', (testKind, conductors) => {
    expect(() => evaluate({ equipmentKind: 'reel', testKind, conductors, valueOhm: 1 })).toThrow(ReadingInputError);
  });

  test.each([-1, Number.NaN, Number.POSITIVE_INFINITY])('a value of %d Ω is refused', (valueOhm) => {
    expect(() => evaluate({ equipmentKind: 'reel', testKind: 'continuity', valueOhm })).toThrow(ReadingInputError);
  });

  test('a null value without over range is refused', () => {
    expect(() => evaluate({ equipmentKind: 'reel', testKind: 'continuity', valueOhm: null })).toThrow(ReadingInputError);
  });
});

describe('limitProfileRulesSchema', () => {
  const good = {
    id: 'r1',
    equipmentKind: 'reel',
    testKind: 'continuity',
    maxOhm: 3,
    source: 'FIE Material Rules, art. m.55.1',
    houseRule: false,
  };

  test('accepts the default rules', () => {
    expect(limitProfileRulesSchema.safeParse(DEFAULT_LIMIT_PROFILE.rules).success).toBe(true);
  });

  test.each<[string, unknown, RegExp]>([
    ['empty', [], /at least one rule/],
    ['no limit', [{ ...good, maxOhm: undefined }], /needs a maximum/],
    ['min and max', [{ ...good, minOhm: 5 }], /either a maximum or a minimum/],
    ['insulation maximum', [{ ...good, testKind: 'insulation' }], /insulation rule sets a minimum/],
    ['negative', [{ ...good, maxOhm: -1 }], /more than 0 Ω/],
    ['no source', [{ ...good, source: ' ' }], /source/],
    ['unknown kind', [{ ...good, equipmentKind: 'mask' }], /equipmentKind must be one of/],
    ['unknown key', [{ ...good, colour: 'red' }], /Unrecognized key/],
    ['duplicate id', [good, { ...good, equipmentKind: 'floor-cable' }], /used twice/],
    ['duplicate target', [good, { ...good, id: 'r2' }], /already a continuity rule/],
    ['near fraction', [{ ...good, nearLimitFraction: 1.2 }], /between 0 and 1/],
    ['near min below min', [{ ...good, testKind: 'insulation', maxOhm: undefined, minOhm: 1e5, nearMinOhm: 5e4 }], /above minOhm/],
  ])('refuses %s', (_name, rules, message) => {
    const result = limitProfileRulesSchema.safeParse(rules);
    expect(result.success).toBe(false);
    if (!result.success) expect(result.error.issues.map((i) => i.message).join(' | ')).toMatch(message);
  });
});
