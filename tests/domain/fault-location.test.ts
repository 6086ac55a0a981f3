import { describe, test, expect } from 'vitest';
import fc from 'fast-check';
import { create, all, unit } from 'mathjs';
import {
  AWG_OHM_PER_1000FT,
  bandwidthHzForRiseTime,
  calibrateVelocityFactor,
  combineEstimates,
  COPPER_RESISTIVITY_OHM_M,
  DEFAULT_METER_ACCURACY,
  DEFAULT_MAX_CABLE_LENGTH_M,
  delayNsPerMetre,
  FaultLocationError,
  IEC_60228_OHM_PER_KM,
  loadImpedanceFromReflection,
  locateByCapacitance,
  locateByLoopBothEnds,
  locateByLoopOneEnd,
  locateByMurrayLoop,
  locateByTdr,
  meterUncertaintyOhm,
  ohmPerMetreFromConductorSize,
  ohmPerMetreFromReading,
  recordFlexTest,
  reflectionCoefficient,
  runFaultLocation,
  SPEED_OF_LIGHT_M_PER_S,
  tdrResolutionM,
  velocityFactorFromPermittivity,
  type FaultEstimate,
} from '../../shared/domain/fault-location';
import { faultLocationRequestSchema } from '../../shared/schemas/fault-location';

const math = create(all!);
// Independent reference for c, from mathjs's physical constants.
const C = math.speedOfLight.toNumber('m/s');
const FOOT_M = math.unit(1, 'ft').toNumber('m');

function refusal(fn: () => unknown): FaultLocationError {
  try {
    fn();
  } catch (error) {
    expect(error).toBeInstanceOf(FaultLocationError);
    return error as FaultLocationError;
  }
  throw new Error('expected a FaultLocationError');
}

describe('speed of light and TDR', () => {
  test('c = 299 792 458 m/s, the SI definition, as mathjs has it', () => {
    // SI definition
    expect(SPEED_OF_LIGHT_M_PER_S).toBe(299_792_458);
    expect(SPEED_OF_LIGHT_M_PER_S).toBe(C);
  });

  test('d = VF · c · Δt / 2', () => {
    // formula: Ulaby, Fundamentals of Applied Electromagnetics, TDR section (the numbers are ours, not the book's)
    const e = locateByTdr({ roundTripNs: 100, velocityFactor: 0.66 });
    expect(e.distanceM).toBeCloseTo((0.66 * C * 100e-9) / 2, 9); // 9.893 m
    expect(e.method).toBe('tdr');
    expect(e.velocityFactor).toBe(0.66);
    expect(e.inputs).toMatchObject({ roundTripNs: 100, velocityFactor: 0.66 });
  });

  test('VF = 1/√εr: εr = 2.25 → u_p = 2.0 × 10⁸ m/s (VF 0.667)', () => {
    // Ulaby problem 2.18 (the book's own numbers, as REFERENCES.md gives them)
    const vf = velocityFactorFromPermittivity(2.25);
    expect(vf).toBeCloseTo(0.667, 3);
    expect((vf * C) / 2.0e8).toBeCloseTo(1, 2);
  });

  test.each<[string, number, number]>([
    ['PTFE', 2.1, 0.69],
    ['polyethylene', 2.3, 0.659],
    ['polystyrene', 2.6, 0.62],
  ])('%s εr = %d → VF %d', (_name, er, vf) => {
    // Ellingson, Electromagnetics vol. 1 (Virginia Tech open textbook), appendix; values good to about 10 %
    expect(velocityFactorFromPermittivity(er)).toBeCloseTo(vf, 3);
  });

  test('VF 0.70 → 4.765 ns/m', () => {
    // Wikipedia, "Velocity factor"
    expect(delayNsPerMetre(0.7)).toBeCloseTo(4.765, 3);
  });

  test('reflection coefficient: Z_L = 2Z_0 → +1/3, Z_0/2 → −1/3, open +1, short −1', () => {
    // standard transmission-line theory
    expect(reflectionCoefficient(100, 50)).toBeCloseTo(1 / 3, 12);
    expect(reflectionCoefficient(25, 50)).toBeCloseTo(-1 / 3, 12);
    expect(reflectionCoefficient(Infinity, 50)).toBe(1);
    expect(reflectionCoefficient(0, 50)).toBe(-1);
    expect(loadImpedanceFromReflection(1 / 3, 50)).toBeCloseTo(100, 9);
    expect(loadImpedanceFromReflection(-1 / 3, 50)).toBeCloseTo(25, 9);
    expect(loadImpedanceFromReflection(1, 50)).toBe(Infinity);
  });

  test('BW ≈ 0.35 / t_r: 1 ns → 350 MHz', () => {
    // standard rule; 0.35 = ln 9 / 2π
    expect(bandwidthHzForRiseTime(1e-9)).toBeCloseTo(350e6, 0);
    expect(Math.log(9) / (2 * Math.PI)).toBeCloseTo(0.35, 2);
  });

  test('a 6 ns rise needs about 58 MHz and resolves about 0.9 m before VF', () => {
    // common practice (no published source)
    expect(bandwidthHzForRiseTime(6e-9) / 1e6).toBeCloseTo(58, 0);
    expect(tdrResolutionM(6)).toBeCloseTo(0.9, 1);
  });

  test('uncertainty: half the rise-time resolution and the VF band, root-sum-square', () => {
    const e = locateByTdr({ roundTripNs: 200, velocityFactor: 0.6, riseTimeNs: 6, velocityFactorUncertainty: 0.02 });
    const d = (0.6 * C * 200e-9) / 2;
    const timing = (0.6 * C * 6e-9) / 2 / 2;
    const vfPart = (d * 0.02) / 0.6;
    expect(e.uncertaintyM).toBeCloseTo(Math.hypot(timing, vfPart), 9);
  });

  test('default VF uncertainty is ±3 % of VF (common practice, uncalibrated)', () => {
    // common practice (no published source)
    const e = locateByTdr({ roundTripNs: 200, velocityFactor: 0.6 });
    expect(e.uncertaintyM).toBeCloseTo(e.distanceM * 0.03, 9);
  });

  test('with a length, distance from the far end too, in plain words', () => {
    const e = locateByTdr({ roundTripNs: 100, velocityFactor: 0.66, riseTimeNs: 2, lengthM: 20 });
    expect(e.fromOtherEndM).toBeCloseTo(20 - (0.66 * C * 100e-9) / 2, 9);
    expect(e.explanation).toMatch(/about 9\.89 m from the instrument end \(10\.1 m from the far end\), ±/);
  });

  test('property: a fault at x gives Δt = 2x / (VF c), from which x comes back', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.05, max: 500, noNaN: true }), fc.double({ min: 0.3, max: 1, noNaN: true }), (x, vf) => {
        const roundTripNs = ((2 * x) / (vf * C)) * 1e9;
        expect(locateByTdr({ roundTripNs, velocityFactor: vf, lengthM: 500 }).distanceM).toBeCloseTo(x, 6);
      }),
    );
  });

  test('property: distance grows with the round trip', () => {
    fc.assert(
      fc.property(fc.integer({ min: 100, max: 100_000 }), fc.integer({ min: 100, max: 100_000 }), (a, b) => {
        fc.pre(a !== b);
        const [lo, hi] = a < b ? [a / 100, b / 100] : [b / 100, a / 100];
        expect(locateByTdr({ roundTripNs: lo, velocityFactor: 0.6 }).distanceM).toBeLessThan(
          locateByTdr({ roundTripNs: hi, velocityFactor: 0.6 }).distanceM,
        );
      }),
    );
  });

  test('property: a reflection beyond the cable (past its band) is refused, never clamped', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 100, noNaN: true }), fc.double({ min: 1.1, max: 5, noNaN: true }), (lengthM, factor) => {
        const roundTripNs = ((2 * lengthM * factor) / (0.66 * C)) * 1e9;
        const error = refusal(() => locateByTdr({ roundTripNs, velocityFactor: 0.66, velocityFactorUncertainty: 0.01, lengthM }));
        expect(error.field).toBe('roundTripNs');
        expect(error.message).toMatch(/beyond the end/);
      }),
    );
  });

  test('a reflection just past the far end, within the band, is accepted and said to be at the far end', () => {
    const lengthM = 20;
    const roundTripNs = ((2 * 20.2) / (0.66 * C)) * 1e9;
    const e = locateByTdr({ roundTripNs, velocityFactor: 0.66, lengthM });
    expect(e.distanceM).toBeCloseTo(20.2, 6); // not clamped
    expect(e.explanation).toMatch(/far-end connector/);
  });

  test.each<[object, string]>([
    [{ roundTripNs: 0, velocityFactor: 0.6 }, 'roundTripNs'],
    [{ roundTripNs: -5, velocityFactor: 0.6 }, 'roundTripNs'],
    [{ roundTripNs: Number.NaN, velocityFactor: 0.6 }, 'roundTripNs'],
    [{ roundTripNs: 50, velocityFactor: 1.2 }, 'velocityFactor'],
    [{ roundTripNs: 50, velocityFactor: 0.1 }, 'velocityFactor'],
    [{ roundTripNs: 50, velocityFactor: 0.6, riseTimeNs: -1 }, 'riseTimeNs'],
    [{ roundTripNs: 50, velocityFactor: 0.6, lengthM: 0 }, 'lengthM'],
  ])('refuses %o (field %s)', (input, field) => {
    expect(refusal(() => locateByTdr(input as never)).field).toBe(field);
  });
});

