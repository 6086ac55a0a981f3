import { useState } from 'react';
import { Link, useParams } from 'react-router';
import { useDates } from '@/lib/date-format';
import { useReadiness } from '@/features/sign-off/api/get-readiness';
import type { SignOffResult } from '@/features/sign-off/api/sign-off-venue';
import { SignOffForm } from '@/features/sign-off/components/sign-off-form';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { paths } from '@/config/paths';

const linkClass = 'inline-flex min-h-touch items-center rounded-lg border border-line bg-card px-4 font-medium text-brand hover:bg-paper';

/** The director signs a venue off; everyone who may read it sees how ready it is. */
export default function SignOffPage() {
  const { venueId = '' } = useParams();
  const readiness = useReadiness(venueId);
  const dates = useDates();
  const [signed, setSigned] = useState<SignOffResult | null>(null);
  if (readiness.isPending) return <Loading />;
  if (readiness.isError) return <Notice tone="error">{readiness.error.message}</Notice>;
  const r = readiness.data;
  return (
    <>
      <PageHeader
        title={`Sign-off: ${r.venue.name}`}
        subtitle={`${r.event.name} · ${dates.calendarRange(r.event.startsOn, r.event.endsOn)}`}
        actions={
          <>
            <Link className={linkClass} to={paths.venue(venueId)}>
              Venue
            </Link>
            <Link className={linkClass} to={paths.venueCertificates(venueId)}>
              Certificates
            </Link>
          </>
        }
      />
      {signed && (
        <div className="mb-6">
          <Card className="border-pass/50 bg-pass-soft">
            <h2 className="text-xl font-semibold text-pass">✓ Signed off. {signed.certificates.length} certificates issued.</h2>
            <p className="mt-1">The organiser and you have been sent an e-mail with the links.</p>
            <ul className="mt-3 flex flex-col gap-1 text-sm">
              {signed.certificates.map((c) => (
                <li key={c.number}>
                  <Link className="font-mono underline" to={paths.verify(c.number)}>
                    {c.number}
                  </Link>{' '}
                  ({c.kind === 'venue' ? 'venue' : r.strips.find((s) => s.stripId === c.stripId)?.label})
                </li>
              ))}
            </ul>
            <Link
              className="mt-4 inline-flex min-h-touch items-center rounded-lg bg-brand px-4 font-medium text-white"
              to={paths.venueCertificates(venueId)}
            >
              Open the certificates
            </Link>
          </Card>
        </div>
      )}
      {!signed && r.venue.status === 'signed-off' && (
        <div className="mb-6">
          <Notice tone="success">
            This venue was signed off{r.signedOff ? ` on ${dates.dateTime(r.signedOff.signedAt)}` : ''}. A reading, repair or swap on one
            strip now puts only that strip out of service until you amend the venue for it on the{' '}
            <Link className="font-medium underline" to={paths.venueIncidents(venueId)}>
              incidents page
            </Link>
            ; a change to the plan re-opens the venue.{' '}
            <Link className="font-medium underline" to={paths.venueCertificates(venueId)}>
              See its certificates
            </Link>
            .
          </Notice>
        </div>
      )}
      <SignOffForm readiness={r} onSigned={setSigned} />
    </>
  );
}
