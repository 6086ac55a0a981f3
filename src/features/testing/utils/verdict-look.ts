import type { MarkShape, MarkTone } from '@/components/ui/status-mark';

export const verdictLook: Record<'pass' | 'near-limit' | 'fail', { shape: MarkShape; tone: MarkTone; label: string }> = {
  pass: { shape: 'circle', tone: 'pass', label: 'Pass' },
  'near-limit': { shape: 'diamond', tone: 'near', label: 'Near limit' },
  fail: { shape: 'triangle', tone: 'fail', label: 'Fail' },
};