describe('velocity factor calibration', () => {
  test('VF = 2L / (c · Δt)', () => {
    const cal = calibrateVelocityFactor({ roundTripNs: 200, lengthM: 20 });
    expect(cal.velocityFactor).toBeCloseTo((2 * 20) / (C * 200e-9), 12); // 0.667
    expect(cal.delayNsPerMetre).toBeCloseTo(1e9 / (cal.velocityFactor * C), 9);
  });

  test('ordinary PVC multi-core cable calibrates around 0.5–0.6', () => {
    // common practice (no published source): PVC multi-core VF ≈ 0.5–0.6, solid-PTFE coax ≈ 0.70
    const pvc = calibrateVelocityFactor({ roundTripNs: ((2 * 12) / (0.55 * C)) * 1e9, lengthM: 12 });
    expect(pvc.velocityFactor).toBeCloseTo(0.55, 9);
  });

  test('property: a cable of VF v and length L returns v', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.3, max: 1, noNaN: true }), fc.double({ min: 1, max: 1000, noNaN: true }), (vf, lengthM) => {
        const roundTripNs = ((2 * lengthM) / (vf * C)) * 1e9;
        expect(calibrateVelocityFactor({ roundTripNs, lengthM }).velocityFactor).toBeCloseTo(vf, 9);
      }),
    );
  });

  test('VF above 1 or below 0.3 is refused', () => {
    expect(refusal(() => calibrateVelocityFactor({ roundTripNs: 50, lengthM: 20 })).message).toMatch(/> 1/);
    expect(refusal(() => calibrateVelocityFactor({ roundTripNs: 1000, lengthM: 20 })).message).toMatch(/slower than any/);
  });

  test('calibration uncertainty is at least ±1 % of VF (common practice)', () => {
    // common practice (no published source)
    const cal = calibrateVelocityFactor({ roundTripNs: 200, lengthM: 20 });
    expect(cal.velocityFactorUncertainty).toBeCloseTo(cal.velocityFactor * 0.01, 12);
    const slow = calibrateVelocityFactor({ roundTripNs: 200, lengthM: 20, riseTimeNs: 10 });
    expect(slow.velocityFactorUncertainty).toBeCloseTo(slow.velocityFactor * (5 / 200), 12);
  });
});

