import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { parseTraceCsv } from '../../shared/domain/waveform';

// The trace parser reads numbers from the characters for speed; JavaScript's own Number() is the
// reference it must agree with, bit for bit.
describe('trace CSV numbers', () => {
  test('every time and volts value equals Number() of its text (toExponential, toFixed, toPrecision forms)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.double({ min: -1e3, max: 1e3, noNaN: true }), fc.integer({ min: 0, max: 15 })), {
          minLength: 16,
          maxLength: 64,
        }),
        (rows) => {
          const texts = rows.map(([v, d], i) => {
            const time = ((i + 1) * 1.25e-10).toExponential(d % 10);
            const volts = d % 3 === 0 ? v.toFixed(d) : d % 3 === 1 ? v.toPrecision(Math.max(1, d)) : String(v);
            return [time, volts] as const;
          });
          // Times must increase: skip samples whose rounded text would repeat.
          const unique = texts.filter((r, i) => i === 0 || Number(r[0]) > Number(texts[i - 1][0]));
          fc.pre(unique.length >= 16 && unique.every((r, i) => i === 0 || Number(r[0]) > Number(unique[i - 1][0])));
          const trace = parseTraceCsv(unique.map((r) => r.join(',')).join('\n'));
          unique.forEach(([t, v], i) => {
            expect(trace.timeS[i]).toBe(Number(t));
            expect(trace.volts[i]).toBe(Number(v));
          });
        },
      ),
      { numRuns: 300 },
    );
  });

  test('decimal commas with semicolons, signs and long mantissas read as the same numbers', () => {
    const lines = Array.from({ length: 20 }, (_, i) => `${i + 1},5e-9;-0,12345678901234567`);
    const trace = parseTraceCsv(lines.join('\n'));
    expect(trace.timeS[0]).toBe(1.5e-9);
    expect(trace.volts[0]).toBe(Number('-0.12345678901234567'));
  });
});
