import type { ReactNode } from 'react';
import { useParams } from 'react-router';
import { useVenues } from '@/features/board/api/get-venues';
import { useStrip } from '@/features/testing/api/get-strip';
import { TimeZoneProvider } from '@/lib/date-format';

/** The venue's time zone, from the venues list (kept on the tablet), for everything under it. */
export function useVenueTimeZone(venueId: string | undefined): string | undefined {
  const venues = useVenues();
  return venueId ? venues.data?.find((v) => v.id === venueId)?.timeZone : undefined;
}

/** A venue's pages show their times in the venue's clock (the route's :venueId, or the one given). */
export function VenueClock({ venueId, children }: { venueId?: string; children: ReactNode }) {
  const params = useParams();
  const zone = useVenueTimeZone(venueId ?? params.venueId);
  return <TimeZoneProvider timeZone={zone}>{children}</TimeZoneProvider>;
}

/** The testing screen: the strip's venue's clock (the strip is kept on the tablet, so offline too). */
export function StripClock({ children }: { children: ReactNode }) {
  const { stripId = '' } = useParams();
  const strip = useStrip(stripId);
  const zone = useVenueTimeZone(strip.data?.venueId);
  return <TimeZoneProvider timeZone={zone}>{children}</TimeZoneProvider>;
}