describe('loop resistance from one end', () => {
  test('d = (R_loop − R_f) / (2r)', () => {
    const e = locateByLoopOneEnd({ loopOhm: 1.63, ohmPerMetre: 0.11, lengthM: 12 });
    expect(e.distanceM).toBeCloseTo(1.63 / 0.22, 12);
    expect(e.fromOtherEndM).toBeCloseTo(12 - 1.63 / 0.22, 12);
    expect(e.explanation).toMatch(/The short is about 7\.41 m from the near end \(4\.59 m from the far end\), ±/i);
    expect(e.explanation).toMatch(/negligible resistance/);
  });

  test('r from a sound conductor reading: conductorOhm / lengthM', () => {
    const e = locateByLoopOneEnd({ loopOhm: 2, conductorOhm: 1.2, lengthM: 12, faultOhm: 0.4 });
    expect(e.distanceM).toBeCloseTo((2 - 0.4) / (2 * 0.1), 12);
    expect(e.faultOhm).toBe(0.4);
  });

  test('meter accuracy ±(1 % + 2 digits) at 0.01 Ω propagates into the band (common practice, from memory)', () => {
    // common practice, from memory (no published source; a meter's data sheet gives its own)
    expect(DEFAULT_METER_ACCURACY).toEqual({ percentOfReading: 1, digits: 2, resolutionOhm: 0.01 });
    expect(meterUncertaintyOhm(1.63)).toBeCloseTo(0.0163 + 0.02, 12);
    // r from a sound conductor (1.2 Ω ± meter) and R_loop (2 Ω ± meter)
    const e = locateByLoopOneEnd({ loopOhm: 2, conductorOhm: 1.2, lengthM: 12 });
    const r = 0.1;
    const d = 2 / (2 * r);
    const sLoop = (0.02 + 0.02) / (2 * r);
    const sR = d * ((0.012 + 0.02) / 1.2);
    expect(e.uncertaintyM).toBeCloseTo(Math.hypot(sLoop, sR), 9);
  });

  test('a worse meter gives a wider band', () => {
    const good = locateByLoopOneEnd({ loopOhm: 2, conductorOhm: 1.2, lengthM: 12 });
    const poor = locateByLoopOneEnd({
      loopOhm: 2,
      conductorOhm: 1.2,
      lengthM: 12,
      meterAccuracy: { percentOfReading: 2, digits: 5, resolutionOhm: 0.1 },
    });
    expect(poor.uncertaintyM).toBeGreaterThan(good.uncertaintyM);
  });

  test('property: a short at x with resistance R_f is found at x when R_f is known', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 50, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0.005, max: 0.1, noNaN: true }),
        fc.double({ min: 0, max: 2, noNaN: true }),
        (lengthM, fraction, r, faultOhm) => {
          const x = lengthM * fraction;
          const loopOhm = 2 * r * x + faultOhm;
          const e = locateByLoopOneEnd({ loopOhm, ohmPerMetre: r, lengthM, faultOhm });
          expect(e.distanceM).toBeCloseTo(x, 6);
        },
      ),
    );
  });

  test('property: monotone in the loop reading', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 5000 }), fc.integer({ min: 0, max: 5000 }), (a, b) => {
        fc.pre(a !== b);
        const [lo, hi] = a < b ? [a / 1000, b / 1000] : [b / 1000, a / 1000];
        expect(locateByLoopOneEnd({ loopOhm: lo, ohmPerMetre: 0.1 }).distanceM).toBeLessThan(
          locateByLoopOneEnd({ loopOhm: hi, ohmPerMetre: 0.1 }).distanceM,
        );
      }),
    );
  });

  test('property: a loop larger than the whole cable allows is refused', () => {
    fc.assert(
      fc.property(fc.double({ min: 5, max: 50, noNaN: true }), fc.double({ min: 1.3, max: 10, noNaN: true }), (lengthM, factor) => {
        const loopOhm = 2 * 0.1 * lengthM * factor;
        expect(refusal(() => locateByLoopOneEnd({ loopOhm, ohmPerMetre: 0.1, lengthM })).field).toBe('loopOhm');
      }),
    );
  });

  test.each<[object, string]>([
    [{ loopOhm: 1 }, 'ohmPerMetre'],
    [{ loopOhm: 1, ohmPerMetre: 0.1, conductorOhm: 1, lengthM: 10 }, 'ohmPerMetre'],
    [{ loopOhm: 1, conductorOhm: 1 }, 'lengthM'],
    [{ loopOhm: -1, ohmPerMetre: 0.1 }, 'loopOhm'],
    [{ loopOhm: 1, ohmPerMetre: 0 }, 'ohmPerMetre'],
    [{ loopOhm: 1, ohmPerMetre: 0.1, faultOhm: 3 }, 'faultOhm'],
  ])('refuses %o (field %s)', (input, field) => {
    expect(refusal(() => locateByLoopOneEnd(input as never)).field).toBe(field);
  });
});

describe('loop resistance from both ends', () => {
  test('L = 10 km, r = 11 Ω/km, R_A = 110 Ω, R_B = 160 Ω → x = 3.864 km, R_f = 25 Ω', () => {
    // an example of the form used in introductory physics texts, not any book’s own numbers (REFERENCES.md, "loop, both ends"); the arithmetic is exact
    const e = locateByLoopBothEnds({ nearOhm: 110, farOhm: 160, lengthM: 10_000, ohmPerMetre: 0.011 });
    expect(e.distanceM / 1000).toBeCloseTo(3.864, 3);
    expect(e.faultOhm).toBeCloseTo(25, 9);
    expect(e.fromOtherEndM! / 1000).toBeCloseTo(6.136, 3);
    expect(e.explanation).toMatch(/3\.864 km from the near end/);
  });

  test('the same with r from a sound conductor: 110 Ω over 10 km', () => {
    // an example of the form used in introductory physics texts, not any book’s own numbers (REFERENCES.md, "loop, both ends"); the arithmetic is exact
    const e = locateByLoopBothEnds({ nearOhm: 110, farOhm: 160, lengthM: 10_000, conductorOhm: 110 });
    expect(e.distanceM / 1000).toBeCloseTo(3.864, 3);
    expect(e.faultOhm).toBeCloseTo(25, 9);
  });

  test('property: a short at x of any resistance is found at x, and its resistance recovered', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 100, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0.005, max: 0.1, noNaN: true }),
        fc.double({ min: 0, max: 50, noNaN: true }),
        (lengthM, fraction, r, faultOhm) => {
          const x = lengthM * fraction;
          const nearOhm = 2 * r * x + faultOhm;
          const farOhm = 2 * r * (lengthM - x) + faultOhm;
          const e = locateByLoopBothEnds({ nearOhm, farOhm, lengthM, ohmPerMetre: r });
          expect(e.distanceM).toBeCloseTo(x, 6);
          expect(e.faultOhm!).toBeCloseTo(faultOhm, 6);
          expect(e.distanceM + e.fromOtherEndM!).toBeCloseTo(lengthM, 9);
        },
      ),
    );
  });

  test('property: x grows with R_A − R_B', () => {
    fc.assert(
      // Readings in steps of 0.001 Ω, as a meter shows them.
      fc.property(fc.integer({ min: -1900, max: 1900 }), fc.integer({ min: -1900, max: 1900 }), (a, b) => {
        fc.pre(a !== b);
        const [lo, hi] = a < b ? [a, b] : [b, a];
        const at = (milliOhm: number) =>
          locateByLoopBothEnds({ nearOhm: 3 + milliOhm / 1000, farOhm: 3, lengthM: 10, ohmPerMetre: 0.1 }).distanceM;
        expect(at(lo)).toBeLessThan(at(hi));
      }),
    );
  });

  test('readings adding to less than the cable’s own loop are refused as inconsistent', () => {
    // 2 r L = 2 Ω here; 0.6 + 0.6 = 1.2 Ω cannot be
    const error = refusal(() => locateByLoopBothEnds({ nearOhm: 0.6, farOhm: 0.6, lengthM: 10, ohmPerMetre: 0.1 }));
    expect(error.field).toBe('farOhm');
    expect(error.message).toMatch(/inconsistent/);
  });

  test('a small negative fault resistance within the meter band is a dead short', () => {
    const e = locateByLoopBothEnds({ nearOhm: 0.99, farOhm: 0.99, lengthM: 10, ohmPerMetre: 0.1 });
    expect(e.faultOhm!).toBeCloseTo(-0.01, 9);
    expect(e.explanation).toMatch(/dead short/);
  });

  test('a distance outside the cable is refused', () => {
    // near 5 Ω, far 0.2 Ω on a 10 m, 0.1 Ω/m cable → x = (5 − 0.2 + 2) / 0.4 = 17 m
    expect(refusal(() => locateByLoopBothEnds({ nearOhm: 5, farOhm: 0.2, lengthM: 10, ohmPerMetre: 0.1 })).field).toBe('nearOhm');
  });
});

