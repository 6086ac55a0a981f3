// The certificate-number module against Crockford's base32 (crockford.com/base32.html, from memory:
// the 32 symbols are 0-9 and A-Z without I, L, O and U; when reading, I and L count as 1, O as 0).
import { describe, expect, test } from 'vitest';
import { randomInt } from 'node:crypto';
import {
  CERTIFICATE_ALPHABET,
  CERTIFICATE_NUMBER_EXAMPLE,
  isCertificateNumber,
  makeCertificateNumber,
  normaliseCertificateNumber,
} from '../../shared/domain/certificate-number';
import { certificateNumberField } from '../../shared/schemas/sign-off';
import { newCertificateNumber } from '../../server/signing/certificate-record';

const CROCKFORD = [...'0123456789ABCDEFGHIJKLMNOPQRSTUVWXYZ'].filter((c) => !'ILOU'.includes(c)).join('');

describe('certificate numbers', () => {
  test('the alphabet is Crockford base32: 32 symbols, no I, L, O or U', () => {
    expect(CERTIFICATE_ALPHABET).toBe(CROCKFORD);
    expect(new Set(CERTIFICATE_ALPHABET).size).toBe(32);
  });

  test('every symbol of the alphabet is accepted in a number, each look-alike letter is not', () => {
    for (const c of CERTIFICATE_ALPHABET) expect(isCertificateNumber(`SW-2026-${c}${c}${c}${c}-0000-V`)).toBe(true);
    for (const c of 'ILOU') expect(isCertificateNumber(`SW-2026-${c}000-0000-S`)).toBe(false);
  });

  test('a made number has the year, two groups of four symbols (40 bits) and V for a venue, S for a strip', () => {
    let i = 0;
    const symbols = [0, 31, 10, 17, 1, 2, 3, 4];
    expect(makeCertificateNumber('venue', 2026, () => symbols[i++ % 8])).toBe('SW-2026-0ZAH-1234-V');
    expect(makeCertificateNumber('strip', 2027, () => 0)).toBe('SW-2027-0000-0000-S');
    expect(Math.log2(32 ** 8)).toBe(40);
  });

  test('the server’s numbers (CSPRNG) match the pattern and the schema, and differ', () => {
    const made = new Set(Array.from({ length: 200 }, (_, k) => newCertificateNumber(k % 2 ? 'venue' : 'strip', 2026)));
    expect(made.size).toBe(200);
    for (const n of made) {
      expect(isCertificateNumber(n)).toBe(true);
      expect(certificateNumberField.parse(n)).toBe(n);
    }
  });

  test('typed numbers are made canonical: case, spaces, O read as 0, I and L read as 1', () => {
    expect(normaliseCertificateNumber(' sw-2026-oilx-ab12-v ')).toBe('SW-2026-011X-AB12-V');
    expect(normaliseCertificateNumber('SW-2026-7K3M-Q9TP- S')).toBe('SW-2026-7K3M-Q9TP-S');
    expect(certificateNumberField.parse('sw-2026-o0o0-1l1l-s')).toBe('SW-2026-0000-1111-S');
    // U has no look-alike reading: the number stays refused.
    expect(certificateNumberField.safeParse('SW-2026-UUUU-0000-V').success).toBe(false);
    expect(isCertificateNumber(normaliseCertificateNumber(String(randomInt(10))))).toBe(false);
  });

  test('the example shown to people has the shape of a number', () => {
    expect(CERTIFICATE_NUMBER_EXAMPLE.replace(/X/g, '0')).toMatch(/^SW-\d{4}-0000-0000-[VS]$/);
  });
});
