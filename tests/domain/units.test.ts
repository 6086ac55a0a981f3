import { describe, test, expect } from 'vitest';
import fc from 'fast-check';
import { create, all, unit, type Unit } from 'mathjs';
import {
  feetToMetres,
  formatLength,
  formatOhm,
  fromOhmPerMetre,
  lengthToMetres,
  lengthUnitSymbol,
  lengthUnitWord,
  metresToFeet,
  metresToLength,
  decimalProblem,
  parseDecimal,
  parseReading,
  READING_BOUNDS,
  toOhmPerMetre,
  type ParsedReading,
  type PerLengthUnit,
  type Quantity,
} from '../../shared/domain/units';

const math = create(all!);

function valueOf(result: ParsedReading): number | null {
  if (!result.ok) throw new Error(`expected ok, got: ${result.message}`);
  return result.value;
}

function messageOf(result: ParsedReading): string {
  if (result.ok) throw new Error(`expected a refusal, got ${String(result.value)}`);
  return result.message;
}

describe('parseReading: resistance', () => {
  // Expected values written by hand in ohms.
  test.each<[string, number]>([
    ['0.8', 0.8],
    ['0,8', 0.8],
    ['0.8 Ω', 0.8],
    ['0.8Ω', 0.8],
    ['0.8 Ω', 0.8], // U+2126 OHM SIGN
    ['0.8 ohm', 0.8],
    ['0.8 ohms', 0.8],
    ['0.8 Ohms', 0.8],
    ['800m', 0.8],
    ['800 mΩ', 0.8],
    ['800 mohm', 0.8],
    ['1.2k', 1200],
    ['1.2K', 1200],
    ['1.2 kΩ', 1200],
    ['1,2 kΩ', 1200],
    ['22 MΩ', 22e6],
    ['22M', 22e6],
    ['22 Mohm', 22e6],
    ['22 meg', 22e6],
    ['1.5 GΩ', 1.5e9],
    ['1.2e3', 1200],
    ['1.2E3 Ω', 1200],
    ['4.7e-1', 0.47],
    ['2.5e-3 kΩ', 2.5],
    ['.5', 0.5],
    ['0', 0],
    ['0.00 Ω', 0],
    ['  2.6  ', 2.6],
    ['+2.6', 2.6],
    ['2 GΩ', 2e9],
  ])('“%s” → %d Ω', (text, expected) => {
    const result = parseReading(text, 'resistance');
    expect(result.ok).toBe(true);
    if (result.ok) {
      expect(result.overRange).toBe(false);
      expect(result.value).toBeCloseTo(expected, 12);
    }
  });

  test('prefix case matters: m is milli, M is mega', () => {
    expect(valueOf(parseReading('800m'))).toBe(0.8);
    expect(valueOf(parseReading('800M'))).toBe(800e6);
    expect(valueOf(parseReading('22 mΩ'))).toBe(0.022);
    expect(valueOf(parseReading('22 MΩ'))).toBe(22e6);
  });

  test('a prefix gives exactly the decimal value (800m is 0.8, not 0.8000000000000002)', () => {
    expect(valueOf(parseReading('800m'))).toBe(0.8);
    expect(valueOf(parseReading('4.7 kΩ'))).toBe(4700);
  });

  test.each(['OL', 'ol', 'O.L.', 'o.l.', 'O.L', 'open', 'OPEN', '∞', 'inf', 'Infinity', 'over', 'Over range'])(
    '“%s” is over range: value null, overRange true',
    (text) => {
      const result = parseReading(text, 'resistance');
      expect(result).toEqual({ ok: true, value: null, overRange: true, display: 'OL' });
    },
  );

  test.each<[string, RegExp]>([
    ['', /enter a reading/i],
    ['   ', /enter a reading/i],
    ['NaN', /not a reading/i],
    ['abc', /not a reading/i],
    ['-0.2', /cannot be negative/i],
    ['−0.2 Ω', /cannot be negative/i],
    ['3 GΩ', /more than a handheld meter shows.*2 GΩ.*OL/i],
    ['1e12', /more than a handheld meter shows/i],
    ['22 nF', /capacitance; a resistance in Ω is expected/],
    ['96 ns', /time; a resistance in Ω is expected/],
    ['800ms', /time; a resistance in Ω is expected/],
    ['5 V', /voltage; a resistance in Ω is expected/],
    ['2 mA', /current; a resistance in Ω is expected/],
    ['2 x', /not a unit/],
    ['1.2.3', /not a unit|more than one decimal/],
    ['1,2.3', /more than one decimal separator/],
    ['1e999', /too large.*overflows/],
    ['1e309', /too large.*overflows/],
    ['1e-400', /too small.*underflows/],
    ['5e-330 Ω', /too small.*underflows/],
  ])('refuses “%s”', (text, message) => {
    expect(messageOf(parseReading(text, 'resistance'))).toMatch(message);
  });
});