describe('Murray loop', () => {
  /**
   * The bridge as a circuit, solved by mathjs (lusolve) from Kirchhoff's current law alone: supply
   * V between the arms' junction and earth, arm `faultedArm` to the faulted conductor's near end
   * (a), arm `soundArm` to the sound conductor's near end (b), the conductors r Ω/m joined at the
   * far end, the fault R_f from x metres along the faulted conductor to earth. Returns V_a − V_b,
   * what the detector between the two conductors reads.
   */
  function detectorVolts(p: {
    lengthM: number;
    xM: number;
    ohmPerMetre: number;
    faultOhm: number;
    faultedArm: number;
    soundArm: number;
  }): number {
    const V = 10;
    const near = p.ohmPerMetre * p.xM; // a → fault
    const beyond = p.ohmPerMetre * (2 * p.lengthM - p.xM); // fault → far end → back along the sound conductor to b
    const g = (ohm: number) => 1 / ohm;
    // Unknowns [V_a, V_b, V_F]; rows: current out of a, b and F is 0.
    const A = [
      [g(p.faultedArm) + g(near), 0, -g(near)],
      [0, g(p.soundArm) + g(beyond), -g(beyond)],
      [-g(near), -g(beyond), g(near) + g(beyond) + g(p.faultOhm)],
    ];
    const b = [[V * g(p.faultedArm)], [V * g(p.soundArm)], [0]];
    const [va, vb] = (math.lusolve(A, b) as number[][]).map((row) => row[0]!);
    return va! - vb!;
  }

  /** Turns the faulted line's arm until the detector reads 0 (bisection on the circuit above). */
  function balance(p: { lengthM: number; xM: number; ohmPerMetre: number; faultOhm: number; soundArm: number }): number {
    let lo = 1e-6 * p.soundArm;
    let hi = p.soundArm;
    const sign = (arm: number) => Math.sign(detectorVolts({ ...p, faultedArm: arm }));
    for (let i = 0; i < 80; i++) {
      const mid = (lo + hi) / 2;
      if (sign(mid) === sign(lo)) lo = mid;
      else hi = mid;
    }
    return (lo + hi) / 2;
  }

  test('600 m cable, faulted arm : sound arm = 1 : 3 → x = 300 m; 3 : 1 would put it beyond the far end', () => {
    // REFERENCES.md, Murray loop: worked example, no published source (600 m, a_faulted : a_sound = 1 : 3 → X = 300 m)
    const e = locateByMurrayLoop({ lengthM: 600, faultedArm: 1, soundArm: 3 });
    expect(e.distanceM).toBeCloseTo(300, 9);
    expect(e.fromOtherEndM).toBeCloseTo(300, 9);
    expect(e.explanation).toMatch(/1 on the faulted line’s arm and 3 on the sound line’s arm/);
    const beyond = refusal(() => locateByMurrayLoop({ lengthM: 600, faultedArm: 3, soundArm: 1 }));
    expect(beyond.field).toBe('faultedArm');
    expect(beyond.message).toMatch(/beyond the end/);
  });

  test('the bridge balanced by Kirchhoff’s laws on a fault at 37 m of a 100 m cable is read back at 37 m, whatever the fault’s resistance', () => {
    // Kirchhoff's current law, solved by mathjs: an independent check of the balance condition
    for (const faultOhm of [0.5, 50, 5000]) {
      const faultedArm = balance({ lengthM: 100, xM: 37, ohmPerMetre: 0.0195, faultOhm, soundArm: 1000 });
      expect(faultedArm / 1000).toBeCloseTo(37 / (200 - 37), 9);
      expect(locateByMurrayLoop({ lengthM: 100, faultedArm, soundArm: 1000 }).distanceM).toBeCloseTo(37, 6);
    }
  });

  test('property: a bridge balanced by Kirchhoff’s laws on a fault at x gives x back', () => {
    // Kirchhoff's current law, solved by mathjs
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 1000, noNaN: true }),
        fc.double({ min: 0.01, max: 0.99, noNaN: true }),
        fc.double({ min: 0.005, max: 0.1, noNaN: true }),
        fc.double({ min: 0.1, max: 1e4, noNaN: true }),
        (lengthM, fraction, ohmPerMetre, faultOhm) => {
          const xM = lengthM * fraction;
          const faultedArm = balance({ lengthM, xM, ohmPerMetre, faultOhm, soundArm: 1000 });
          expect(locateByMurrayLoop({ lengthM, faultedArm, soundArm: 1000 }).distanceM).toBeCloseTo(xM, 4);
        },
      ),
      { numRuns: 40 },
    );
  });

  test('property: only the ratio of the arms counts, and the fault moves away as the faulted line’s arm grows', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 1000 }),
        fc.integer({ min: 1, max: 1000 }),
        fc.double({ min: 0.001, max: 1000, noNaN: true }),
        (a, b, scale) => {
          fc.pre(a !== b);
          const [lo, hi] = a < b ? [a, b] : [b, a];
          const at = (faultedArm: number) => locateByMurrayLoop({ lengthM: 100, faultedArm, soundArm: 1000 }).distanceM;
          expect(at(lo)).toBeLessThan(at(hi));
          expect(locateByMurrayLoop({ lengthM: 100, faultedArm: lo * scale, soundArm: 1000 * scale }).distanceM).toBeCloseTo(at(lo), 9);
        },
      ),
    );
  });

  test('equal arms put the fault at the far end; the faulted line’s arm clearly above the sound line’s is refused naming faultedArm', () => {
    expect(locateByMurrayLoop({ lengthM: 600, faultedArm: 1, soundArm: 1 }).distanceM).toBeCloseTo(600, 9);
    const error = refusal(() => locateByMurrayLoop({ lengthM: 600, faultedArm: 1.1, soundArm: 1 }));
    expect(error.field).toBe('faultedArm');
    expect(error.message).toMatch(/faulted line is on the faulted arm/);
  });
});

