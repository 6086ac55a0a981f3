// The one locate form's texts → the body of POST /api/fault-location
// (src/features/fault-locator/utils/build-request.ts). Conversions checked with mathjs unit
// conversion (1 ft = 0.3048 m, NIST SP 811).
import { describe, expect, test } from 'vitest';
import { unit } from 'mathjs';
import { buildRequest, formFields, type LocatorState } from '../../src/features/fault-locator/utils/build-request';
import { fromSiValues, typeText, type UnitTexts } from '../../src/lib/unit-texts';
import type { LengthSystem } from '../../shared/domain/units';

const typed = (texts: Record<string, string>, start: UnitTexts = { texts: {}, exact: {} }): UnitTexts =>
  Object.entries(texts).reduce((v, [k, t]) => typeText(v, k, t), start);
const state = (
  method: LocatorState['method'],
  values: UnitTexts,
  perMetreSource: LocatorState['perMetreSource'] = 'reading',
): LocatorState => ({
  method,
  values,
  perMetreSource,
  conductorSize: 'mm2:0.75',
});
const build = (s: LocatorState, system: LengthSystem = 'metric') => buildRequest(s, system);

describe('the locate form’s request', () => {
  test('readings typed as a meter shows them are sent in Ω and metres', () => {
    const built = build(state('loop-both-ends', typed({ nearOhm: '0.855', farOhm: '645m', lengthM: '12', conductorOhm: '0.45' })));
    expect(built.request).toEqual({ method: 'loop-both-ends', nearOhm: 0.855, farOhm: 0.645, lengthM: 12, conductorOhm: 0.45 });
    expect(built.readAs.farOhm).toBe('0.645 Ω');
    expect(built.answer!.distanceM).toBeCloseTo(7.4, 9); // x = (R_A − R_B + 2rL) / (4r) (REFERENCES.md, "loop, both ends")
  });

  test('a resistance per length is typed per km in metres and per 1000 ft in feet, and sent per metre', () => {
    const metric = build(
      state('loop-both-ends', typed({ nearOhm: '0.855', farOhm: '0.645', lengthM: '12', ohmPerMetre: '37.5' }), 'value'),
    );
    expect(metric.request).toMatchObject({ method: 'loop-both-ends' });
    expect((metric.request as { ohmPerMetre: number }).ohmPerMetre).toBeCloseTo(unit(37.5, 'ohm/km').toNumber('ohm/m'), 15);
    const feet = build(
      state('loop-both-ends', typed({ nearOhm: '0.855', farOhm: '0.645', lengthM: '39.37', ohmPerMetre: '11.43' }), 'value'),
      'imperial',
    );
    expect((feet.request as { ohmPerMetre: number }).ohmPerMetre).toBeCloseTo(unit(11.43, 'ohm/ft').toNumber('ohm/m') / 1000, 15);
    expect(feet.request!.lengthM).toBeCloseTo(unit(39.37, 'ft').toNumber('m'), 12);
  });

  test('a prefilled length shown in feet is sent as the exact metres it came from', () => {
    const values = typed({ loopOhm: '0.855', conductorOhm: '0.45' }, fromSiValues({ lengthM: 12 }, { lengthM: 'length' }, 'imperial'));
    expect(values.texts.lengthM).toBe('39.37');
    expect(build(state('loop-one-end', values), 'imperial').request!.lengthM).toBe(12);
  });

  test('with a conductor’s end-to-end reading the length is needed, even where the method has it optional', () => {
    const fields = formFields({ method: 'loop-one-end', perMetreSource: 'reading' });
    expect(fields.find((f) => f.input.name === 'lengthM')!.required).toBe(true);
    expect(formFields({ method: 'loop-one-end', perMetreSource: 'value' }).find((f) => f.input.name === 'lengthM')!.required).toBe(false);
    expect(build(state('loop-one-end', typed({ loopOhm: '0.855', conductorOhm: '0.45' }))).missing).toEqual(['lengthM']);
  });

  test('Murray loop: the arms by what they are joined to; the wrong way round is refused on the faulted arm', () => {
    // x = 2L · a_faulted / (a_faulted + a_sound) (REFERENCES.md, Murray loop)
    const right = build(state('murray', typed({ lengthM: '600', faultedArm: '1', soundArm: '3' })));
    expect(right.request).toEqual({ method: 'murray', lengthM: 600, faultedArm: 1, soundArm: 3 });
    expect(right.answer!.distanceM).toBeCloseTo(300, 9);
    const wrong = build(state('murray', typed({ lengthM: '600', faultedArm: '3', soundArm: '1' })));
    expect(wrong.answer).toBeNull();
    expect(wrong.errors.faultedArm).toMatch(/beyond the end/);
  });

  test('a number that could carry a thousands separator is refused in every field, with both readings', () => {
    const built = build(state('murray', typed({ lengthM: '1,200', faultedArm: '1', soundArm: '2,500' })));
    expect(built.request).toBeNull();
    expect(built.errors.lengthM).toContain('did you mean 1200 m or 1.200 m?');
    expect(built.errors.soundArm).toContain('did you mean 2500 or 2.500?');
    expect(build(state('capacitance', typed({ lengthM: '12', faultedNf: '1,200', soundNf: '1.5' }))).errors.faultedNf).toContain(
      'did you mean 1200 nF or 1.200 nF?',
    );
  });
});
