// Per-session settings of the testing screen (sessionStorage: gone when the tablet's tab closes).
const LEAD_KEY = 'sw.leadOffsetOhm';
const SAFETY_KEY = 'sw.safetyAcknowledged';

export function readLeadOffset(): number | null {
  const raw = sessionStorage.getItem(LEAD_KEY);
  const n = raw === null ? NaN : Number(raw);
  return Number.isFinite(n) ? n : null;
}
export function saveLeadOffset(ohm: number | null) {
  if (ohm === null) sessionStorage.removeItem(LEAD_KEY);
  else sessionStorage.setItem(LEAD_KEY, String(ohm));
}
export const safetyAcknowledged = () => sessionStorage.getItem(SAFETY_KEY) === 'yes';
export const acknowledgeSafety = () => sessionStorage.setItem(SAFETY_KEY, 'yes');