describe('capacitance ratio', () => {
  test('x = L · C_x / C_sound', () => {
    // standard method; no worked example confirmed — arithmetic from the formula
    const e = locateByCapacitance({ lengthM: 20, faultedNf: 0.62, soundNf: 1.24 });
    expect(e.distanceM).toBeCloseTo(10, 12);
    expect(e.uncertaintyM).toBeCloseTo(10 * Math.SQRT2 * 0.03, 12);
  });

  test('property: an open at x on a cable of uniform capacitance per metre is found at x (one end and both ends)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 100, noNaN: true }),
        fc.double({ min: 0.01, max: 0.99, noNaN: true }),
        fc.double({ min: 0.02, max: 0.2, noNaN: true }),
        (lengthM, fraction, nfPerMetre) => {
          const x = lengthM * fraction;
          const faultedNf = nfPerMetre * x;
          const farFaultedNf = nfPerMetre * (lengthM - x);
          const soundNf = nfPerMetre * lengthM;
          expect(locateByCapacitance({ lengthM, faultedNf, soundNf }).distanceM).toBeCloseTo(x, 6);
          expect(locateByCapacitance({ lengthM, faultedNf, soundNf, farFaultedNf }).distanceM).toBeCloseTo(x, 6);
        },
      ),
    );
  });

  test('both ends: C1 + C2 against C_sound widens the band and is explained', () => {
    const consistent = locateByCapacitance({ lengthM: 20, faultedNf: 0.5, soundNf: 1.2, farFaultedNf: 0.7 });
    const off = locateByCapacitance({ lengthM: 20, faultedNf: 0.5, soundNf: 1.5, farFaultedNf: 0.7 });
    expect(consistent.distanceM).toBeCloseTo((20 * 0.5) / 1.2, 12);
    expect(off.distanceM).toBeCloseTo((20 * 0.5) / 1.2, 12);
    expect(off.uncertaintyM).toBeGreaterThan(consistent.uncertaintyM);
    expect(consistent.explanation).toMatch(/consistent/);
    expect(off.explanation).toMatch(/20 % less than the sound conductor/);
  });

  test('readings that cannot be one break are refused', () => {
    expect(refusal(() => locateByCapacitance({ lengthM: 20, faultedNf: 0.5, soundNf: 4, farFaultedNf: 0.5 })).field).toBe('farFaultedNf');
    expect(refusal(() => locateByCapacitance({ lengthM: 20, faultedNf: 2, soundNf: 1.2 })).field).toBe('faultedNf');
  });
});

describe('flex test', () => {
  test('records the position with a default ±0.1 m (common practice)', () => {
    // common practice (no published source)
    const e = recordFlexTest({ distanceM: 3.2, lengthM: 12 });
    expect(e).toMatchObject({ method: 'flex', distanceM: 3.2, uncertaintyM: 0.1 });
    expect(e.fromOtherEndM).toBeCloseTo(8.8, 12);
  });

  test('beyond the cable is refused', () => {
    expect(refusal(() => recordFlexTest({ distanceM: 13, lengthM: 12 })).field).toBe('distanceM');
    expect(refusal(() => recordFlexTest({ distanceM: -1 })).field).toBe('distanceM');
  });
});

describe('results with no cable length to check them against', () => {
  test('a TDR round trip of 10⁹ ns with no length (98 932 km at VF 0.66) is refused naming roundTripNs; with the length given, the length decides', () => {
    // d = VF · c · Δt / 2 (formula: Ulaby, TDR section; the numbers are ours): 0.66 · c · 1 s / 2 = 98 932 km, with c from mathjs
    expect(Math.round((0.66 * C * 1) / 2 / 1000)).toBe(98_932);
    const error = refusal(() => locateByTdr({ roundTripNs: 1e9, velocityFactor: 0.66 }));
    expect(error.field).toBe('roundTripNs');
    expect(error.message).toMatch(
      /^These readings put the fault 98931.511 km away, further than the longest cable these methods are meant for \(2 km\)/,
    );
    expect(error.message).toMatch(/give the cable length/);
    expect(refusal(() => locateByTdr({ roundTripNs: 1e9, velocityFactor: 0.66, lengthM: 12 })).message).toMatch(
      /beyond the end of this 12 m cable/,
    );
  });

  test('the longest cable is a setting: 2 km by default (common practice), another value when given', () => {
    // common practice (no published source): floor cables, reels and pistes are tens of metres
    expect(DEFAULT_MAX_CABLE_LENGTH_M).toBe(2000);
    const roundTripNs = ((2 * 3000) / (0.66 * C)) * 1e9; // 3 km there and back
    expect(refusal(() => locateByTdr({ roundTripNs, velocityFactor: 0.66 })).field).toBe('roundTripNs');
    expect(locateByTdr({ roundTripNs, velocityFactor: 0.66 }, 'metric', { maxCableLengthM: 5000 }).distanceM).toBeCloseTo(3000, 6);
  });

  test('loop from one end and the flex test are held to it as well, in the reader’s units', () => {
    expect(refusal(() => locateByLoopOneEnd({ loopOhm: 500, ohmPerMetre: 0.0375 })).field).toBe('loopOhm'); // 6.67 km
    expect(locateByLoopOneEnd({ loopOhm: 50, ohmPerMetre: 0.0375 }).distanceM).toBeCloseTo(50 / 0.075, 9); // 667 m
    expect(refusal(() => recordFlexTest({ distanceM: 2500 })).field).toBe('distanceM');
    expect(refusal(() => locateByLoopOneEnd({ loopOhm: 500, ohmPerMetre: 0.0375 }, 'imperial')).message).toMatch(/\(6562 ft\)/);
    expect(runFaultLocation(faultLocationRequestSchema.parse({ method: 'flex', distanceM: 1500 })).distanceM).toBe(1500);
  });
});

