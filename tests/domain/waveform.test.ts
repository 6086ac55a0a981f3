import { describe, test, expect } from 'vitest';
import fc from 'fast-check';
import { create, all } from 'mathjs';
import { analyseWaveform, estimateFromMarkers, moveMarkers, parseTraceCsv, WaveformError } from '../../shared/domain/waveform';
import { synthesiseTrace } from '../setup/synthetic-trace';

const math = create(all!);
const C = math.speedOfLight.toNumber('m/s');

// --- analysis --------------------------------------------------------------------------------

describe('analyseWaveform', () => {
  test('clean open: Δt, positive polarity, ρ ≈ +1', () => {
    const a = analyseWaveform(synthesiseTrace({ roundTripS: 123.37e-9, rho: 1 }));
    expect(Math.abs(a.roundTripNs! - 123.37)).toBeLessThan(1); // within one 1 ns sample
    expect(a.polarity).toBe('open');
    expect(a.reflectionCoefficient!).toBeCloseTo(1, 1);
    expect(a.markers.reflection).not.toBeNull();
    expect(a.markers.incident.timeS * 1e9).toBeCloseTo(300, 0);
    expect(a.message).toMatch(/open/);
  });

  test('short: negative polarity, ρ ≈ −1', () => {
    // standard transmission-line theory: a short reflects −1
    const a = analyseWaveform(synthesiseTrace({ roundTripS: 87.6e-9, rho: -1, noiseV: 0.005, seed: 7 }));
    expect(Math.abs(a.roundTripNs! - 87.6)).toBeLessThan(1);
    expect(a.polarity).toBe('short');
    expect(a.reflectionCoefficient!).toBeCloseTo(-1, 1);
    expect(a.message).toMatch(/short/);
  });

  test('Z_L = 2 Z_0 gives ρ = +1/3 and Z_0/2 gives −1/3', () => {
    // standard transmission-line theory
    const up = analyseWaveform(synthesiseTrace({ roundTripS: 150e-9, rho: 1 / 3, noiseV: 0.002, seed: 3 }));
    const down = analyseWaveform(synthesiseTrace({ roundTripS: 150e-9, rho: -1 / 3, noiseV: 0.002, seed: 4 }));
    expect(up.reflectionCoefficient!).toBeCloseTo(1 / 3, 1);
    expect(down.reflectionCoefficient!).toBeCloseTo(-1 / 3, 1);
    expect(Math.abs(up.roundTripNs! - 150)).toBeLessThan(1);
    expect(Math.abs(down.roundTripNs! - 150)).toBeLessThan(1);
  });

  test('sloped baseline and noise: the baseline line is fitted and Δt still within one sample', () => {
    const a = analyseWaveform(synthesiseTrace({ roundTripS: 211.8e-9, rho: -0.9, noiseV: 0.01, slopeVPerS: 5e4, offsetV: 0.2, seed: 11 }));
    // Least-squares slope over the ~290 pre-edge samples: standard error σ / (dt · √(N³/12)).
    const standardError = 0.01 / (1e-9 * Math.sqrt(290 ** 3 / 12));
    expect(Math.abs(a.markers.baseline.slopeVPerS - 5e4)).toBeLessThan(4 * standardError);
    expect(a.markers.baseline.interceptV).toBeCloseTo(0.2, 1);
    expect(Math.abs(a.roundTripNs! - 211.8)).toBeLessThan(1);
    expect(a.polarity).toBe('short');
  });

  test('heavier noise (5 % of the step) on a short still gives Δt within one sample', () => {
    const a = analyseWaveform(synthesiseTrace({ roundTripS: 166.6e-9, rho: -1, noiseV: 0.025, slopeVPerS: -2e4, seed: 29 }));
    expect(Math.abs(a.roundTripNs! - 166.6)).toBeLessThan(1);
    expect(a.polarity).toBe('short');
  });

  test('with a velocity factor, a distance from the rise time and VF (TDR formula)', () => {
    // formula: Ulaby, Fundamentals of Applied Electromagnetics, TDR section, d = VF · c · Δt / 2 (the trace is ours)
    const roundTripS = 120e-9;
    const a = analyseWaveform(synthesiseTrace({ roundTripS, rho: -1, noiseV: 0.003, seed: 5 }), { velocityFactor: 0.66 });
    const expected = (0.66 * C * roundTripS) / 2;
    const oneSampleM = (0.66 * C * 1e-9) / 2;
    expect(Math.abs(a.distanceM! - expected)).toBeLessThan(oneSampleM);
    expect(a.uncertaintyM!).toBeGreaterThan(0);
    expect(a.estimate!.method).toBe('tdr');
    expect(a.riseTimeNs).toBeGreaterThan(3);
    expect(a.riseTimeNs).toBeLessThan(8);
    expect(a.message).toMatch(/from the instrument end/);
  });

  test('when the person works in feet, then the message gives the distance in feet and the numbers stay in metres', () => {
    const trace = synthesiseTrace({ roundTripS: 120e-9, rho: -1, noiseV: 0.003, seed: 5 });
    const metric = analyseWaveform(trace, { velocityFactor: 0.66 });
    const feet = analyseWaveform(trace, { velocityFactor: 0.66, units: 'imperial' });
    expect(feet.distanceM).toBe(metric.distanceM);
    // mathjs unit conversion, 1 ft = 0.3048 m (NIST SP 811)
    const ft = math.unit(metric.distanceM!, 'm').toNumber('ft');
    expect(feet.message).toContain(`about ${ft.toFixed(1)} ft from the instrument end`);
    expect(feet.message).not.toMatch(/\d m\b/);
    const marked = estimateFromMarkers(trace, 300e-9, 420e-9, { velocityFactor: 0.66, units: 'imperial' });
    expect(marked.message).toMatch(/ ft from the instrument end/);
  });

  test('a reflection past the cable’s end is reported in the message, not turned into a distance', () => {
    const a = analyseWaveform(synthesiseTrace({ roundTripS: 300e-9, rho: 1 }), { velocityFactor: 0.66, lengthM: 10 });
    expect(a.roundTripNs).not.toBeNull();
    expect(a.estimate).toBeNull();
    expect(a.message).toMatch(/beyond the end/);
  });

  test('no reflection: reflection null and a message, not an exception', () => {
    const a = analyseWaveform(synthesiseTrace({ roundTripS: null, noiseV: 0.005, seed: 2 }), { velocityFactor: 0.66 });
    expect(a.markers.reflection).toBeNull();
    expect(a.roundTripNs).toBeNull();
    expect(a.polarity).toBeNull();
    expect(a.distanceM).toBeNull();
    expect(a.message).toMatch(/No reflection/);
  });

  test('a flat, noisy trace has no incident edge', () => {
    const flat = synthesiseTrace({ roundTripS: null, stepV: 0, noiseV: 0.01, seed: 9 });
    expect(() => analyseWaveform(flat)).toThrow(WaveformError);
  });

  test.each([0, 3e-9])('a trace that starts on the edge (incident at %d s) is refused', (incidentS) => {
    expect(() => analyseWaveform(synthesiseTrace({ roundTripS: 100e-9, incidentS }))).toThrow(/baseline/);
  });

  test('a negative-going generator: ρ is still reflected / incident', () => {
    const a = analyseWaveform(synthesiseTrace({ roundTripS: 140.4e-9, stepV: -0.4, rho: 1, noiseV: 0.004, seed: 21 }));
    expect(a.incidentStepV).toBeLessThan(0);
    expect(a.polarity).toBe('open');
    expect(Math.abs(a.roundTripNs! - 140.4)).toBeLessThan(1);
  });

  test('property: Δt recovered within one sample for either polarity, with noise and a slope', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 2 ** 31 - 1 }),
        // From 40 ns: well clear of the edges' own width (a 6 ns rise comes back as 9 ns).
        fc.double({ min: 40e-9, max: 900e-9, noNaN: true }),
        fc.constantFrom(1, 0.8, 0.3, -0.3, -0.8, -1),
        fc.double({ min: 0, max: 0.01, noNaN: true }),
        fc.double({ min: -5e4, max: 5e4, noNaN: true }),
        fc.double({ min: 2e-9, max: 6e-9, noNaN: true }),
        (seed, roundTripS, rho, noiseV, slopeVPerS, riseS) => {
          const a = analyseWaveform(synthesiseTrace({ roundTripS, rho, noiseV, slopeVPerS, riseS, seed }));
          expect(Math.abs(a.roundTripNs! - roundTripS * 1e9)).toBeLessThan(1);
          expect(a.polarity).toBe(rho > 0 ? 'open' : 'short');
        },
      ),
      { numRuns: 100 },
    );
  });

  test('property: irregular time steps are honoured (interpolation uses the real times)', () => {
    const base = synthesiseTrace({ roundTripS: 200e-9, rho: -1, samples: 1500 });
    const timeS = base.timeS.map((t) => t * 2);
    const a = analyseWaveform({ timeS, volts: base.volts });
    expect(Math.abs(a.roundTripNs! - 400)).toBeLessThan(2); // one sample is now 2 ns
  });
});

