// The browser runs the same engine as the server, so a verdict shows while the value is typed.
import { evaluateReading, type EquipmentKind, type LimitProfile, type TestKind, type Verdict } from '@shared/domain/limits';
import { formatOhm, parseReading } from '@shared/domain/units';

export type Preview =
  | { state: 'empty' }
  | { state: 'invalid'; message: string }
  | { state: 'judged'; display: string; verdict: Verdict };

export interface StepContext {
  profile: LimitProfile;
  equipmentKind: EquipmentKind;
  testKind: TestKind;
  conductors: string;
  lengthM: number | null;
}

export function previewReading(text: string, ctx: StepContext, leadOffsetOhm: number | null): Preview {
  if (text.trim() === '') return { state: 'empty' };
  const parsed = parseReading(text, 'resistance', leadOffsetOhm === null ? undefined : { leadOffsetOhm });
  if (!parsed.ok) return { state: 'invalid', message: parsed.message };
  try {
    const verdict = evaluateReading({ ...ctx, valueOhm: parsed.value, overRange: parsed.overRange });
    return { state: 'judged', display: parsed.display, verdict };
  } catch (err) {
    return { state: 'invalid', message: err instanceof Error ? err.message : String(err) };
  }
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