describe('combineEstimates', () => {
  const est = (distanceM: number, uncertaintyM: number, method = 'x'): FaultEstimate => ({
    method,
    distanceM,
    uncertaintyM,
    explanation: '',
    inputs: {},
  });

  test('inverse-variance weighting: 10 ± 1 and 12 ± 2 → 10.4 ± 0.894', () => {
    const c = combineEstimates([est(10, 1), est(12, 2)]);
    expect(c.distanceM).toBeCloseTo((10 / 1 + 12 / 4) / (1 + 1 / 4), 12);
    expect(c.uncertaintyM).toBeCloseTo(1 / Math.sqrt(1.25), 12);
    expect(c.agree).toBe(true);
    expect(c.disagreements).toEqual([]);
  });

  test('bands that do not overlap disagree, are named, and widen the band', () => {
    const c = combineEstimates([est(7.4, 0.3, 'tdr'), est(7.6, 0.3, 'loop-both-ends'), est(9.9, 0.5, 'capacitance')]);
    expect(c.agree).toBe(false);
    expect(c.disagreements).toEqual([
      [0, 2],
      [1, 2],
    ]);
    const w = [1 / 0.09, 1 / 0.09, 1 / 0.25];
    expect(c.uncertaintyM).toBeGreaterThan(1 / Math.sqrt(w[0]! + w[1]! + w[2]!));
    expect(c.explanation).toMatch(/disagree/);
    expect(c.explanation).toMatch(/capacitance/);
  });

  test('property: the combined distance lies between the smallest and the largest estimate', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ d: fc.double({ min: 0, max: 100, noNaN: true }), u: fc.double({ min: 0.01, max: 10, noNaN: true }) }), {
          minLength: 1,
          maxLength: 6,
        }),
        (items) => {
          const c = combineEstimates(items.map(({ d, u }) => est(d, u)));
          const ds = items.map((i) => i.d);
          expect(c.distanceM).toBeGreaterThanOrEqual(Math.min(...ds) - 1e-9);
          expect(c.distanceM).toBeLessThanOrEqual(Math.max(...ds) + 1e-9);
          // Agreeing estimates can only narrow the band below the best one's.
          if (c.agree) expect(c.uncertaintyM).toBeLessThanOrEqual(Math.min(...items.map((i) => i.u)) + 1e-12);
          else expect(c.disagreements.length).toBeGreaterThan(0);
        },
      ),
    );
  });

  test('refuses an empty list and a zero band', () => {
    expect(refusal(() => combineEstimates([])).field).toBe('estimates');
    expect(refusal(() => combineEstimates([est(1, 0)])).field).toBe('estimates.0.uncertaintyM');
  });
});

describe('conductor tables', () => {
  test('IEC 60228 maximum DC resistance at 20 °C, Ω/km', () => {
    // IEC 60228
    expect(IEC_60228_OHM_PER_KM).toEqual([
      { mm2: 0.5, 'class-5-6-plain': 39.0, 'class-5-6-tinned': 40.1, 'class-1-2-plain': 36.0 },
      { mm2: 0.75, 'class-5-6-plain': 26.0, 'class-5-6-tinned': 26.7, 'class-1-2-plain': 24.5 },
      { mm2: 1.0, 'class-5-6-plain': 19.5, 'class-5-6-tinned': 20.0, 'class-1-2-plain': 18.1 },
      { mm2: 1.5, 'class-5-6-plain': 13.3, 'class-5-6-tinned': 13.7, 'class-1-2-plain': 12.1 },
      { mm2: 2.5, 'class-5-6-plain': 7.98, 'class-5-6-tinned': 8.21, 'class-1-2-plain': 7.41 },
    ]);
  });

  test.each<[number, string, number]>([
    [0.5, 'class-5-6-plain', 0.039],
    [0.75, 'class-5-6-tinned', 0.0267],
    [1.5, 'class-1-2-plain', 0.0121],
  ])('%d mm² %s → %d Ω/m', (mm2, construction, ohmPerMetre) => {
    // IEC 60228
    expect(ohmPerMetreFromConductorSize({ mm2, construction: construction as never })).toBeCloseTo(ohmPerMetre, 12);
  });

  test('flexible plain copper is the default construction', () => {
    // IEC 60228
    expect(ohmPerMetreFromConductorSize({ mm2: 1 })).toBeCloseTo(0.0195, 12);
  });

  test('AWG solid copper at 20 °C, Ω per 1000 ft', () => {
    // HyperPhysics (after Floyd)
    expect(AWG_OHM_PER_1000FT).toEqual({ 18: 6.385, 20: 10.15, 22: 16.14, 24: 25.67, 26: 40.81, 28: 64.9 });
  });

  test.each<[18 | 20 | 22 | 24 | 26 | 28, number]>([
    [18, 20.95],
    [20, 33.3],
    [22, 52.95],
    [24, 84.22],
    [26, 133.9],
    [28, 212.9],
  ])('AWG %d → %d Ω/km (÷ 0.3048, foot from mathjs)', (awg, ohmPerKm) => {
    // HyperPhysics (after Floyd)
    expect(AWG_OHM_PER_1000FT[awg] / FOOT_M).toBeCloseTo(ohmPerKm, 0);
    expect(Math.abs(AWG_OHM_PER_1000FT[awg] / FOOT_M - ohmPerKm) / ohmPerKm).toBeLessThan(5e-4);
    expect(ohmPerMetreFromConductorSize({ awg }) * 1000).toBeCloseTo(AWG_OHM_PER_1000FT[awg] / FOOT_M, 9);
  });

  test('100 % IACS: 58.0 MS/m → ρ = 1.7241 × 10⁻⁸ Ω·m; 1 mm² is then 17.24 Ω/km, under the IEC maxima', () => {
    // IACS definition
    expect(COPPER_RESISTIVITY_OHM_M).toBeCloseTo(1.7241e-8, 12);
    expect((COPPER_RESISTIVITY_OHM_M / 1e-6) * 1000).toBeLessThan(IEC_60228_OHM_PER_KM[2]!['class-1-2-plain']);
  });

  test('ohmPerMetreFromReading and refusals', () => {
    expect(ohmPerMetreFromReading(1.2, 12)).toBeCloseTo(0.1, 12);
    expect(refusal(() => ohmPerMetreFromReading(1, 0)).field).toBe('lengthM');
    expect(refusal(() => ohmPerMetreFromConductorSize({ mm2: 0.3 })).field).toBe('mm2');
    expect(refusal(() => ohmPerMetreFromConductorSize({ awg: 19 })).field).toBe('awg');
    expect(refusal(() => ohmPerMetreFromConductorSize({ mm2: 1, awg: 18 })).field).toBe('mm2');
    expect(refusal(() => ohmPerMetreFromConductorSize({})).field).toBe('mm2');
  });
});

