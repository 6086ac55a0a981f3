// The browser runs the same engine as the server, so a verdict shows while the value is typed.
import { evaluateReading, type Verdict } from '@shared/domain/limits';
import { formatOhm } from '@shared/domain/units';
import { judgeTypedReading, type TypedReadingContext } from '@shared/domain/typed-reading';

export type Preview = { state: 'empty' } | { state: 'invalid'; message: string } | { state: 'judged'; display: string; verdict: Verdict };

export type StepContext = Omit<TypedReadingContext, 'temperatureC'>;

/** `leadNullOhm`: the test-lead null the reading will be sent with (null: none). */
export function previewReading(text: string, ctx: StepContext, leadNullOhm: number | null): Preview {
  if (text.trim() === '') return { state: 'empty' };
  const judged = judgeTypedReading(text, ctx, leadNullOhm);
  if (!judged.ok) return { state: 'invalid', message: judged.message };
  return { state: 'judged', display: judged.display, verdict: judged.verdict };
}

/** "at most 2.5 Ω" / "at least 100 kΩ", with its source, before anything is typed. */
export function limitText(ctx: StepContext): { text: string; source: string } | null {
  try {
    const v = evaluateReading({ ...ctx, valueOhm: 0, overRange: false });
    if (v.limitOhm === null) return null;
    return { text: `${v.limitKind === 'min' ? 'at least' : 'at most'} ${formatOhm(v.limitOhm)}`, source: v.source };
  } catch {
    return null;
  }
}
