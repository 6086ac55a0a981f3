// Reading a scanned or typed code back (shared/domain/label-codes.ts). The link forms are our own
// design; URL parsing and percent-encoding follow the WHATWG URL Standard (RFC 3986 §2.1).
import { describe, expect, test } from 'vitest';
import { itemLabelUrl, parseScannedCode, stripLabelUrl } from '../../shared/domain/label-codes';

const STRIP = '0193b5e2-7c1a-7000-8000-0000000000ab';

describe('parseScannedCode', () => {
  test('a strip label’s link, on any address the tablet was printed from', () => {
    expect(parseScannedCode('http://localhost:3000/s/0193b5e2-7c1a-7000-8000-0000000000ab')).toEqual({ kind: 'strip', stripId: STRIP });
    expect(parseScannedCode(' https://hall.example/s/0193B5E2-7C1A-7000-8000-0000000000AB ')).toEqual({ kind: 'strip', stripId: STRIP });
    expect(parseScannedCode(stripLabelUrl('http://10.0.0.5:3000', STRIP))).toEqual({ kind: 'strip', stripId: STRIP });
  });

  test('an item label’s link: the tag decoded, a slash in a tag included (%2F)', () => {
    expect(itemLabelUrl('http://x.example', 'FC/12')).toBe('http://x.example/t/FC%2F12');
    expect(parseScannedCode('http://x.example/t/FC%2F12')).toEqual({ kind: 'tag', assetTag: 'FC/12' });
    expect(parseScannedCode('/t/rl-004')).toEqual({ kind: 'tag', assetTag: 'RL-004' });
  });

  test('a typed or bare tag is a tag, upper-cased as the register keeps it', () => {
    expect(parseScannedCode('fc-001')).toEqual({ kind: 'tag', assetTag: 'FC-001' });
    expect(parseScannedCode('APP.7')).toEqual({ kind: 'tag', assetTag: 'APP.7' });
  });

  test('anything else is not a code of ours', () => {
    for (const text of [
      '',
      '   ',
      'two words',
      'http://x.example/s/not-a-uuid',
      'http://x.example/verify/SW-2026',
      'http://x.example/t/%E0%A4%A',
      'http://[bad',
      '-FC',
      'A'.repeat(41),
    ]) {
      expect(parseScannedCode(text), text).toBeNull();
    }
  });
});
