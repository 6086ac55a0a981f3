// One way to write dates and times, for the screens, the CSV exports, the e-mails and the
// certificate PDFs: date-fns in the reader's locale, in the venue's time zone (@date-fns/tz).
// A venue's readings are read in the hall's clock, wherever the reader is; a day of the event
// ('2026-11-21') is a calendar day and never moves with a time zone.
import { format, parseISO, type Locale } from 'date-fns';
import { TZDate } from '@date-fns/tz';
import { enGB } from 'date-fns/locale/en-GB';
import { enUS } from 'date-fns/locale/en-US';

/** The time zone of a venue made before venues had one, and of a new venue nobody set one for. */
export const DEFAULT_TIME_ZONE = 'Europe/London';
/** The locale of what the server writes (e-mails, PDFs): the product's own language. */
export const SERVER_LOCALE = 'en-GB';

export interface DateContext {
  /** A BCP 47 tag (navigator.language); unknown ones fall back to British English. */
  locale?: string;
  /** An IANA name; absent means the reader's own zone. */
  timeZone?: string;
}

export type Instant = string | number | Date;

// English is always at hand; the other languages of the fencing federations are fetched when a
// reader needs one (loadLocale), so the testing screen does not carry ten locales it never shows.
const LOADERS: Record<string, () => Promise<Locale>> = {
  fr: () => import('date-fns/locale/fr').then((m) => m.fr),
  de: () => import('date-fns/locale/de').then((m) => m.de),
  es: () => import('date-fns/locale/es').then((m) => m.es),
  it: () => import('date-fns/locale/it').then((m) => m.it),
  nl: () => import('date-fns/locale/nl').then((m) => m.nl),
  pl: () => import('date-fns/locale/pl').then((m) => m.pl),
  hu: () => import('date-fns/locale/hu').then((m) => m.hu),
  ru: () => import('date-fns/locale/ru').then((m) => m.ru),
  uk: () => import('date-fns/locale/uk').then((m) => m.uk),
};
const LOCALES: Record<string, Locale> = { 'en-GB': enGB, 'en-US': enUS, en: enGB };

const languageOf = (tag: string) => (tag.replace('_', '-').split('-')[0] ?? '').toLowerCase();

/**
 * Makes a reader's language ready for the formatters (the browser awaits it before the first
 * screen); English and a language without a date-fns locale here resolve at once.
 */
export async function loadLocale(tag: string | undefined): Promise<void> {
  const lang = tag ? languageOf(tag) : '';
  if (LOCALES[lang] || !LOADERS[lang]) return;
  LOCALES[lang] = await LOADERS[lang]();
}

/** The date-fns locale for a BCP 47 tag: the exact region, else the language (once loaded), else British English. */
export function localeFor(tag: string | undefined): Locale {
  if (!tag) return enGB;
  const [, region] = tag.replace('_', '-').split('-');
  const lang = languageOf(tag);
  return LOCALES[`${lang}-${(region ?? '').toUpperCase()}`] ?? LOCALES[lang] ?? enGB;
}

/** The IANA name as Intl spells it, or null when Intl does not know the zone. */
export function canonicalTimeZone(name: string): string | null {
  if (!/^[A-Za-z][A-Za-z0-9_+\-/]{0,63}$/.test(name)) return null;
  try {
    return new Intl.DateTimeFormat('en', { timeZone: name }).resolvedOptions().timeZone;
  } catch {
    return null;
  }
}

/** The zones a person can pick from, as the running engine knows them. */
export function timeZoneChoices(): string[] {
  const known = typeof Intl.supportedValuesOf === 'function' ? Intl.supportedValuesOf('timeZone') : [];
  return known.includes('UTC') ? known : [...known, 'UTC'];
}

const ownZone = () => Intl.DateTimeFormat().resolvedOptions().timeZone;

function zoned(at: Instant, timeZone: string | undefined): TZDate {
  const ms = at instanceof Date ? at.getTime() : typeof at === 'number' ? at : Date.parse(at);
  return new TZDate(ms, timeZone ?? ownZone());
}

const write = (at: Instant, pattern: string, ctx: DateContext) =>
  format(zoned(at, ctx.timeZone), pattern, { locale: localeFor(ctx.locale) });

/** "2 Dec 2026, 07:14" (en-GB), "Dec 2, 2026, 7:14 AM" (en-US), "2 déc. 2026, 07:14" (fr). */
export const formatDateTime = (at: Instant, ctx: DateContext = {}) => write(at, 'PP, p', ctx);
/** "2 Dec 2026" in the zone: the day an instant fell on there. */
export const formatDate = (at: Instant, ctx: DateContext = {}) => write(at, 'PP', ctx);
/** "07:14" / "7:14 AM". */
export const formatTime = (at: Instant, ctx: DateContext = {}) => write(at, 'p', ctx);
/** "02/12/2026, 07:14": for dense tables. */
export const formatShortDateTime = (at: Instant, ctx: DateContext = {}) => write(at, 'P, p', ctx);

/** "21 Nov, 07:40": for narrow columns where the year is given elsewhere. */
export const formatCompactDateTime = (at: Instant, ctx: DateContext = {}) => write(at, 'd MMM, p', ctx);

/** "UTC+01:00": the zone's offset from UTC at that instant (it changes with summer time). */
export const utcOffsetLabel = (at: Instant, timeZone: string) => `UTC${format(zoned(at, timeZone), 'xxx')}`;

/** "2 Dec 2026, 08:14 (UTC+01:00)": for what is read away from the venue (e-mails, PDFs). */
export const formatDateTimeWithOffset = (at: Instant, ctx: DateContext & { timeZone: string }) =>
  `${formatDateTime(at, ctx)} (${utcOffsetLabel(at, ctx.timeZone)})`;

/** ISO 8601 with the zone's offset, to the second: "2026-12-02T08:14:05+01:00" (for CSV). */
export const isoWithOffset = (at: Instant, timeZone: string) => format(zoned(at, timeZone), "yyyy-MM-dd'T'HH:mm:ssxxx");

/** A calendar day ("2026-11-21") written in the locale: "21 Nov 2026". */
export const formatCalendarDate = (day: string, ctx: Pick<DateContext, 'locale'> = {}) =>
  format(parseISO(day), 'PP', { locale: localeFor(ctx.locale) });

/** The event's days: "21 Nov 2026 – 22 Nov 2026", or one day alone. */
export function formatCalendarRange(startsOn: string, endsOn: string, ctx: Pick<DateContext, 'locale'> = {}): string {
  const [a, b] = [formatCalendarDate(startsOn, ctx), formatCalendarDate(endsOn, ctx)];
  return a === b ? a : `${a} – ${b}`;
}

/** The value of an <input type="datetime-local"> showing an instant in the zone. */
export const toZonedInput = (at: Instant, timeZone?: string) => format(zoned(at, timeZone), "yyyy-MM-dd'T'HH:mm");

/** The instant (ISO, UTC) that an <input type="datetime-local"> value means in the zone; undefined when incomplete. */
export function fromZonedInput(value: string, timeZone?: string): string | undefined {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})$/.exec(value);
  if (!m) return undefined;
  const [y, mo, d, h, mi] = m.slice(1).map(Number);
  const at = new TZDate(y, mo - 1, d, h, mi, timeZone ?? ownZone());
  return Number.isNaN(at.getTime()) ? undefined : new Date(at.getTime()).toISOString();
}