describe('parseReading: capacitance and time', () => {
  test.each<[string, Quantity, number]>([
    ['470 pF', 'capacitance', 470e-12],
    ['1.2 nF', 'capacitance', 1.2e-9],
    ['1.2nf', 'capacitance', 1.2e-9],
    ['2.2 µF', 'capacitance', 2.2e-6], // U+00B5 MICRO SIGN
    ['2.2 μF', 'capacitance', 2.2e-6], // U+03BC GREEK SMALL LETTER MU
    ['2.2 uF', 'capacitance', 2.2e-6],
    ['22n', 'capacitance', 22e-9],
    ['10 mF', 'capacitance', 10e-3],
    ['96 ns', 'time', 96e-9],
    ['1.2 µs', 'time', 1.2e-6],
    ['1.2 μs', 'time', 1.2e-6],
    ['1.2 us', 'time', 1.2e-6],
    ['5 ms', 'time', 5e-3],
    ['2 s', 'time', 2],
    ['1.5e-7 s', 'time', 1.5e-7],
    ['250 ps', 'time', 250e-12],
  ])('“%s” as %s', (text, quantity, expected) => {
    const result = parseReading(text, quantity);
    expect(result.ok).toBe(true);
    if (result.ok) expect(result.value! / expected).toBeCloseTo(1, 12);
  });

  test.each<[string, Quantity, RegExp]>([
    ['OL', 'capacitance', /only a valid reading for a resistance/],
    ['OL', 'time', /only a valid reading for a resistance/],
    ['4.7', 'capacitance', /add the unit/i],
    ['96', 'time', /add the unit/i],
    ['0.5 pF', 'capacitance', /less than a handheld meter resolves.*1 pF/],
    ['0.2 F', 'capacitance', /more than a handheld meter shows.*100 mF/],
    ['50 ps', 'time', /less than a handheld meter resolves.*100 ps/],
    ['20 s', 'time', /more than a handheld meter shows.*10 s/],
    ['2.5 Ω', 'capacitance', /resistance; a capacitance in F/],
    ['96 ns', 'capacitance', /time; a capacitance/],
    ['22 nF', 'time', /capacitance; a time in s/],
    ['-5 nF', 'capacitance', /cannot be negative/],
  ])('refuses “%s” as %s', (text, quantity, message) => {
    expect(messageOf(parseReading(text, quantity))).toMatch(message);
  });

  test('bounds are the documented ones', () => {
    expect(READING_BOUNDS).toEqual({
      resistance: { min: 0, max: 2e9 },
      capacitance: { min: 1e-12, max: 0.1 },
      time: { min: 1e-10, max: 10 },
    });
  });
});