describe('estimateFromMarkers', () => {
  const trace = synthesiseTrace({ roundTripS: 100e-9, rho: -1, noiseV: 0.002, seed: 13 });

  test('Δt between the markers, and the distance with the VF', () => {
    const e = estimateFromMarkers(trace, 300e-9, 400e-9, { velocityFactor: 0.7 });
    expect(e.roundTripNs).toBeCloseTo(100, 9);
    // Wikipedia, "Velocity factor": VF 0.70 → 4.765 ns/m one way, so 100 ns there and back ≈ 10.49 m
    expect(e.distanceM!).toBeCloseTo(100 / 2 / 4.765, 1);
    expect(e.polarity).toBe('short');
    expect(e.markers.incident.volts).toBeCloseTo(0.25, 1);
  });

  test('moveMarkers is the same function', () => {
    expect(moveMarkers).toBe(estimateFromMarkers);
  });

  test('markers outside the trace or in the wrong order are refused', () => {
    expect(() => estimateFromMarkers(trace, -1e-6, 400e-9)).toThrow(WaveformError);
    expect(() => estimateFromMarkers(trace, 400e-9, 300e-9)).toThrow(/after the incident/);
  });
});

// --- CSV -------------------------------------------------------------------------------------

function rows(n: number, format: (t: number, v: number) => string): string {
  const out: string[] = [];
  for (let i = 0; i < n; i++) out.push(format(i * 1e-9, Math.sin(i / 10)));
  return out.join('\n');
}

