// The fault page's form texts in metres or feet (src/lib/unit-texts.ts): typed in
// the person's unit, sent in metres and Ω per metre. Conversions checked with mathjs unit
// conversion (1 ft = 0.3048 m, NIST SP 811).
import { describe, expect, test } from 'vitest';
import { unit } from 'mathjs';
import { fromSiValues, siOf, switchUnits, typeText } from '../../src/lib/unit-texts';

const dims = { lengthM: 'length', ohmPerMetre: 'per-length', nearOhm: undefined } as const;

describe('unit texts on the fault page', () => {
  test('when a person in feet types 5 ft, then the form sends 1.524 m', () => {
    const state = typeText(fromSiValues({}, dims, 'imperial'), 'lengthM', '5');
    expect(siOf(state, 'lengthM', 'length', 'imperial')).toBeCloseTo(unit(5, 'ft').toNumber('m'), 12);
  });

  test('when a prefilled 12 m is shown in feet and left alone, then exactly 12 m is sent, not the rounded feet', () => {
    const state = fromSiValues({ lengthM: 12, ohmPerMetre: 0.0375 }, dims, 'imperial');
    expect(state.texts.lengthM).toBe(String(Number(unit(12, 'm').toNumber('ft').toPrecision(4))));
    expect(siOf(state, 'lengthM', 'length', 'imperial')).toBe(12);
    // Per 1000 ft in feet: 0.0375 Ω/m is 11.43 Ω/1000 ft.
    expect(state.texts.ohmPerMetre).toBe(String(Number((unit(0.0375, 'ohm/m').toNumber('ohm/ft') * 1000).toPrecision(4))));
    expect(siOf(state, 'ohmPerMetre', 'per-length', 'imperial')).toBe(0.0375);
  });

  test('when the unit is switched with numbers typed, then they are rewritten and keep their length; switching back gives the same text', () => {
    const typed = typeText(typeText(fromSiValues({}, dims, 'imperial'), 'lengthM', '40'), 'nearOhm', '0.855');
    const metric = switchUnits(typed, dims, 'imperial', 'metric');
    expect(metric.texts.lengthM).toBe(String(Number(unit(40, 'ft').toNumber('m').toPrecision(4))));
    expect(metric.texts.nearOhm).toBe('0.855');
    expect(switchUnits(metric, dims, 'metric', 'imperial').texts.lengthM).toBe('40');
  });

  test('when a text is not a number, then a switch leaves it for the person to correct and nothing is sent for it', () => {
    const state = typeText(fromSiValues({}, dims, 'metric'), 'lengthM', 'twelve');
    expect(switchUnits(state, dims, 'metric', 'imperial').texts.lengthM).toBe('twelve');
    expect(siOf(state, 'lengthM', 'length', 'metric')).toBeNull();
  });

  test('when a decimal comma is typed, then it reads as a decimal point', () => {
    const state = typeText(fromSiValues({}, dims, 'metric'), 'lengthM', '10,5');
    expect(siOf(state, 'lengthM', 'length', 'metric')).toBe(10.5);
  });
});