describe('parseReading: test-lead offset', () => {
  test('is subtracted from resistance readings', () => {
    expect(valueOf(parseReading('0.8', 'resistance', { leadOffsetOhm: 0.3 }))).toBe(0.5);
    expect(valueOf(parseReading('1.2 kΩ', 'resistance', { leadOffsetOhm: 0.2 }))).toBe(1199.8);
  });

  test('a reading equal to the offset is 0 Ω', () => {
    expect(valueOf(parseReading('0.3', 'resistance', { leadOffsetOhm: 0.3 }))).toBe(0);
  });

  test('is not subtracted from over range', () => {
    expect(parseReading('OL', 'resistance', { leadOffsetOhm: 0.3 })).toEqual({ ok: true, value: null, overRange: true, display: 'OL' });
  });

  test('a reading below the offset is refused with the reason', () => {
    expect(messageOf(parseReading('0.2', 'resistance', { leadOffsetOhm: 0.3 }))).toMatch(
      /below the nulled test-lead resistance \(0\.3 Ω\)/,
    );
  });

  // Leads reading more than 1 Ω tips together are worn and replaced (common practice, no published value).
  test.each([-0.1, 1.05, 10.5, Number.NaN, Number.POSITIVE_INFINITY])('an offset of %d Ω is refused', (offset) => {
    expect(messageOf(parseReading('0.8', 'resistance', { leadOffsetOhm: offset }))).toMatch(/between 0 and 1 Ω/);
  });

  test('property: reading − offset, for any reading at or above the offset', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 100 }), fc.integer({ min: 0, max: 1000 }), (offsetCentiOhm, extraCentiOhm) => {
        const offset = offsetCentiOhm / 100;
        const reading = (offsetCentiOhm + extraCentiOhm) / 100;
        const value = valueOf(parseReading(String(reading), 'resistance', { leadOffsetOhm: offset }));
        expect(value).toBeCloseTo(extraCentiOhm / 100, 9);
      }),
    );
  });
});

describe('parseReading: properties', () => {
  const prefixes: Array<[string, number]> = [
    ['m', -3],
    ['', 0],
    ['k', 3],
    ['M', 6],
  ];
  test('a number with a prefix is the number × 10^prefix, whatever the spacing and unit spelling', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 999_999 }),
        fc.integer({ min: 0, max: 3 }),
        fc.constantFrom(...prefixes),
        fc.constantFrom('', ' '),
        fc.constantFrom('', 'Ω', 'ohm', 'ohms'),
        (mantissa, decimals, [prefix, exponent], space, unit) => {
          const text = (mantissa / 10 ** decimals).toFixed(decimals);
          const expected = (mantissa / 10 ** decimals) * 10 ** exponent;
          const result = parseReading(`${text}${space}${prefix}${unit}`, 'resistance');
          if (expected > 2e9) return;
          // "12.345" without a prefix could be 12345: refused (see the thousands-separator tests).
          if (prefix === '' && /^[1-9]\d{0,2}\.\d{3}$/.test(text)) {
            expect(result.ok).toBe(false);
            return;
          }
          expect(result.ok).toBe(true);
          if (result.ok) expect(result.value).toBeCloseTo(expected, 6);
        },
      ),
    );
  });

  test('anything with a letter that is not a unit is refused, never silently read', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1000, noNaN: true }), fc.constantFrom('x', 'q', 'Z', 'b', 'R'), (value, junk) => {
        expect(parseReading(`${value}${junk}`, 'resistance').ok).toBe(false);
      }),
    );
  });

  test('formatOhm then parseReading gives back the value to four significant digits', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.001, max: 1.9e9, noNaN: true }), (ohm) => {
        const shown = formatOhm(ohm);
        // "1.235 Ω" could be 1235 Ω: refused as typed, and read as meant when written "1.2350".
        const typed = /^[1-9]\d{0,2}\.\d{3} Ω$/.test(shown) ? shown.replace(' Ω', '0 Ω') : shown;
        const back = valueOf(parseReading(typed, 'resistance'))!;
        expect(Math.abs(back - ohm) / ohm).toBeLessThan(5e-4);
      }),
    );
  });
});

describe('formatOhm', () => {
  test.each<[number, string]>([
    [0, '0 Ω'],
    [0.8, '0.8 Ω'],
    [0.05, '0.05 Ω'],
    [2.5, '2.5 Ω'],
    [2.6, '2.6 Ω'],
    [999.96, '1 kΩ'],
    [1200, '1.2 kΩ'],
    [100e3, '100 kΩ'],
    [22e6, '22 MΩ'],
    [1.5e9, '1.5 GΩ'],
    [1.23456, '1.235 Ω'],
  ])('%d Ω → %s', (ohm, text) => {
    expect(formatOhm(ohm)).toBe(text);
  });
});

