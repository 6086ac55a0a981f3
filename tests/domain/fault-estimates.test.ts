import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { combineSavedEstimates, type SavedEstimate } from '../../shared/domain/fault-estimates';
import {
  combineEstimates,
  locateByLoopBothEnds,
  locateByLoopOneEnd,
  locateByMurrayLoop,
  locateByTdr,
  type FaultEstimate,
} from '../../shared/domain/fault-location';

// Inverse-variance weighting narrows the band only for independent estimates: for correlated
// inputs the GUM asks for their covariance (JCGM 100:2008, §5.2; from memory). Two estimates from
// the same readings are fully correlated, so the honest band is the one of either alone.

const saved = (e: FaultEstimate, extra: Partial<SavedEstimate> = {}): SavedEstimate => ({
  method: e.method,
  fromEnd: 'near',
  distanceFromNearM: e.distanceM,
  uncertaintyM: e.uncertaintyM,
  inputs: e.inputs,
  itemLengthM: 12,
  ...extra,
});

// The demo's Strip 6 short: 12 m, 0.0375 Ω/m, 0.3 Ω at 7.4 m (invented demo values); loop from
// both ends x = (R_A − R_B + 2rL) / (4r) (REFERENCES.md, "loop, both ends").
const fromNear = locateByLoopBothEnds({ nearOhm: 0.855, farOhm: 0.645, lengthM: 12, ohmPerMetre: 0.0375 });
const sameFromFar = locateByLoopBothEnds({ nearOhm: 0.645, farOhm: 0.855, lengthM: 12, conductorOhm: 0.45 });

