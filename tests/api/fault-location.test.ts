import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { create, all } from 'mathjs';
import type { Agent } from 'supertest';
import { createTestApp, DEMO, ORIGIN, type TestApp } from '../setup/test-app';

// mathjs as the independent reference for the speed of light (CODATA, exact by SI definition).
const math = create(all);
const C = math.speedOfLight.toNumber('m/s');

let t: TestApp;
let sam: Agent;
beforeAll(async () => {
  t = await createTestApp();
  sam = await t.agentFor(DEMO.technician);
});
afterAll(() => t.close());

const locate = (body: unknown) => sam.post('/api/fault-location').send(body as object);

function expectProblem(
  res: { status: number; headers: Record<string, string>; body: { errors?: { path: string; message: string }[] } },
  path?: string,
) {
  expect(res.status).toBe(422);
  expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
  if (path !== undefined) expect(res.body.errors?.map((e) => e.path)).toContain(path);
}

describe('POST /api/fault-location', () => {
  test('tdr: d = VF·c·Δt/2 (formula: Ulaby, Fundamentals of Applied Electromagnetics, TDR section; the numbers are ours), with c from mathjs', async () => {
    const res = await locate({ method: 'tdr', roundTripNs: 100, velocityFactor: 0.66, riseTimeNs: 2, lengthM: 12 });
    expect(res.status).toBe(200);
    const expected = (0.66 * C * 100e-9) / 2;
    expect(res.body.method).toBe('tdr');
    expect(res.body.distanceM).toBeCloseTo(expected, 9);
    expect(res.body.fromOtherEndM).toBeCloseTo(12 - expected, 9);
    expect(res.body.velocityFactor).toBe(0.66);
    expect(res.body.uncertaintyM).toBeGreaterThan(0);
    expect(typeof res.body.explanation).toBe('string');
    expect(Object.keys(res.body).sort()).toEqual(['distanceM', 'explanation', 'fromOtherEndM', 'method', 'uncertaintyM', 'velocityFactor']);
  });

  test('tdr: VF 0.70 is 4.765 ns/m one way (Wikipedia, "Velocity factor"), so 95.3 ns there and back is 10 m', async () => {
    const res = await locate({ method: 'tdr', roundTripNs: 2 * 10 * 4.765, velocityFactor: 0.7 });
    expect(res.status).toBe(200);
    expect(res.body.distanceM).toBeCloseTo(10, 2);
    expect(res.body).not.toHaveProperty('fromOtherEndM');
  });

  test('vf-calibration: VF = 2L/(c·Δt); u_p = 2.0 × 10⁸ m/s (Ulaby problem 2.18, εr = 2.25) over 10 m is 100 ns', async () => {
    const res = await locate({ method: 'vf-calibration', roundTripNs: 100, lengthM: 10 });
    expect(res.status).toBe(200);
    expect(res.body.velocityFactor).toBeCloseTo(2.0e8 / C, 9);
    expect(res.body.velocityFactor).toBeCloseTo(0.667, 3);
    expect(res.body.distanceM).toBe(10);
  });

  test('loop-both-ends: L = 10 km, r = 11 Ω/km, R_A = 110 Ω, R_B = 160 Ω → x = 3.864 km, R_f = 25 Ω (an example of the form used in introductory physics texts, not any book’s own numbers (REFERENCES.md, loop both ends); the arithmetic is exact)', async () => {
    const res = await locate({ method: 'loop-both-ends', nearOhm: 110, farOhm: 160, lengthM: 10_000, ohmPerMetre: 0.011 });
    expect(res.status).toBe(200);
    expect(res.body.distanceM / 1000).toBeCloseTo(3.864, 3);
    expect(res.body.fromOtherEndM / 1000).toBeCloseTo(10 - 3.864, 3);
    expect(res.body.faultOhm).toBeCloseTo(25, 9);
  });

  test('loop-both-ends: the same example with r from a sound conductor reading end to end (110 Ω over 10 km)', async () => {
    const res = await locate({ method: 'loop-both-ends', nearOhm: 110, farOhm: 160, lengthM: 10_000, conductorOhm: 110 });
    expect(res.status).toBe(200);
    expect(res.body.distanceM / 1000).toBeCloseTo(3.864, 3);
    expect(res.body.faultOhm).toBeCloseTo(25, 9);
  });

  test('loop-one-end: d = (R_loop − R_f)/(2r); the same example from end A with its 25 Ω fault known gives 3.864 km again', async () => {
    const res = await locate({ method: 'loop-one-end', loopOhm: 110, faultOhm: 25, ohmPerMetre: 0.011, lengthM: 10_000 });
    expect(res.status).toBe(200);
    expect(res.body.distanceM / 1000).toBeCloseTo(3.864, 3);
    expect(res.body.faultOhm).toBe(25);
    expect(res.body.fromOtherEndM / 1000).toBeCloseTo(10 - 3.864, 3);
  });

  test('murray: x = 2L · a_faulted / (a_faulted + a_sound); 600 m cable, faulted arm : sound arm = 1 : 3 → x = 300 m (REFERENCES.md, Murray loop: worked example, no published source)', async () => {
    const res = await locate({ method: 'murray', lengthM: 600, faultedArm: 1, soundArm: 3 });
    expect(res.status).toBe(200);
    expect(res.body.distanceM).toBeCloseTo(300, 9);
    expect(res.body.fromOtherEndM).toBeCloseTo(300, 9);
    // The same balance read in ohms or in kilohms: only the ratio counts.
    const kilo = await locate({ method: 'murray', lengthM: 600, faultedArm: 1000, soundArm: 3000 });
    expect(kilo.body.distanceM).toBeCloseTo(300, 9);
    // Nearer the bridge: 1 : 5 → 2 · 600 · 1/6 = 200 m.
    expect((await locate({ method: 'murray', lengthM: 600, faultedArm: 1, soundArm: 5 })).body.distanceM).toBeCloseTo(200, 9);
  });

  test('murray: the old arm names are not accepted, so a body written for the old labels cannot be misread', async () => {
    const res = await locate({ method: 'murray', lengthM: 600, ratioP: 3, ratioQ: 1 });
    expectProblem(res, 'faultedArm');
    expect(res.body.errors.map((e: { path: string }) => e.path)).toContain('soundArm');
  });

  test('capacitance: x = L·C_x/C_sound, one end and both ends (standard method; no worked example confirmed, so plain arithmetic)', async () => {
    const one = await locate({ method: 'capacitance', lengthM: 12, faultedNf: 0.9, soundNf: 1.2 });
    expect(one.status).toBe(200);
    expect(one.body.distanceM).toBeCloseTo(9, 9);
    const both = await locate({ method: 'capacitance', lengthM: 12, faultedNf: 0.9, soundNf: 1.2, farFaultedNf: 0.3 });
    expect(both.status).toBe(200);
    expect(both.body.distanceM).toBeCloseTo(9, 9);
  });

  test('when a field is missing, then 422 names it', async () => {
    expectProblem(await locate({ method: 'murray', lengthM: 600, faultedArm: 1 }), 'soundArm');
    expectProblem(await locate({ method: 'loop-both-ends', nearOhm: 1, farOhm: 1, lengthM: 12 }), 'ohmPerMetre');
    expectProblem(await locate({}), 'method');
  });

  test('when the method is unknown, then 422 names method and lists the methods', async () => {
    const res = await locate({ method: 'dowsing', lengthM: 12 });
    expectProblem(res, 'method');
    expect(res.body.errors[0].message).toMatch(/tdr, vf-calibration, loop-one-end, loop-both-ends, murray, capacitance/);
  });

  test('when a number is negative or zero, then 422 names it', async () => {
    expectProblem(await locate({ method: 'murray', lengthM: 600, faultedArm: -1, soundArm: 3 }), 'faultedArm');
    expectProblem(await locate({ method: 'murray', lengthM: 0, faultedArm: 1, soundArm: 3 }), 'lengthM');
    expectProblem(await locate({ method: 'loop-one-end', loopOhm: -0.5, ohmPerMetre: 0.01 }), 'loopOhm');
  });

  test('when a number is sent as a string, then 422 names it', async () => {
    const res = await locate({ method: 'murray', lengthM: '600', faultedArm: 1, soundArm: 3 });
    expectProblem(res, 'lengthM');
    expect(res.body.errors[0].message).toMatch(/must be a number/);
  });

  test('when a field is not part of the method, then 422 says which', async () => {
    const res = await locate({ method: 'murray', lengthM: 600, faultedArm: 1, soundArm: 3, colour: 'red' });
    expectProblem(res);
    expect(res.body.errors[0].message).toMatch(/colour/);
  });

  test('when the readings put the fault outside the cable, then 422 names the field and nothing is clamped', async () => {
    // Murray with the faulted line's arm above the sound line's: x = 2 · 600 · 3/4 = 900 m on a 600 m cable.
    const murray = await locate({ method: 'murray', lengthM: 600, faultedArm: 3, soundArm: 1 });
    expectProblem(murray, 'faultedArm');
    expect(murray.body.detail).toMatch(/beyond the end/);
    // A TDR reflection from beyond a 12 m cable.
    expectProblem(await locate({ method: 'tdr', roundTripNs: 500, velocityFactor: 0.66, lengthM: 12 }), 'roundTripNs');
    // Both loop readings smaller than the conductors alone can be.
    expectProblem(await locate({ method: 'loop-both-ends', nearOhm: 0.1, farOhm: 0.1, lengthM: 12, ohmPerMetre: 0.0375 }), 'farOhm');
    // Faster than light.
    expectProblem(await locate({ method: 'vf-calibration', roundTripNs: 10, lengthM: 12 }), 'roundTripNs');
  });

  test('when a number is too large to be a real reading (it would overflow the distance), then 422 naming it', async () => {
    const res = await locate({ method: 'murray', lengthM: Number.MAX_VALUE, faultedArm: 1, soundArm: 1 });
    expectProblem(res, 'lengthM');
    expect(res.body.detail).toMatch(/too large/);
  });

  test('when no cable length is given and the result is longer than any cable the methods are for, then 422 naming the reading', async () => {
    // d = VF · c · Δt / 2 (formula: Ulaby, TDR section; the numbers are ours): 10⁹ ns at VF 0.66 is 98 932 km, with c from mathjs
    const res = await locate({ method: 'tdr', roundTripNs: 1e9, velocityFactor: 0.66 });
    expectProblem(res, 'roundTripNs');
    expect(res.body.detail).toMatch(/further than the longest cable these methods are meant for \(2 km\)/);
    const at = (metres: number) => ({ method: 'tdr', roundTripNs: ((2 * metres) / (0.66 * C)) * 1e9, velocityFactor: 0.66 });
    expect((await locate(at(1900))).body.distanceM).toBeCloseTo(1900, 6);
    expectProblem(await locate(at(3000)), 'roundTripNs');
    // The longest cable is the server's setting, FAULT_MAX_CABLE_LENGTH_M (default 2000 m).
    const longer = await createTestApp({ env: { FAULT_MAX_CABLE_LENGTH_M: '5000' } });
    try {
      const agent = await longer.agentFor(DEMO.technician);
      const res3km = await agent.post('/api/fault-location').send(at(3000));
      expect(res3km.status).toBe(200);
      expect(res3km.body.distanceM).toBeCloseTo(3000, 6);
    } finally {
      await longer.close();
    }
  });

  test('when the body is not JSON, then a problem, not a server error', async () => {
    const res = await sam.post('/api/fault-location').set('Content-Type', 'application/json').send('{"method": "murray",');
    expect(res.status).toBe(400);
    expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
  });

  test('any JSON body whatsoever is answered 200 or as problem+json, never 500', async () => {
    await fc.assert(
      fc.asyncProperty(fc.oneof(fc.anything(), fc.object()), async (value) => {
        const res = await sam
          .post('/api/fault-location')
          .set('Content-Type', 'application/json')
          .send(JSON.stringify(value) ?? '');
        expect(res.status).toBeLessThan(500);
        if (res.status !== 200) expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
      }),
      { numRuns: 150 },
    );
  });

  test('bodies of the right shape with extreme numbers get a finite answer or a 422, never 500', async () => {
    const number = fc.oneof(fc.double({ noNaN: true }), fc.constantFrom(0, 1e-300, 1e300, Number.MAX_VALUE, Number.MIN_VALUE));
    const method = fc.constantFrom('tdr', 'vf-calibration', 'loop-one-end', 'loop-both-ends', 'murray', 'capacitance');
    const fields = fc.record(
      {
        roundTripNs: number,
        velocityFactor: number,
        lengthM: number,
        loopOhm: number,
        ohmPerMetre: number,
        nearOhm: number,
        farOhm: number,
        faultedArm: number,
        soundArm: number,
        faultedNf: number,
        soundNf: number,
      },
      { requiredKeys: [] },
    );
    await fc.assert(
      fc.asyncProperty(method, fields, async (m, f) => {
        const res = await locate({ method: m, ...f });
        expect([200, 422]).toContain(res.status);
        if (res.status === 200) {
          for (const key of ['distanceM', 'uncertaintyM']) expect(Number.isFinite(res.body[key])).toBe(true);
        } else {
          expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
          expect(res.body.errors.length).toBeGreaterThan(0);
        }
      }),
      { numRuns: 200 },
    );
  });

  test('when the user works in feet, then the explanation gives the lengths in feet and the numbers stay in metres', async () => {
    const lee = await t.agentFor(DEMO.annexTechnician);
    expect((await lee.put('/api/auth/preferences').send({ unitSystem: 'imperial' })).body.user.unitSystem).toBe('imperial');
    const body = { method: 'loop-both-ends', nearOhm: 0.855, farOhm: 0.645, lengthM: 12, conductorOhm: 0.45 };
    const inFeet = await lee.post('/api/fault-location').send(body);
    const inMetres = await locate(body);
    expect(inFeet.status).toBe(200);
    expect(inFeet.body.distanceM).toBe(inMetres.body.distanceM);
    expect(inMetres.body.explanation).toContain('about 7.4 m from the near end (4.6 m from the far end), ±0.27 m');
    // mathjs unit conversion, 1 ft = 0.3048 m (NIST SP 811): 7.4 m is 24.28 ft, written to 0.1 ft.
    const ft = math.unit(inMetres.body.distanceM, 'm').toNumber('ft');
    expect(inFeet.body.explanation).toContain(`about ${ft.toFixed(1)} ft from the near end (15.1 ft from the far end), ±0.89 ft`);
    expect(inFeet.body.explanation).toContain('Ω/1000 ft per conductor (a sound conductor reads 0.45 Ω over 39.4 ft)');
    expect(inFeet.body.explanation).not.toMatch(/\d\s*k?m\b|Ω\/m\b|\bmetres?\b/);
    await lee.put('/api/auth/preferences').send({ unitSystem: 'metric' });
  });

  test('anonymous callers get 401', async () => {
    const res = await t.request
      .post('/api/fault-location')
      .set('Origin', ORIGIN)
      .send({ method: 'murray', lengthM: 600, faultedArm: 1, soundArm: 3 });
    expect(res.status).toBe(401);
  });

  test('every role may use it', async () => {
    for (const who of [DEMO.admin, DEMO.organiser, DEMO.director, DEMO.annexTechnician]) {
      const agent = await t.agentFor(who);
      expect((await agent.post('/api/fault-location').send({ method: 'murray', lengthM: 600, faultedArm: 1, soundArm: 3 })).status).toBe(
        200,
      );
    }
  });
});