describe('lengths', () => {
  test('1 ft is 0.3048 m exactly, as mathjs has it', () => {
    expect(feetToMetres(1)).toBe(math.unit(1, 'ft').toNumber('m'));
    expect(metresToFeet(math.unit(1, 'ft').toNumber('m'))).toBeCloseTo(1, 14);
  });

  test('property: metres ↔ feet agree with mathjs and round-trip', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1e5, noNaN: true }), (m) => {
        expect(metresToFeet(m)).toBeCloseTo(math.unit(m, 'm').toNumber('ft'), 6);
        expect(feetToMetres(metresToFeet(m))).toBeCloseTo(m, 9);
      }),
    );
  });

  test.each<[number, 'metric' | 'imperial', string]>([
    [7.4, 'metric', '7.4 m'],
    [7.4239, 'metric', '7.42 m'],
    [12, 'metric', '12 m'],
    [20.04, 'metric', '20 m'],
    [3863.64, 'metric', '3.864 km'],
    [12, 'imperial', '39.4 ft'], // 12 / 0.3048 = 39.37…
    [1, 'imperial', '3.28 ft'],
    [0.3048, 'imperial', '1 ft'],
  ])('%d m in %s → %s', (m, system, text) => {
    expect(formatLength(m, system)).toBe(text);
  });
});

// mathjs unit conversion, 1 ft = 0.3048 m (NIST SP 811).
describe("lengths typed in the user's unit", () => {
  test('units and words: m / metres, ft / feet', () => {
    expect([lengthUnitSymbol('metric'), lengthUnitWord('metric')]).toEqual(['m', 'metres']);
    expect([lengthUnitSymbol('imperial'), lengthUnitWord('imperial')]).toEqual(['ft', 'feet']);
  });

  test('a cut-out of 5 ft is 1.524 m exactly (as mathjs has it), and 3 ft is 0.9144 m without float noise', () => {
    expect(lengthToMetres(5, 'imperial')).toBe(unit(5, 'ft').toNumber('m'));
    expect(lengthToMetres(5, 'imperial')).toBe(1.524);
    expect(lengthToMetres(3, 'imperial')).toBe(0.9144); // 3 * 0.3048 is 0.9144000000000001 in floating point
    expect(lengthToMetres(1.5, 'metric')).toBe(1.5);
  });

  test("metres → the user's unit: 12 m is 39.37 ft", () => {
    expect(metresToLength(12, 'imperial')).toBeCloseTo(unit(12, 'm').toNumber('ft'), 12);
    expect(metresToLength(12, 'imperial')).toBeCloseTo(39.3700787, 6);
    expect(metresToLength(12, 'metric')).toBe(12);
  });

  test('property: typed length → metres → typed length round-trips in both systems, and agrees with mathjs', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.001, max: 1e5, noNaN: true }), (typed) => {
        expect(lengthToMetres(typed, 'imperial')).toBeCloseTo(unit(typed, 'ft').toNumber('m'), 6);
        expect(metresToLength(lengthToMetres(typed, 'imperial'), 'imperial') / typed).toBeCloseTo(1, 10);
        expect(metresToLength(lengthToMetres(typed, 'metric'), 'metric') / typed).toBeCloseTo(1, 10);
      }),
    );
  });
});

