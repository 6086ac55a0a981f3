import { describe, test, expect } from 'vitest';
import fc from 'fast-check';
import { decimateMinMax, indexAtOrBefore } from '../../shared/domain/decimate';

// Brute-force references, written without the module's binary search or its Set.

/** The last index whose time is ≤ t, by a linear scan (0 before the first sample). */
function lastAtOrBefore(timeS: number[], t: number): number {
  let found = 0;
  for (let i = 0; i < timeS.length; i++) if (timeS[i]! <= t) found = i;
  return found;
}

/** Irregular but increasing times, and volts from a seeded walk with a spike or two. */
function makeTrace(n: number, seed: number): { timeS: number[]; volts: number[] } {
  let a = seed >>> 0;
  const random = () => {
    a = (Math.imul(a, 1664525) + 1013904223) >>> 0;
    return a / 4294967296;
  };
  const timeS: number[] = [];
  const volts: number[] = [];
  let t = 0;
  let v = 0;
  for (let i = 0; i < n; i++) {
    t += 0.5e-9 + random() * 1e-9;
    v += random() - 0.5;
    timeS.push(t);
    volts.push(random() < 0.002 ? v + 40 * (random() - 0.5) : v);
  }
  return { timeS, volts };
}

const pairs = (out: { timeS: number[]; volts: number[] }) => out.timeS.map((t, i) => [t, out.volts[i]!] as const);

describe('decimateMinMax', () => {
  test('a trace that already fits is returned whole', () => {
    const { timeS, volts } = makeTrace(50, 3);
    const out = decimateMinMax(Float64Array.from(timeS), Float64Array.from(volts), 50, [timeS[10]!]);
    expect(out).toEqual({ timeS, volts });
  });

  test('property: at most N points, all of them real samples in time order, both ends kept', () => {
    fc.assert(
      fc.property(fc.integer({ min: 200, max: 5000 }), fc.integer({ min: 20, max: 400 }), fc.integer(), (n, maxPoints, seed) => {
        const { timeS, volts } = makeTrace(n, seed);
        const out = decimateMinMax(Float64Array.from(timeS), Float64Array.from(volts), maxPoints, [timeS[n >> 2]!, timeS[(3 * n) >> 2]!]);
        expect(out.timeS.length).toBeLessThanOrEqual(Math.min(n, maxPoints));
        expect(out.volts).toHaveLength(out.timeS.length);
        const sample = new Map(timeS.map((t, i) => [t, volts[i]!]));
        for (const [t, v] of pairs(out)) expect(sample.get(t)).toBe(v);
        for (let i = 1; i < out.timeS.length; i++) expect(out.timeS[i]!).toBeGreaterThan(out.timeS[i - 1]!);
        expect(out.timeS[0]).toBe(timeS[0]);
        expect(out.timeS[out.timeS.length - 1]).toBe(timeS[n - 1]);
      }),
      { numRuns: 60 },
    );
  });

  test('property: the two samples either side of each marker survive', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 500, max: 5000 }),
        fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 1, maxLength: 3 }),
        fc.integer(),
        (n, fractions, seed) => {
          const { timeS, volts } = makeTrace(n, seed);
          const span = timeS[n - 1]! - timeS[0]!;
          const markers = fractions.map((f) => timeS[0]! + f * span);
          const out = decimateMinMax(Float64Array.from(timeS), Float64Array.from(volts), 100, markers);
          const kept = new Set(out.timeS);
          for (const m of markers) {
            const i = lastAtOrBefore(timeS, m);
            for (let j = Math.max(0, i - 1); j <= Math.min(n - 1, i + 2); j++)
              expect(kept.has(timeS[j]!), `sample ${j} near ${m}`).toBe(true);
          }
        },
      ),
      { numRuns: 60 },
    );
  });

  test('property: the lowest and the highest sample of every block are kept', () => {
    fc.assert(
      fc.property(fc.integer({ min: 500, max: 6000 }), fc.integer({ min: 40, max: 300 }), fc.integer(), (n, maxPoints, seed) => {
        const { timeS, volts } = makeTrace(n, seed);
        const marker = timeS[n >> 1]!;
        const out = decimateMinMax(Float64Array.from(timeS), Float64Array.from(volts), maxPoints, [marker]);
        // The budget left after both ends and the four samples round the marker, two points a block.
        const i = lastAtOrBefore(timeS, marker);
        const markerSamples = Math.min(n - 1, i + 2) - Math.max(0, i - 1) + 1;
        const blocks = Math.floor((maxPoints - markerSamples - 2) / 2);
        const kept = new Set(pairs(out).map(([t, v]) => `${t}|${v}`));
        for (let b = 0; b < blocks; b++) {
          const start = Math.floor((b * n) / blocks);
          const end = Math.floor(((b + 1) * n) / blocks);
          const block = volts.slice(start, end);
          const lo = Math.min(...block);
          const hi = Math.max(...block);
          const has = (value: number) => timeS.slice(start, end).some((t, k) => block[k] === value && kept.has(`${t}|${value}`));
          expect(has(lo), `minimum of block ${b}`).toBe(true);
          expect(has(hi), `maximum of block ${b}`).toBe(true);
        }
      }),
      { numRuns: 60 },
    );
  });

  test('a spike narrower than a block is still drawn', () => {
    const n = 100_000;
    const timeS = Float64Array.from({ length: n }, (_, i) => i * 1e-9);
    const volts = new Float64Array(n);
    volts[61_234] = 5;
    volts[87_001] = -3;
    const out = decimateMinMax(timeS, volts, 400);
    expect(out.volts).toContain(5);
    expect(out.volts).toContain(-3);
    expect(out.timeS[out.volts.indexOf(5)]).toBe(timeS[61_234]);
  });
});

describe('indexAtOrBefore', () => {
  test('property: agrees with a linear scan, before, inside and after the trace', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 300 }), fc.double({ min: -1e-7, max: 5e-7, noNaN: true }), fc.integer(), (n, t, seed) => {
        const { timeS } = makeTrace(n, seed);
        expect(indexAtOrBefore(Float64Array.from(timeS), t)).toBe(lastAtOrBefore(timeS, t));
        // Exactly on a sample: that sample.
        const k = Math.abs(seed) % n;
        expect(indexAtOrBefore(timeS, timeS[k]!)).toBe(k);
      }),
      { numRuns: 100 },
    );
  });
});
