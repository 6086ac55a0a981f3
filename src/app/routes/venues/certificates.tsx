import { useState } from 'react';
import { Link, useParams } from 'react-router';
import { useDates } from '@/lib/date-format';
import { useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { revokeCertificateSchema, type RevokeCertificateInput } from '@shared/schemas/sign-off';
import {
  certificatePdfUrl,
  certificatesZipUrl,
  useCertificates,
  type CertificateSummary,
} from '@/features/certificates/api/get-certificates';
import { useRevokeCertificate } from '@/features/certificates/api/revoke-certificate';
import { CertificateStatusBadge } from '@/features/certificates/components/certificate-status';
import { incidentReportUrl } from '@/features/incidents/api/get-venue-incidents';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { paths } from '@/config/paths';

const linkClass = 'inline-flex min-h-touch items-center rounded-lg border border-line bg-card px-4 font-medium text-brand hover:bg-paper';

function RevokeForm({ venueId, number, onDone }: { venueId: string; number: string; onDone: () => void }) {
  const revoke = useRevokeCertificate(venueId);
  const form = useForm<RevokeCertificateInput>({ resolver: zodResolver(revokeCertificateSchema), defaultValues: { reason: '' } });
  const reason = useWatch({ control: form.control, name: 'reason' });
  return (
    <form
      noValidate
      className="mt-2 flex flex-wrap items-end gap-3 rounded-lg bg-fail-soft p-3"
      onSubmit={form.handleSubmit((v) => revoke.mutate({ number, reason: v.reason }, { onSuccess: onDone }))}
    >
      <TextField
        className="min-w-72 flex-1"
        label={`Why is ${number} revoked?`}
        id={`f-reason-${number}`}
        {...form.register('reason')}
        error={form.formState.errors.reason?.message}
      />
      <Button type="submit" variant="danger" disabled={!revokeCertificateSchema.safeParse({ reason }).success || revoke.isPending}>
        Revoke
      </Button>
      <Button variant="ghost" onClick={onDone}>
        Cancel
      </Button>
      {revoke.isError && <Notice tone="error">{revoke.error.message}</Notice>}
    </form>
  );
}

function CertificateRow({ c, venueId, canRevoke }: { c: CertificateSummary; venueId: string; canRevoke: boolean }) {
  const [revoking, setRevoking] = useState(false);
  const dates = useDates();
  return (
    <li className="py-3" data-testid={`certificate-${c.number}`}>
      <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
        <span className="min-w-28 font-semibold">{c.kind === 'venue' ? 'Venue' : c.stripLabel}</span>
        <span className="font-mono text-sm">{c.number}</span>
        <CertificateStatusBadge status={c.status} />
        <span className="ml-auto flex flex-wrap gap-2">
          <a className={linkClass} href={certificatePdfUrl(c.number)} download>
            Download PDF
          </a>
          <Link className={linkClass} to={paths.verify(c.number)}>
            Verification page
          </Link>
          {canRevoke && c.status !== 'revoked' && !revoking && (
            <Button variant="ghost" onClick={() => setRevoking(true)}>
              Revoke…
            </Button>
          )}
        </span>
      </div>
      {c.status === 'valid' && c.supersededPendingSince && (
        <p className="mt-1 text-sm text-near">
          Its strip changed on {dates.dateTime(c.supersededPendingSince)}: superseded once the venue is amended.
        </p>
      )}
      {c.successorNumber && (
        <p className="mt-1 text-sm text-ink-soft">
          Replaced by{' '}
          <Link className="font-mono text-brand underline" to={paths.verify(c.successorNumber)}>
            {c.successorNumber}
          </Link>
        </p>
      )}
      {c.status === 'revoked' && (
        <p className="mt-1 text-sm text-fail">
          Revoked {c.revokedAt && dates.dateTime(c.revokedAt)}: {c.revokedReason}
        </p>
      )}
      {revoking && <RevokeForm venueId={venueId} number={c.number} onDone={() => setRevoking(false)} />}
    </li>
  );
}

/** The venue's certificates: each PDF, all as a ZIP, their public pages, and revocation. */
export default function CertificatesPage() {
  const { venueId = '' } = useParams();
  const q = useCertificates(venueId);
  const dates = useDates();
  if (q.isPending) return <Loading />;
  if (q.isError) return <Notice tone="error">{q.error.message}</Notice>;
  const { venue, event, certificates, canRevoke } = q.data;
  const groups = new Map<string, CertificateSummary[]>();
  for (const c of certificates) groups.set(c.signOffId, [...(groups.get(c.signOffId) ?? []), c]);
  const [latest, ...earlier] = [...groups.values()];
  return (
    <>
      <PageHeader
        title={`Certificates: ${venue.name}`}
        subtitle={event.name}
        actions={
          <>
            <Link className={linkClass} to={paths.venueSignOff(venueId)}>
              Sign-off
            </Link>
            {latest && (
              <Link className={linkClass} to={paths.venueIncidents(venueId)}>
                Incidents
              </Link>
            )}
            {latest && (
              <a className={linkClass} href={incidentReportUrl(venueId)} download>
                Incident report (PDF)
              </a>
            )}
            {latest && (
              <a
                className="inline-flex min-h-touch items-center rounded-lg bg-brand px-4 font-medium text-white"
                href={certificatesZipUrl(venueId)}
                download
              >
                Download all (ZIP)
              </a>
            )}
          </>
        }
      />
      {!latest && (
        <Card>
          <p className="text-ink-soft">
            No certificates yet. They are issued when the technical director signs the venue off on the{' '}
            <Link className="font-medium text-brand underline" to={paths.venueSignOff(venueId)}>
              sign-off page
            </Link>
            .
          </p>
        </Card>
      )}
      {latest && (
        <Card>
          <h2 className="text-lg font-semibold">
            Signed by {latest[0].signedBy} on {dates.dateTime(latest[0].signedAt)}
          </h2>
          {venue.status !== 'signed-off' && (
            <p className="mt-1 text-sm text-ink-soft">
              The venue changed after this sign-off, so these certificates are superseded until it is signed off again.
            </p>
          )}
          <ul className="mt-2 divide-y divide-line">
            {latest.map((c) => (
              <CertificateRow key={c.number} c={c} venueId={venueId} canRevoke={canRevoke} />
            ))}
          </ul>
        </Card>
      )}
      {earlier.length > 0 && (
        <details className="mt-6 rounded-card border border-line bg-card p-5">
          <summary className="min-h-touch cursor-pointer font-semibold">Earlier sign-offs ({earlier.length})</summary>
          {earlier.map((g) => (
            <div key={g[0].signOffId} className="mt-4">
              <h3 className="font-medium">
                {g[0].signedBy}, {dates.dateTime(g[0].signedAt)}
              </h3>
              <ul className="divide-y divide-line">
                {g.map((c) => (
                  <CertificateRow key={c.number} c={c} venueId={venueId} canRevoke={canRevoke} />
                ))}
              </ul>
            </div>
          ))}
        </details>
      )}
    </>
  );
}