// mathjs unit conversion, 1 ft = 0.3048 m (NIST SP 811).
describe('resistance per length', () => {
  const perMetreOf = (value: number, per: string) => (unit(value, 'ohm').divide(unit(per)) as Unit).toNumber('ohm/m');

  test.each<[PerLengthUnit, string]>([
    ['Ω/m', '1 m'],
    ['Ω/km', '1 km'],
    ['Ω/ft', '1 ft'],
    ['Ω/1000 ft', '1000 ft'],
  ])('%s → Ω/m and back agrees with mathjs', (perUnit, per) => {
    expect(toOhmPerMetre(11.43, perUnit)).toBeCloseTo(perMetreOf(11.43, per), 12);
    expect(fromOhmPerMetre(0.0375, perUnit)).toBeCloseTo((unit(0.0375, 'ohm/m').multiply(unit(per)) as Unit).toNumber('ohm'), 12);
  });

  test('0.0375 Ω/m of one conductor is 11.43 Ω per 1000 ft, and 11.43 Ω per 1000 ft is 0.0375 Ω/m', () => {
    expect(fromOhmPerMetre(0.0375, 'Ω/1000 ft')).toBeCloseTo(11.43, 12);
    expect(toOhmPerMetre(11.43, 'Ω/1000 ft')).toBe(0.0375);
  });

  test('property: to and from Ω/m round-trip', () => {
    const units: PerLengthUnit[] = ['Ω/m', 'Ω/km', 'Ω/ft', 'Ω/1000 ft'];
    fc.assert(
      fc.property(fc.double({ min: 1e-6, max: 1e3, noNaN: true }), fc.constantFrom(...units), (perMetre, perUnit) => {
        expect(toOhmPerMetre(fromOhmPerMetre(perMetre, perUnit), perUnit) / perMetre).toBeCloseTo(1, 10);
      }),
    );
  });
});

// SI Brochure, 9th edition (BIPM 2019), §5.4.4: the decimal marker is the point or the comma on
// the line, and neither dots nor commas go between groups of three digits (CGPM 2003, Resolution
// 10). Read second-hand, as quoted elsewhere, not in the Brochure itself. People still write "1,000" and "2.500" for
// thousands (common practice), so a number that reads both ways is refused, never guessed.
describe('parseReading: a separator that could be a thousands separator', () => {
  test.each<[string, Quantity, string, string]>([
    ['1,000', 'resistance', '1000 Ω', '1.000 Ω'],
    ['2.500', 'resistance', '2500 Ω', '2.500 Ω'],
    ['12,500', 'resistance', '12500 Ω', '12.500 Ω'],
    ['2,500 Ω', 'resistance', '2500 Ω', '2.500 Ω'],
    ['1,000k', 'resistance', '1000 kΩ', '1.000 kΩ'],
    ['1,200 nF', 'capacitance', '1200 nF', '1.200 nF'],
    ['1,250 ns', 'time', '1250 ns', '1.250 ns'],
  ])('“%s” as %s is refused, offering %s and %s', (text, quantity, thousands, decimal) => {
    const message = messageOf(parseReading(text, quantity));
    expect(message).toContain(`did you mean ${thousands} or ${decimal}?`);
  });

  test('the message says how to type each reading, and what it says is read as said', () => {
    expect(messageOf(parseReading('2,500'))).toMatch(/Type 2500 for the first, 2\.5 for the second\.$/);
    expect(valueOf(parseReading('2500'))).toBe(2500);
    expect(valueOf(parseReading('2.5'))).toBe(2.5);
    // No trailing zero to drop: one is added, so the decimal reading has four decimals.
    expect(messageOf(parseReading('1.235'))).toMatch(/Type 1235 for the first, 1\.2350 for the second\.$/);
    expect(valueOf(parseReading('1.2350'))).toBe(1.235);
    expect(messageOf(parseReading('1,000k'))).toMatch(/Type 1000k for the first, 1k for the second\.$/);
  });

  test.each<[string, number]>([
    ['1,5', 1.5],
    ['0,25', 0.25],
    ['1,2345', 1.2345],
    ['0,250', 0.25],
    ['1234,567', 1234.567],
    ['1.000k', 1000], // a point before a prefix: how a meter on its kΩ range shows 1 kΩ
    ['2.500 kΩ', 2500],
    ['1.500 MΩ', 1.5e6],
    ['1.000e3', 1000], // with an exponent it is a decimal
  ])('“%s” is a decimal: %d Ω', (text, ohm) => {
    expect(valueOf(parseReading(text))).toBeCloseTo(ohm, 9);
  });

  test('property: one to three digits, a comma or a point, exactly three digits and nothing else is refused with both readings', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 999 }),
        fc.integer({ min: 0, max: 999 }),
        fc.constantFrom(',', '.'),
        (whole, part, separator) => {
          const digits = String(part).padStart(3, '0');
          const message = messageOf(parseReading(`${whole}${separator}${digits}`));
          expect(message).toContain(`did you mean ${whole}${digits} Ω or ${whole}.${digits} Ω?`);
        },
      ),
    );
  });

  test('property: with four or more decimals, or fewer than three, the comma is a decimal separator', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 999 }), fc.stringMatching(/^\d{1,2}$|^\d{4,6}$/), (whole, part) => {
        expect(valueOf(parseReading(`${whole},${part}`))).toBeCloseTo(Number(`${whole}.${part}`), 9);
      }),
    );
  });

  test('property: a comma before a prefix is refused like a bare one; a point before a prefix is read as a decimal', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 999 }),
        fc.integer({ min: 0, max: 999 }),
        fc.constantFrom(['k', 1e3], ['M', 1e6], ['m', 1e-3]),
        (whole, part, [prefix, factor]) => {
          const digits = String(part).padStart(3, '0');
          expect(parseReading(`${whole},${digits}${prefix}`).ok).toBe(false);
          const value = Number(`${whole}.${digits}`) * (factor as number);
          if (value <= 2e9) expect(valueOf(parseReading(`${whole}.${digits}${prefix}`))).toBeCloseTo(value, 6);
        },
      ),
    );
  });
});

