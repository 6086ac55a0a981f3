import { beforeAll, describe, expect, test } from 'vitest';
import {
  canonicalTimeZone,
  formatCalendarRange,
  formatDateTime,
  formatDateTimeWithOffset,
  formatTime,
  fromZonedInput,
  isoWithOffset,
  loadLocale,
  toZonedInput,
  utcOffsetLabel,
} from '../../shared/format/date-time';

// Expected instants come from the IANA time zone database's rules (file `europe` and `northamerica`):
//   Rule EU 1981 max - Mar lastSun 1:00u 1:00 S   and   Rule EU 1996 max - Oct lastSun 1:00u 0 -
//   Zone Europe/Paris ... 1:00 EU CE%sT           (CET +01:00, CEST +02:00)
//   Rule US 2007 max - Mar Sun>=8 2:00 1:00 D     and   Rule US 2007 max - Nov Sun>=1 2:00 0 S
//   Zone America/New_York ... -5:00 US E%sT       (EST −05:00, EDT −04:00)
// In 2026 the last Sunday of March is the 29th and of October the 25th; the second Sunday of
// March is the 8th and the first of November the 1st.
describe('ISO 8601 with the venue offset (CSV)', () => {
  test('Europe/Paris: the second before and the second of the spring change (EU rule, 01:00 UTC on 29 March 2026)', () => {
    expect(isoWithOffset('2026-03-29T00:59:59Z', 'Europe/Paris')).toBe('2026-03-29T01:59:59+01:00');
    expect(isoWithOffset('2026-03-29T01:00:00Z', 'Europe/Paris')).toBe('2026-03-29T03:00:00+02:00');
  });

  test('Europe/Paris: the autumn change (01:00 UTC on 25 October 2026) repeats the hour 02:00–03:00', () => {
    expect(isoWithOffset('2026-10-25T00:59:59Z', 'Europe/Paris')).toBe('2026-10-25T02:59:59+02:00');
    expect(isoWithOffset('2026-10-25T01:00:00Z', 'Europe/Paris')).toBe('2026-10-25T02:00:00+01:00');
  });

  test('America/New_York: the spring change at 02:00 local on 8 March 2026 (07:00 UTC)', () => {
    expect(isoWithOffset('2026-03-08T06:59:59Z', 'America/New_York')).toBe('2026-03-08T01:59:59-05:00');
    expect(isoWithOffset('2026-03-08T07:00:00Z', 'America/New_York')).toBe('2026-03-08T03:00:00-04:00');
  });

  test('the same instant in two zones names the same moment (Date.parse gives it back)', () => {
    const at = '2026-12-02T06:14:05Z';
    const paris = isoWithOffset(at, 'Europe/Paris');
    const ny = isoWithOffset(at, 'America/New_York');
    expect(paris).toBe('2026-12-02T07:14:05+01:00');
    expect(ny).toBe('2026-12-02T01:14:05-05:00');
    expect(Date.parse(paris)).toBe(Date.parse(at));
    expect(Date.parse(ny)).toBe(Date.parse(at));
  });

  test('UTC itself is written +00:00, like every other offset (ISO 8601 allows it)', () => {
    expect(isoWithOffset('2026-12-02T06:14:05.900Z', 'UTC')).toBe('2026-12-02T06:14:05+00:00');
  });
});

describe('the reader language, fetched when needed', () => {
  test('a language not yet loaded is written in British English, and in its own once loaded', async () => {
    const at = '2026-12-02T06:14:05Z';
    expect(formatDateTime(at, { timeZone: 'Europe/Berlin', locale: 'de-DE' })).toBe('2 Dec 2026, 07:14');
    await loadLocale('de-DE');
    // "Dez." is German's short December (CLDR de, months abbreviated).
    expect(formatDateTime(at, { timeZone: 'Europe/Berlin', locale: 'de-DE' })).toMatch(/Dez/);
  });
});

describe('dates and times for people', () => {
  beforeAll(() => loadLocale('fr-FR'));

  // CLDR's patterns: en-GB medium date "d MMM y", short time "HH:mm"; en-US "MMM d, y", "h:mm a";
  // fr "d MMM y" with abbreviated months ("déc."), "HH:mm".
  test('in the venue zone, in the reader locale', () => {
    const at = '2026-12-02T06:14:05Z';
    expect(formatDateTime(at, { timeZone: 'Europe/Paris', locale: 'en-GB' })).toBe('2 Dec 2026, 07:14');
    expect(formatDateTime(at, { timeZone: 'America/New_York', locale: 'en-US' })).toBe('Dec 2, 2026, 1:14 AM');
    expect(formatDateTime(at, { timeZone: 'Europe/Paris', locale: 'fr-FR' })).toBe('2 déc. 2026, 07:14');
    expect(formatTime(at, { timeZone: 'America/New_York', locale: 'en-GB' })).toBe('01:14');
  });

  test('an unknown locale falls back to British English, a region-less tag to its language', () => {
    const at = '2026-12-02T06:14:05Z';
    expect(formatDateTime(at, { timeZone: 'Europe/Paris', locale: 'tlh' })).toBe('2 Dec 2026, 07:14');
    expect(formatDateTime(at, { timeZone: 'Europe/Paris', locale: 'fr' })).toBe('2 déc. 2026, 07:14');
  });

  test('the offset shown beside a time changes at the spring change (IANA EU rule)', () => {
    expect(utcOffsetLabel('2026-03-29T00:59:59Z', 'Europe/Paris')).toBe('UTC+01:00');
    expect(utcOffsetLabel('2026-03-29T01:00:00Z', 'Europe/Paris')).toBe('UTC+02:00');
    expect(formatDateTimeWithOffset('2026-03-29T01:00:00Z', { timeZone: 'Europe/Paris' })).toBe('29 Mar 2026, 03:00 (UTC+02:00)');
  });

  test('event days are calendar days: the same wherever they are read', () => {
    expect(formatCalendarRange('2026-11-21', '2026-11-22')).toBe('21 Nov 2026 – 22 Nov 2026');
    expect(formatCalendarRange('2026-11-21', '2026-11-21', { locale: 'en-US' })).toBe('Nov 21, 2026');
  });

  test('a datetime-local value means that wall-clock time in the venue zone, and back', () => {
    expect(fromZonedInput('2026-12-02T07:14', 'Europe/Paris')).toBe('2026-12-02T06:14:00.000Z');
    expect(fromZonedInput('2026-07-02T07:14', 'Europe/Paris')).toBe('2026-07-02T05:14:00.000Z');
    expect(toZonedInput('2026-07-02T05:14:00Z', 'Europe/Paris')).toBe('2026-07-02T07:14');
    expect(fromZonedInput('2026-12-02', 'Europe/Paris')).toBeUndefined();
  });
});

describe('time zone names', () => {
  test('known IANA names are kept as Intl spells them; others are refused', () => {
    expect(canonicalTimeZone('Europe/Paris')).toBe('Europe/Paris');
    expect(canonicalTimeZone('europe/paris')).toBe('Europe/Paris');
    expect(canonicalTimeZone('America/New_York')).toBe('America/New_York');
    expect(canonicalTimeZone('Mars/Olympus_Mons')).toBeNull();
    expect(canonicalTimeZone('')).toBeNull();
    expect(canonicalTimeZone('Europe/Paris; DROP TABLE venues')).toBeNull();
  });
});
