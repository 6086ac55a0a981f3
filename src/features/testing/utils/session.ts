// Per-session settings of the testing screen (sessionStorage: gone when the tablet's tab closes).
import type { LeadNullRecord } from '@shared/schemas/lead-nulls';

const LEAD_KEY = 'sw.leadNull';
const OLD_LEAD_KEY = 'sw.leadOffsetOhm';
const SAFETY_KEY = 'sw.safetyAcknowledged';

/** This person's test-lead null of this session, if they set one (a shared tablet: not someone else's). */
export function readLeadNull(userId: string | undefined): LeadNullRecord | null {
  sessionStorage.removeItem(OLD_LEAD_KEY);
  const raw = sessionStorage.getItem(LEAD_KEY);
  if (!raw || !userId) return null;
  try {
    const n = JSON.parse(raw) as LeadNullRecord;
    return n.userId === userId && typeof n.id === 'string' && Number.isFinite(n.valueOhm) ? n : null;
  } catch {
    return null;
  }
}
export function saveLeadNull(n: LeadNullRecord | null) {
  if (n === null) sessionStorage.removeItem(LEAD_KEY);
  else sessionStorage.setItem(LEAD_KEY, JSON.stringify(n));
}
export const safetyAcknowledged = () => sessionStorage.getItem(SAFETY_KEY) === 'yes';
export const acknowledgeSafety = () => sessionStorage.setItem(SAFETY_KEY, 'yes');