describe('faultLocationRequestSchema and runFaultLocation', () => {
  test.each([
    { method: 'tdr', roundTripNs: 100, velocityFactor: 0.66 },
    { method: 'tdr', roundTripNs: 100, velocityFactor: 0.66, riseTimeNs: 2, lengthM: 20 },
    { method: 'vf-calibration', roundTripNs: 200, lengthM: 20 },
    { method: 'loop-one-end', loopOhm: 1.6, ohmPerMetre: 0.11 },
    { method: 'loop-one-end', loopOhm: 1.6, conductorOhm: 1.3, lengthM: 12, faultOhm: 0.1 },
    { method: 'loop-both-ends', nearOhm: 110, farOhm: 160, lengthM: 10000, ohmPerMetre: 0.011 },
    { method: 'loop-both-ends', nearOhm: 110, farOhm: 160, lengthM: 10000, conductorOhm: 110 },
    { method: 'murray', lengthM: 600, faultedArm: 1, soundArm: 3 },
    { method: 'capacitance', lengthM: 20, faultedNf: 0.6, soundNf: 1.2 },
    { method: 'capacitance', lengthM: 20, faultedNf: 0.6, soundNf: 1.2, farFaultedNf: 0.6 },
    { method: 'flex', distanceM: 3, lengthM: 12 },
  ])('accepts %o and answers without the inputs', (body) => {
    const request = faultLocationRequestSchema.parse(body);
    const answer = runFaultLocation(request);
    expect(answer.method).toBe(body.method);
    expect(Number.isFinite(answer.distanceM)).toBe(true);
    expect(answer.uncertaintyM).toBeGreaterThan(0);
    expect(answer.explanation.length).toBeGreaterThan(20);
    expect(answer).not.toHaveProperty('inputs');
  });

  test('loop-both-ends via the API: 3.864 km, 25 Ω', () => {
    // an example of the form used in introductory physics texts, not any book’s own numbers (REFERENCES.md, "loop, both ends"); the arithmetic is exact
    const answer = runFaultLocation(
      faultLocationRequestSchema.parse({ method: 'loop-both-ends', nearOhm: 110, farOhm: 160, lengthM: 10000, ohmPerMetre: 0.011 }),
    );
    expect(answer.distanceM).toBeCloseTo(3863.636, 2);
    expect(answer.faultOhm).toBeCloseTo(25, 9);
  });

  test('vf-calibration via the API returns the velocity factor', () => {
    const answer = runFaultLocation(faultLocationRequestSchema.parse({ method: 'vf-calibration', roundTripNs: 200, lengthM: 20 }));
    expect(answer.velocityFactor).toBeCloseTo(40 / (C * 200e-9), 12);
  });

  test.each<[unknown, RegExp]>([
    [{ method: 'tdr', roundTripNs: 100 }, /velocityFactor is required/],
    [{ method: 'tdr', roundTripNs: -1, velocityFactor: 0.6 }, /roundTripNs must be greater than 0/],
    [{ method: 'tdr', roundTripNs: '100', velocityFactor: 0.6 }, /roundTripNs must be a number/],
    [{ method: 'tdr', roundTripNs: 100, velocityFactor: 1.5 }, /faster than light/],
    [{ method: 'tdr', roundTripNs: 100, velocityFactor: 0.6, colour: 'red' }, /Unrecognized key/],
    [{ method: 'tdr', roundTripNs: Infinity, velocityFactor: 0.6 }, /roundTripNs/],
    [{ method: 'loop-one-end', loopOhm: 1 }, /Give ohmPerMetre, or conductorOhm/],
    [{ method: 'loop-one-end', loopOhm: 1, ohmPerMetre: 0.1, conductorOhm: 1, lengthM: 10 }, /not both/],
    [{ method: 'loop-one-end', loopOhm: 1, conductorOhm: 1 }, /lengthM is required with conductorOhm/],
    [{ method: 'loop-both-ends', nearOhm: 1, farOhm: 1, lengthM: 10 }, /Give ohmPerMetre or conductorOhm/],
    [
      { method: 'murray', lengthM: 600, faultedArm: 0, soundArm: 1 },
      /faultedArm must be greater than 0 \(the bridge arm joined to the faulted line/,
    ],
    [{ method: 'murray', lengthM: 600, ratioP: 1, ratioQ: 3 }, /Unrecognized keys/],
    [{ method: 'capacitance', lengthM: 20, faultedNf: 0.6 }, /soundNf is required/],
    [{ method: 'sonar', lengthM: 20 }, /method must be one of: tdr, vf-calibration/],
    [{ lengthM: 20 }, /method must be one of/],
  ])('refuses %o', (body, message) => {
    const result = faultLocationRequestSchema.safeParse(body);
    expect(result.success).toBe(false);
    if (!result.success) expect(result.error.issues.map((i) => i.message).join(' | ')).toMatch(message);
  });

  test('a schema-valid but physically impossible request is refused by the domain (→ 422)', () => {
    const request = faultLocationRequestSchema.parse({ method: 'murray', lengthM: 600, faultedArm: 5, soundArm: 1 });
    expect(() => runFaultLocation(request)).toThrow(FaultLocationError);
  });
});

describe('explanations in the reader’s units', () => {
  // mathjs unit conversion, 1 ft = 0.3048 m (NIST SP 811)
  const toFeet = (lengthM: number) => unit(lengthM, 'm').toNumber('ft');
  // Metre lengths as the engine writes them ("7.4 m", "3.864 km", "Ω/m", "per metre"); ns, nF and Ω do not match.
  const METRE_WORDS = /\d\s*k?m\b|Ω\/m\b|\bmetres?\b/;

  /** The distance of "about 24.3 ft from the near end", in feet, with half the step it was rounded to. */
  function feetAfterAbout(explanation: string): { ft: number; halfStep: number } {
    const match = /about (\d+(?:\.(\d+))?) ft from/.exec(explanation);
    expect(match, explanation).not.toBeNull();
    const decimals = match![2]?.length ?? 0;
    return { ft: Number(match![1]), halfStep: 0.5 * 10 ** -decimals };
  }

  test('when the reader works in feet, then the TDR explanation gives the distance, band and speed in feet', () => {
    const input = { roundTripNs: 100, velocityFactor: 0.66, riseTimeNs: 2, lengthM: 12 };
    const metric = locateByTdr(input);
    const imperial = locateByTdr(input, 'imperial');
    // Only the words change: the numbers are the same metres.
    expect(imperial.distanceM).toBe(metric.distanceM);
    expect(imperial.uncertaintyM).toBe(metric.uncertaintyM);

    const { ft, halfStep } = feetAfterAbout(imperial.explanation);
    expect(Math.abs(ft - toFeet(metric.distanceM))).toBeLessThanOrEqual(halfStep);
    expect(ft).toBe(32.5); // 9.894 m / 0.3048
    expect(imperial.explanation).toContain('(6.91 ft from the far end), ±1.03 ft');
    const ftPerNs = unit(0.66 * C, 'm/s').toNumber('ft/ns');
    expect(imperial.explanation).toContain(`travels ${Number(ftPerNs.toPrecision(3))} ft per ns`);
    expect(imperial.explanation).toContain('0.649 ft per ns');
    expect(imperial.explanation).not.toMatch(METRE_WORDS);
  });

  test('when the reader works in feet, then the loop-from-both-ends explanation gives the distance in feet and Ω per 1000 ft', () => {
    const input = { nearOhm: 0.855, farOhm: 0.645, lengthM: 12, conductorOhm: 0.45 };
    const metric = locateByLoopBothEnds(input);
    const imperial = locateByLoopBothEnds(input, 'imperial');
    expect(imperial.distanceM).toBe(metric.distanceM);
    expect(imperial.faultOhm).toBe(metric.faultOhm);

    const { ft, halfStep } = feetAfterAbout(imperial.explanation);
    expect(Math.abs(ft - toFeet(metric.distanceM))).toBeLessThanOrEqual(halfStep);
    expect(ft).toBe(24.3); // 7.4 m / 0.3048
    // Per 1000 ft, as wire tables give it: mathjs unit conversion.
    const ohmPer1000Ft = unit(0.45 / 12, 'ohm/m').toNumber('ohm/ft') * 1000;
    expect(imperial.explanation).toContain(`At ${Number(ohmPer1000Ft.toPrecision(4))} Ω/1000 ft per conductor`);
    expect(imperial.explanation).toContain('over 39.4 ft');
    expect(imperial.explanation).toContain('(15.1 ft from the far end), ±0.89 ft');
    expect(imperial.explanation).not.toMatch(METRE_WORDS);
  });

  test('property: when the reader works in feet, then the loop-from-both-ends distance in words is the metric one converted', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.05, max: 0.95, noNaN: true }), fc.integer({ min: 2, max: 400 }), (fraction, lengthM) => {
        const x = fraction * lengthM;
        const r = 0.0375;
        const input = { nearOhm: 2 * r * x + 0.1, farOhm: 2 * r * (lengthM - x) + 0.1, lengthM, ohmPerMetre: r };
        const imperial = locateByLoopBothEnds(input, 'imperial');
        const { ft, halfStep } = feetAfterAbout(imperial.explanation);
        expect(Math.abs(ft - toFeet(locateByLoopBothEnds(input).distanceM))).toBeLessThanOrEqual(halfStep + 1e-9);
        expect(imperial.explanation).not.toMatch(METRE_WORDS);
      }),
    );
  });

  test('when the reader works in feet, then refusals quote lengths in feet too', () => {
    const tdr = refusal(() => locateByTdr({ roundTripNs: 1000, velocityFactor: 0.66, lengthM: 12 }, 'imperial'));
    expect(tdr.field).toBe('roundTripNs');
    expect(tdr.message).toMatch(
      /^These readings put the fault at 324\.6 ft, beyond the end of this 39\.4 ft cable even allowing ±9\.74 ft\./,
    );
    const loop = refusal(() => locateByLoopBothEnds({ nearOhm: 0.6, farOhm: 0.6, lengthM: 10, ohmPerMetre: 0.1 }, 'imperial'));
    // 0.1 Ω/m = 30.48 Ω/1000 ft (1 ft = 0.3048 m)
    expect(loop.message).toContain('(2 × 30.48 Ω/1000 ft × 32.8 ft)');
    expect(loop.message).toContain('the Ω per 1000 ft');
    expect(refusal(() => recordFlexTest({ distanceM: 13, lengthM: 12 }, 'imperial')).message).toMatch(
      /^42\.7 ft is beyond the end of this 39\.4 ft cable/,
    );
    for (const error of [tdr, loop]) expect(error.message).not.toMatch(METRE_WORDS);
  });

  test('when the reader works in feet, then calibration, flex, combining and the request runner follow', () => {
    const calibration = calibrateVelocityFactor({ roundTripNs: 100, lengthM: 10 }, 'imperial');
    const nsPerFoot = unit(delayNsPerMetre(calibration.velocityFactor), 'ns/m').toNumber('ns/ft');
    expect(calibration.explanation).toContain(`known-good 32.8 ft cable`);
    expect(calibration.explanation).toContain(`${Number(nsPerFoot.toPrecision(4))} ns per foot one way`);
    expect(calibration.delayNsPerMetre).toBe(calibrateVelocityFactor({ roundTripNs: 100, lengthM: 10 }).delayNsPerMetre);

    const flex = runFaultLocation(faultLocationRequestSchema.parse({ method: 'flex', distanceM: 3, lengthM: 12 }), 'imperial');
    expect(flex.explanation).toBe(
      'Found by flexing the cable by hand: the fault is about 9.84 ft from the near end (29.5 ft from the far end), ±0.33 ft.',
    );

    const estimate = (method: string, distanceM: number, uncertaintyM: number): FaultEstimate => ({
      method,
      distanceM,
      uncertaintyM,
      explanation: '',
      inputs: {},
    });
    const combined = combineEstimates([estimate('tdr', 10, 0.1), estimate('capacitance', 12, 0.2)], 'imperial');
    expect(combined.explanation).toContain('tdr 32.8 ft ±0.33 ft and capacitance 39.4 ft ±0.66 ft do not overlap');
    expect(combined.explanation).toContain('Ω per 1000 ft');

    for (const text of [calibration.explanation, flex.explanation, combined.explanation]) expect(text).not.toMatch(METRE_WORDS);
  });

  test('when no unit system is given, then the explanation is in metres, word for word as before', () => {
    const tdrInput = { roundTripNs: 100, velocityFactor: 0.66, riseTimeNs: 2, lengthM: 12 };
    expect(locateByTdr(tdrInput).explanation).toBe(locateByTdr(tdrInput, 'metric').explanation);
    expect(locateByTdr(tdrInput).explanation).toBe(
      'The reflection comes back 100 ns after the incident edge. At a velocity factor of 0.66 the signal travels 0.198 m per ns; ' +
        'it went to the fault and back, so the fault is about 9.89 m from the instrument end (2.11 m from the far end), ±0.31 m ' +
        '(±0.1 m from the 2 ns rise time (half its 0.2 m resolution); ±0.3 m from the velocity factor (±0.02)).',
    );
    const loopInput = { nearOhm: 0.855, farOhm: 0.645, lengthM: 12, conductorOhm: 0.45 };
    expect(locateByLoopBothEnds(loopInput).explanation).toBe(locateByLoopBothEnds(loopInput, 'metric').explanation);
    expect(locateByLoopBothEnds(loopInput).explanation).toBe(
      'The shorted pair reads 0.855 Ω from the near end and 0.645 Ω from the far end. At 0.0375 Ω/m per conductor ' +
        '(a sound conductor reads 0.45 Ω over 12 m), the short is about 7.4 m from the near end (4.6 m from the far end), ±0.27 m. ' +
        'The short itself is about 0.3 Ω ±0.031 Ω; measuring from both ends removes it from the distance.',
    );
    expect(calibrateVelocityFactor({ roundTripNs: 100, lengthM: 10 }).explanation).toContain('5 ns per metre one way');
  });
});