describe('combining only independent estimates', () => {
  test('two loop estimates worked from the same two readings keep the wider band, not a tighter one', () => {
    const pair = [saved(fromNear), saved(sameFromFar, { fromEnd: 'far', distanceFromNearM: 12 - sameFromFar.distanceM })];
    // What weighing them as independent would claim: narrower than either.
    const naive = combineEstimates([fromNear, { ...sameFromFar, distanceM: 12 - sameFromFar.distanceM }]);
    expect(naive.uncertaintyM).toBeLessThan(Math.min(fromNear.uncertaintyM, sameFromFar.uncertaintyM));

    const result = combineSavedEstimates(pair);
    const wider = Math.max(fromNear.uncertaintyM, sameFromFar.uncertaintyM);
    expect(result.combined!.uncertaintyM).toBe(wider);
    expect(result.used).toHaveLength(1);
    expect(result.apart).toEqual([
      expect.objectContaining({
        kind: 'same-readings',
        reason: expect.stringMatching(
          /^Worked out from the same readings \(0\.855 Ω, 0\.645 Ω\) as the loop resistance from both ends estimate \(no\. \d\)/,
        ),
      }),
    ]);
    expect(result.combined!.explanation).toMatch(/shown beside it, not weighed in/);
  });

  test('the same readings saved twice are one estimate: the band does not narrow', () => {
    const result = combineSavedEstimates([saved(fromNear), saved(fromNear)]);
    expect(result.combined!.uncertaintyM).toBe(fromNear.uncertaintyM);
    expect(result.used).toEqual([1]);
    expect(result.apart.map((a) => a.index)).toEqual([0]);
  });

  test('a loop from one end that reuses the near-end loop reading is not independent of the loop from both ends', () => {
    const oneEnd = locateByLoopOneEnd({ loopOhm: 0.855, ohmPerMetre: 0.0375, lengthM: 12, faultOhm: 0.3 });
    const result = combineSavedEstimates([saved(fromNear), saved(oneEnd)]);
    expect(result.used).toHaveLength(1);
    expect(result.apart[0]!.reason).toMatch(/the same readings \(0\.855 Ω\)/);
  });

  test('estimates from different readings, or by another method from its own readings, are weighed together and narrow the band', () => {
    // Re-measured: other readings of the same short.
    const again = locateByLoopBothEnds({ nearOhm: 0.86, farOhm: 0.64, lengthM: 12, ohmPerMetre: 0.0375 });
    const tdr = locateByTdr({ roundTripNs: (2 * 7.4 * 1e9) / (0.66 * 299_792_458), velocityFactor: 0.66, riseTimeNs: 1, lengthM: 12 });
    const result = combineSavedEstimates([saved(fromNear), saved(again), saved(tdr)]);
    expect(result.used).toEqual([0, 1, 2]);
    expect(result.apart).toEqual([]);
    expect(result.combined!.uncertaintyM).toBeLessThan(Math.min(fromNear.uncertaintyM, again.uncertaintyM, tdr.uncertaintyM));
    expect(result.combined!.explanation).toMatch(/^The 3 estimates agree/);
  });

  test('a Murray balance is one reading: the same ratio is the same reading, one arm left at the same value is not', () => {
    const a = locateByMurrayLoop({ lengthM: 600, faultedArm: 1, soundArm: 3 });
    const sameRatio = locateByMurrayLoop({ lengthM: 600, faultedArm: 1000, soundArm: 3000 });
    const otherBalance = locateByMurrayLoop({ lengthM: 600, faultedArm: 1.02, soundArm: 3 });
    expect(combineSavedEstimates([saved(a, { itemLengthM: 600 }), saved(sameRatio, { itemLengthM: 600 })]).used).toHaveLength(1);
    expect(combineSavedEstimates([saved(a, { itemLengthM: 600 }), saved(otherBalance, { itemLengthM: 600 })]).used).toEqual([0, 1]);
  });

  test('the same distance found by hand from the two ends is two readings', () => {
    const flex = (distanceM: number, fromEnd: 'near' | 'far'): SavedEstimate => ({
      method: 'flex',
      fromEnd,
      distanceFromNearM: fromEnd === 'near' ? distanceM : 12 - distanceM,
      uncertaintyM: 0.1,
      inputs: { distanceM, lengthM: 12 },
      itemLengthM: 12,
    });
    expect(combineSavedEstimates([flex(6, 'near'), flex(6, 'far')]).used).toEqual([0, 1]);
    expect(combineSavedEstimates([flex(6, 'near'), flex(6, 'near')]).used).toEqual([1]);
  });

  test('estimates made on the item at another length, and ones that cannot be placed, are shown apart with the reason', () => {
    const before = saved(fromNear, { itemLengthM: 12 });
    const after = saved(locateByLoopBothEnds({ nearOhm: 0.5, farOhm: 0.4, lengthM: 10.5, ohmPerMetre: 0.0375 }), { itemLengthM: 10.5 });
    const unplaced = saved(fromNear, { fromEnd: 'far', distanceFromNearM: null, itemLengthM: 10.5, inputs: {} });
    const result = combineSavedEstimates([before, after, unplaced]);
    expect(result.itemLengthM).toBe(10.5);
    expect(result.used).toEqual([1]);
    expect(result.apart).toEqual([
      {
        index: 0,
        kind: 'other-length',
        reason: 'Worked out when the item was 12 m long, not the 10.5 m of the latest estimate: not measured on the same cable.',
      },
      { index: 2, kind: 'not-placed', reason: expect.stringMatching(/cannot be placed from the apparatus end/) },
    ]);
    expect(combineSavedEstimates([before, after], 'imperial').apart[0]!.reason).toMatch(
      /when the item was 39\.4 ft long, not the 34\.4 ft/,
    );
  });

  test('property: saving an estimate again never changes the combination', () => {
    const estimate = fc.record({
      nearOhm: fc.integer({ min: 400, max: 1000 }),
      farOhm: fc.integer({ min: 400, max: 1000 }),
    });
    fc.assert(
      fc.property(fc.array(estimate, { minLength: 1, maxLength: 5 }), fc.nat(), (readings, pick) => {
        const list = readings
          .map(({ nearOhm, farOhm }) => ({ nearOhm: nearOhm / 1000, farOhm: farOhm / 1000 }))
          .filter(({ nearOhm, farOhm }) => nearOhm + farOhm >= 0.9 && Math.abs(nearOhm - farOhm) <= 0.85)
          .map((r) => saved(locateByLoopBothEnds({ ...r, lengthM: 12, ohmPerMetre: 0.0375 })));
        fc.pre(list.length > 0);
        const once = combineSavedEstimates(list).combined!;
        const twice = combineSavedEstimates([...list, list[pick % list.length]!]).combined!;
        expect(twice.distanceM).toBeCloseTo(once.distanceM, 12);
        expect(twice.uncertaintyM).toBeCloseTo(once.uncertaintyM, 12);
      }),
    );
  });
});
