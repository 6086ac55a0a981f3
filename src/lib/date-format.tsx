// The screens' dates and times: shared/format/date-time in the browser's locale and, on a venue's
// pages, in the venue's time zone (given by the page through <TimeZoneProvider>); elsewhere the
// reader's own zone.
import { createContext, useContext, useMemo, type ReactNode } from 'react';
import {
  formatCalendarDate,
  formatCalendarRange,
  formatDate,
  formatDateTime,
  formatDateTimeWithOffset,
  formatShortDateTime,
  formatTime,
  fromZonedInput,
  toZonedInput,
  utcOffsetLabel,
  type Instant,
} from '@shared/format/date-time';

const TimeZoneContext = createContext<string | undefined>(undefined);

export function TimeZoneProvider({ timeZone, children }: { timeZone: string | undefined; children: ReactNode }) {
  return <TimeZoneContext.Provider value={timeZone}>{children}</TimeZoneContext.Provider>;
}

const ownZone = () => Intl.DateTimeFormat().resolvedOptions().timeZone;
const browserLocale = () => (typeof navigator === 'undefined' ? undefined : navigator.language);

/** The formatters; `zone` overrides the provider's (a page that learns its venue's zone itself). */
export function useDates(zone?: string) {
  const given = useContext(TimeZoneContext);
  const timeZone = zone ?? given;
  const locale = browserLocale();
  return useMemo(() => {
    const ctx = { locale, timeZone };
    return {
      timeZone,
      dateTime: (at: Instant) => formatDateTime(at, ctx),
      /** With the zone's offset, for pages read anywhere (the public check). */
      dateTimeWithOffset: (at: Instant) => formatDateTimeWithOffset(at, { locale, timeZone: timeZone ?? ownZone() }),
      date: (at: Instant) => formatDate(at, ctx),
      time: (at: Instant) => formatTime(at, ctx),
      shortDateTime: (at: Instant) => formatShortDateTime(at, ctx),
      calendarDate: (day: string) => formatCalendarDate(day, ctx),
      calendarRange: (startsOn: string, endsOn: string) => formatCalendarRange(startsOn, endsOn, ctx),
      /** "Europe/Paris, UTC+01:00" for a heading or a tooltip; the reader's own zone when none is given. */
      zoneLabel: (at: Instant = Date.now()) => {
        const zone = timeZone ?? ownZone();
        return `${zone}, ${utcOffsetLabel(at, zone)}`;
      },
      toInput: (at: Instant) => toZonedInput(at, timeZone),
      fromInput: (value: string) => fromZonedInput(value, timeZone),
    };
  }, [locale, timeZone]);
}
export type Dates = ReturnType<typeof useDates>;
