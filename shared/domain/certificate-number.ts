// Certificate numbers, SW-<year>-XXXX-XXXX-<V|S>: made by the sign-off, checked by the schema of the
// public check, and tidied on the verify page as they are typed. Eight symbols of Crockford's
// base32 (no I, L, O, U: readable aloud, no look-alikes) carry 40 random bits, so a number does not
// tell how many certificates exist or let anyone guess another one (the check is public).

export const CERTIFICATE_ALPHABET = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';
export type CertificateKind = 'venue' | 'strip';

const SYMBOL = '[0-9A-HJKMNP-TV-Z]';
export const CERTIFICATE_NUMBER_PATTERN = new RegExp(`^SW-\\d{4}-${SYMBOL}{4}-${SYMBOL}{4}-[VS]$`);
/** What the number looks like, for a placeholder or a message. */
export const CERTIFICATE_NUMBER_EXAMPLE = 'SW-2026-XXXX-XXXX-V';

/** A new number; `randomSymbol` gives an integer in 0..31 (the server passes a CSPRNG). */
export function makeCertificateNumber(kind: CertificateKind, year: number, randomSymbol: () => number): string {
  const group = () => Array.from({ length: 4 }, () => CERTIFICATE_ALPHABET[randomSymbol()]).join('');
  return `SW-${year}-${group()}-${group()}-${kind === 'venue' ? 'V' : 'S'}`;
}

/** What people type or a QR reader hands over, made canonical: case, spaces, look-alike letters. */
export function normaliseCertificateNumber(input: string): string {
  const upper = input.trim().toUpperCase().replace(/\s+/g, '');
  const m = /^SW-(\d{4})-([0-9A-Z]{4})-([0-9A-Z]{4})-([VS])$/.exec(upper);
  if (!m) return upper;
  const fix = (s: string) => s.replace(/O/g, '0').replace(/[IL]/g, '1');
  return `SW-${m[1]}-${fix(m[2])}-${fix(m[3])}-${m[4]}`;
}

export const isCertificateNumber = (s: string) => CERTIFICATE_NUMBER_PATTERN.test(s);
