// Verdict evaluation through the shared engine: readings per second (parse + judge).
import { DEFAULT_LIMIT_PROFILE } from '../shared/domain/limits';
import { judgeTypedReading } from '../shared/domain/typed-reading';
import { bestOf, type BenchResult } from './lib';

export async function run(): Promise<BenchResult> {
  const typed = ['0.42', '2.6', '850m', 'OL', '22 MΩ', '1.2k', '0,38', '3.1'];
  const n = 200_000;
  const engine = bestOf(3, () => {
    let fails = 0;
    for (let i = 0; i < n; i++) {
      const text = typed[i % typed.length];
      const insulation = i % 2 === 1;
      // The same call the server makes for a reading typed with no test-lead null.
      const j = judgeTypedReading(text, {
        profile: DEFAULT_LIMIT_PROFILE,
        equipmentKind: 'floor-cable',
        testKind: insulation ? 'insulation' : 'continuity',
        conductors: insulation ? 'A-B' : 'A',
        lengthM: 12,
      });
      if (!j.ok) continue;
      const v = j.verdict;
      if (v.verdict === 'fail') fails++;
    }
    return fails;
  });
  // The limit: the same loop doing only the number conversion a reading needs at the very least.
  const floor = bestOf(3, () => {
    let s = 0;
    for (let i = 0; i < n; i++) s += Number.parseFloat(typed[i % typed.length].replace(',', '.')) || 0;
    return s;
  });
  const perSecond = n / (engine.ms / 1000);
  const ratio = engine.ms / floor.ms;
  return {
    name: 'Verdict evaluation (parse + limit check)',
    ratio,
    ratioMeaning: 'engine time ÷ bare number conversion of the same inputs',
    target: 'informational (readings/s well above any typing speed)',
    pass: perSecond > 10_000,
    figures: { readings: n, readingsPerSecond: Math.round(perSecond), engineMs: +engine.ms.toFixed(1), bareMs: +floor.ms.toFixed(1) },
  };
}
