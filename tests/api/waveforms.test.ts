import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { create, all } from 'mathjs';
import type { Agent } from 'supertest';
import { createTestApp, DEMO, ORIGIN, type TestApp } from '../setup/test-app';
import { synthesiseTrace, traceCsv } from '../setup/synthetic-trace';

// mathjs as the independent reference for the speed of light.
const math = create(all);
const C = math.speedOfLight.toNumber('m/s');

let t: TestApp;
let lee: Agent;
beforeAll(async () => {
  t = await createTestApp();
  lee = await t.agentFor(DEMO.annexTechnician);
});
afterAll(() => t.close());

const analyse = (csv: string, query = '', type = 'text/csv') =>
  lee.post(`/api/waveforms/analyse${query}`).set('Content-Type', type).send(csv);

describe('POST /api/waveforms/analyse', () => {
  for (const [polarity, rho] of [
    ['open', 1],
    ['short', -1],
  ] as const) {
    test(`when a noisy trace reflects ${polarity} after 96 ns, then Δt is within one sample and the polarity is ${polarity}`, async () => {
      const dtS = 1e-9;
      const roundTripS = 96e-9;
      const csv = traceCsv(synthesiseTrace({ samples: 2000, dtS, roundTripS, rho, riseS: 4e-9, noiseV: 0.01, seed: rho > 0 ? 7 : 11 }));
      const res = await analyse(csv, '?velocityFactor=0.66');
      expect(res.status).toBe(200);
      expect(Math.abs(res.body.roundTripNs - roundTripS * 1e9)).toBeLessThanOrEqual(dtS * 1e9);
      expect(res.body.polarity).toBe(polarity);
      expect(Math.sign(res.body.reflectionCoefficient)).toBe(rho);
      expect(res.body.sampleIntervalNs).toBeCloseTo(1, 6);
      expect(res.body.sampleCount).toBe(2000);
      // d = VF · c · Δt / 2 with c from mathjs, on the measured Δt.
      expect(res.body.distanceM).toBeCloseTo((0.66 * C * res.body.roundTripNs * 1e-9) / 2, 9);
      expect(res.body.estimate).toMatchObject({ method: 'tdr', velocityFactor: 0.66 });
      expect(res.body.markers.reflection.timeS).toBeGreaterThan(res.body.markers.incident.timeS);
      // 2000 samples fit a plot as they are.
      expect(res.body.plot.timeS).toHaveLength(2000);
    });
  }

  test('when no velocity factor is given, then the analysis has no distance and says how to get one', async () => {
    const res = await analyse(traceCsv(synthesiseTrace({ roundTripS: 80e-9, noiseV: 0.005 })), '', 'text/plain');
    expect(res.status).toBe(200);
    expect(res.body.roundTripNs).toBeCloseTo(80, 0);
    expect(res.body.distanceM).toBeNull();
    expect(res.body.message).toMatch(/velocity factor/);
  });

  test('when the trace is long, then the plot is decimated to at most 4000 points and keeps the samples at the markers', async () => {
    const dtS = 0.1e-9;
    const csv = traceCsv(
      synthesiseTrace({ samples: 200_000, dtS, incidentS: 2000e-9, roundTripS: 1234.5e-9, rho: -1, riseS: 20e-9, noiseV: 0.01, seed: 3 }),
    );
    const res = await analyse(csv, '?velocityFactor=0.7', 'application/octet-stream');
    expect(res.status).toBe(200);
    expect(Math.abs(res.body.roundTripNs - 1234.5)).toBeLessThanOrEqual(dtS * 1e9);
    expect(res.body.polarity).toBe('short');
    const plot = res.body.plot as { timeS: number[]; volts: number[] };
    expect(plot.timeS.length).toBeLessThanOrEqual(4000);
    expect(plot.timeS.length).toBeGreaterThan(3000);
    expect(plot.volts).toHaveLength(plot.timeS.length);
    for (let i = 1; i < plot.timeS.length; i++) expect(plot.timeS[i]!).toBeGreaterThan(plot.timeS[i - 1]!);
    for (const marker of [res.body.markers.incident.timeS, res.body.markers.reflection.timeS]) {
      // Samples on both sides of the marker, one interval apart, survive the decimation.
      const after = plot.timeS.findIndex((x) => x > marker);
      expect(after).toBeGreaterThan(0);
      expect(plot.timeS[after]! - plot.timeS[after - 1]!).toBeCloseTo(dtS, 12);
    }
  });

  test('when the file is not a trace, then 422 with the parser’s message', async () => {
    const res = await analyse('name,strip\nfoo,1\nbar,2\n');
    expect(res.status).toBe(422);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(res.body.detail).toMatch(/No numeric rows found/);
  });

  test('when the velocity factor is out of range or not a number, then 422 names it', async () => {
    const csv = traceCsv(synthesiseTrace({ roundTripS: 80e-9 }));
    for (const q of ['?velocityFactor=1.5', '?velocityFactor=0.1', '?velocityFactor=abc', '?velocityFactor=']) {
      const res = await analyse(csv, q);
      expect(res.status, q).toBe(422);
      expect(res.body.errors.map((e: { path: string }) => e.path)).toContain('velocityFactor');
    }
  });

  test('the trace is read in the charset its Content-Type names (UTF-16 here); an unknown charset is 415', async () => {
    const csv = traceCsv(synthesiseTrace({ roundTripS: 80e-9, noiseV: 0.005 })).replace('Volts (V)', 'Spannung (V) – Kanal 1');
    const utf16 = await lee
      .post('/api/waveforms/analyse')
      .set('Content-Type', 'text/csv; charset=utf-16le')
      .send(Buffer.from(csv, 'utf16le'));
    expect(utf16.status).toBe(200);
    expect(Math.abs(utf16.body.roundTripNs - 80)).toBeLessThanOrEqual(1);
    const bogus = await lee.post('/api/waveforms/analyse').set('Content-Type', 'text/csv; charset=klingon-8').send(Buffer.from(csv));
    expect(bogus.status).toBe(415);
    expect(bogus.headers['content-type']).toMatch(/application\/problem\+json/);
  });

  test('when the body is JSON, then 415', async () => {
    const res = await lee.post('/api/waveforms/analyse').send({ timeS: [0, 1] });
    expect(res.status).toBe(415);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
  });

  test('when the body is over 64 MB, then 413', async () => {
    const line = '1.000000e-09,5.000000e-01\n';
    const big = line.repeat(Math.ceil((64 * 1024 * 1024 + 1) / line.length));
    const res = await analyse(big);
    expect(res.status).toBe(413);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
  });

  test('anonymous callers get 401', async () => {
    const res = await t.request
      .post('/api/waveforms/analyse')
      .set('Origin', ORIGIN)
      .set('Content-Type', 'text/csv')
      .send(traceCsv(synthesiseTrace({ roundTripS: 80e-9 })));
    expect(res.status).toBe(401);
  });
});
