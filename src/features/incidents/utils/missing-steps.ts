import { TEST_KIND_LABELS } from '@shared/domain/checklist';
import { ApiError } from '@/lib/api-client';
import type { RetestStep } from '../api/get-incident';

export const stepWords = (s: Pick<RetestStep, 'positionName' | 'testKind' | 'conductors'>) =>
  `${s.positionName} · ${TEST_KIND_LABELS[s.testKind]} ${s.conductors}`;

/** What a refused resolve said is missing, in plain words (409 `retest-incomplete` carries `missing`). */
export function missingFromError(err: unknown): string[] {
  if (!(err instanceof ApiError) || err.status !== 409) return [];
  const missing = err.body.missing;
  if (!Array.isArray(missing)) return [];
  return missing.map((m: Partial<RetestStep>) => {
    const step = m.positionName && m.testKind ? stepWords(m as RetestStep) : (m.positionName ?? 'A step');
    return m.message ? `${step}: ${m.message}` : step;
  });
}