describe('parseTraceCsv', () => {
  test('plain two columns with a header', () => {
    const text = `time,volts\n${rows(20, (t, v) => `${t},${v}`)}`;
    const p = parseTraceCsv(text);
    expect(p.timeS.length).toBe(20);
    expect(p.skippedLines).toBe(1);
    expect(p.timeS[5]).toBeCloseTo(5e-9, 20);
    expect(p.volts[5]).toBeCloseTo(Math.sin(0.5), 12);
  });

  test('instrument metadata before the data, CRLF, BOM, trailing delimiters and scientific notation', () => {
    const text =
      '\uFEFFModel,DS1054Z\r\nX,CH1,Start,Increment,\r\nSecond,Volt,,\r\n' +
      rows(32, (t, v) => `${t.toExponential(6)},${v.toExponential(4)},`).replace(/\n/g, '\r\n');
    const p = parseTraceCsv(text);
    expect(p.timeS.length).toBe(32);
    expect(p.skippedLines).toBe(3);
    expect(p.volts[31]).toBeCloseTo(Math.sin(3.1), 4);
  });

  test('semicolon delimiter with decimal commas', () => {
    const text = `Zeit;Spannung\n${rows(20, (t, v) => `${String(t).replace('.', ',')};${v.toFixed(5).replace('.', ',')}`)}`;
    const p = parseTraceCsv(text);
    expect(p.timeS.length).toBe(20);
    expect(p.timeS[3]).toBeCloseTo(3e-9, 20);
    expect(p.volts[3]).toBeCloseTo(Math.sin(0.3), 5);
  });

  test('tab delimiter, with and without decimal commas', () => {
    const dot = parseTraceCsv(rows(20, (t, v) => `${t}\t${v}`));
    const comma = parseTraceCsv(rows(20, (t, v) => `${String(t).replace('.', ',')}\t${String(v).replace('.', ',')}`));
    expect(dot.volts[7]).toBeCloseTo(Math.sin(0.7), 12);
    expect(comma.volts[7]).toBeCloseTo(Math.sin(0.7), 12);
  });

  test('whitespace-separated and quoted fields', () => {
    expect(parseTraceCsv(rows(20, (t, v) => `  ${t}   ${v}`)).timeS.length).toBe(20);
    expect(parseTraceCsv(rows(20, (t, v) => `"${t}","${v}"`)).volts[2]).toBeCloseTo(Math.sin(0.2), 12);
  });

  test('extra columns: the first two are used, up to 8 columns', () => {
    const p = parseTraceCsv(rows(20, (t, v) => `${t},${v},${-v},${2 * v}`));
    expect(p.volts[4]).toBeCloseTo(Math.sin(0.4), 12);
    expect(() => parseTraceCsv(rows(20, (t, v) => `${t},${v},1,2,3,4,5,6,7`))).toThrow(/9 columns/);
  });

  test('a few garbage lines inside the data are skipped and counted; blank lines too', () => {
    const lines = rows(40, (t, v) => `${t},${v}`).split('\n');
    lines.splice(10, 0, 'glitch', '');
    lines.splice(25, 0, 'time,volts');
    const p = parseTraceCsv(lines.join('\n'));
    expect(p.timeS.length).toBe(40);
    expect(p.skippedLines).toBe(3);
  });

  test.each<[string, string, RegExp]>([
    ['no numeric rows', 'time,volts\nabc,def\n', /No numeric rows/],
    ['empty', '', /No numeric rows/],
    ['too few samples', rows(10, (t, v) => `${t},${v}`), /Only 10 samples/],
    ['time going backwards', `${rows(20, (t, v) => `${t},${v}`)}\n1e-10,0`, /Time does not increase at line 21/],
    ['repeated time', `${rows(20, (t, v) => `${t},${v}`)}\n1.9e-8,0`, /Time does not increase/],
    ['garbage beyond the allowance', `${rows(20, (t, v) => `${t},${v}`)}\n${'x,y\n'.repeat(11)}`, /Line 31 is not two numbers/],
    ['one column', rows(20, (t) => `${t}`), /No numeric rows/],
  ])('refuses %s', (_name, text, message) => {
    expect(() => parseTraceCsv(text)).toThrow(WaveformError);
    expect(() => parseTraceCsv(text)).toThrow(message);
  });

  test('more than maxSamples is refused', () => {
    expect(() =>
      parseTraceCsv(
        rows(100, (t, v) => `${t},${v}`),
        { maxSamples: 50 },
      ),
    ).toThrow(/more than 50 samples/);
  });

  test('a million lines parse correctly', () => {
    const n = 1_000_000;
    const parts: string[] = ['Time (s),Voltage (V)'];
    for (let i = 0; i < n; i++) parts.push(`${i}e-9,${(i % 1000) / 1000}`);
    const p = parseTraceCsv(parts.join('\n'));
    expect(p.timeS.length).toBe(n);
    expect(p.skippedLines).toBe(1);
    expect(p.timeS[0]).toBe(0);
    expect(p.timeS[n - 1]).toBe(Number(`${n - 1}e-9`));
    expect(p.timeS[123_456]).toBe(123_456e-9);
    expect(p.volts[123_456]).toBe(0.456);
  });

  test('a parsed CSV of a synthetic trace analyses like the trace itself', () => {
    const trace = synthesiseTrace({ roundTripS: 97.3e-9, rho: -1, noiseV: 0.003, seed: 17 });
    const lines = ['time;volts'];
    for (let i = 0; i < trace.timeS.length; i++) {
      lines.push(`${trace.timeS[i]!.toExponential(9).replace('.', ',')};${trace.volts[i]!.toFixed(6).replace('.', ',')}`);
    }
    const a = analyseWaveform(parseTraceCsv(lines.join('\n')));
    expect(Math.abs(a.roundTripNs! - 97.3)).toBeLessThan(1);
  });
});