describe('parseReading: exponents that overflow or underflow', () => {
  // IEEE 754 binary64, as JavaScript reads numbers: Number("1e-400") is 0 and Number("1e309") is Infinity.
  test('the platform would read them as 0 and ∞', () => {
    expect(Number('1e-400')).toBe(0);
    expect(Number('1e309')).toBe(Infinity);
  });

  test('property: a non-zero mantissa with an exponent below −324 or above 308 is refused, never read as 0 or ∞', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 9999 }),
        fc.oneof(fc.integer({ min: -2000, max: -330 }), fc.integer({ min: 309, max: 2000 })),
        fc.constantFrom<Quantity>('resistance', 'capacitance', 'time'),
        (mantissa, exponent, quantity) => {
          const unit = { resistance: 'Ω', capacitance: 'F', time: 's' }[quantity];
          const message = messageOf(parseReading(`${mantissa}e${exponent} ${unit}`, quantity));
          expect(message).toMatch(exponent < 0 ? /underflows/ : /overflows/);
        },
      ),
    );
  });

  test('zero with any exponent is still 0 Ω', () => {
    expect(valueOf(parseReading('0e-400'))).toBe(0);
    expect(valueOf(parseReading('0.0e999'))).toBe(0);
  });
});

describe('parseDecimal', () => {
  test.each<[string, number | null]>([
    ['12', 12],
    [' 1.5 ', 1.5],
    ['0,8', 0.8],
    ['.5', 0.5],
    ['5.', 5],
    ['1e3', 1000],
    ['-2', -2],
    ['', null],
    ['5 ft', null],
    ['1.2.3', null],
    ['abc', null],
    ['1,000.5', null],
    ['1,000', null],
    ['2.500', null],
    ['1,5', 1.5],
    ['1,2345', 1.2345],
    ['0,250', 0.25],
    ['1e309', null],
    ['1e-400', null],
    ['0e-400', 0],
  ])('“%s” → %s', (text, expected) => {
    expect(parseDecimal(text)).toBe(expected);
  });

  test('decimalProblem says why: both readings for a possible thousands separator, over- and underflow', () => {
    expect(decimalProblem('1,500', 'm')).toBe(
      '“1,500” could be read two ways: did you mean 1500 m or 1.500 m? Type 1500 for the first, 1.5 for the second.',
    );
    expect(decimalProblem('1e309')).toMatch(/overflows/);
    expect(decimalProblem('1e-400')).toMatch(/underflows/);
    expect(decimalProblem('twelve')).toBe('Type a number.');
    expect(decimalProblem('12.5')).toBeNull();
  });
});
