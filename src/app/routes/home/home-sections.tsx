import type { ComponentType } from 'react';
import { Link } from 'react-router';
import type { Role } from '@shared/schemas/common';
import { Card } from '@/components/ui/card';
import { paths } from '@/config/paths';
import { VenueList } from '@/features/board/components/venue-list';
import { CertificatesLink } from '@/features/certificates/components/certificates-link';
import { incidentReportUrl } from '@/features/incidents/api/get-venue-incidents';

const ADMIN_CARDS = [
  {
    title: 'People',
    text: 'Invite people, change roles, disable accounts, sign someone out everywhere.',
    to: paths.people,
    link: 'Open people',
  },
  {
    title: 'Equipment register',
    text: 'Every cable, reel, piste and apparatus by asset tag, with its history; import from a spreadsheet.',
    to: paths.equipment,
    link: 'Open the register',
  },
  {
    title: 'Limit profiles',
    text: 'The limits readings are checked against, with their sources. Edits make a new version.',
    to: paths.profiles,
    link: 'Open limit profiles',
  },
  {
    title: 'Outbox',
    text: 'Messages the app has sent (kept locally when no SMTP server is configured).',
    to: paths.outbox,
    link: 'Open outbox',
  },
];

function AdminHome() {
  return (
    <div className="grid gap-4 sm:grid-cols-2">
      {ADMIN_CARDS.map((c) => (
        <Card key={c.to}>
          <h2 className="text-lg font-semibold">{c.title}</h2>
          <p className="mt-1 text-sm text-ink-soft">{c.text}</p>
          <Link className="mt-3 inline-flex min-h-touch items-center font-medium text-brand underline" to={c.to}>
            {c.link}
          </Link>
        </Card>
      ))}
    </div>
  );
}

function VenuesHome() {
  return <VenueList />;
}

const buttonLink = 'inline-flex min-h-touch items-center rounded-lg border border-line px-4 font-medium';

function DirectorHome() {
  return (
    <VenueList
      actions={(v) => (
        <>
          <Link to={paths.venueSignOff(v.id)} className={buttonLink}>
            {v.status === 'signed-off' ? 'Signed off' : 'Sign-off'}
          </Link>
          <CertificatesLink venueId={v.id} className="px-2" />
          {v.status === 'signed-off' && (
            <Link to={paths.venueIncidents(v.id)} className={buttonLink}>
              Incidents
            </Link>
          )}
        </>
      )}
    />
  );
}

function OrganiserHome() {
  return (
    <VenueList
      actions={(v) => (
        <>
          <CertificatesLink venueId={v.id} className="px-2" />
          {v.status === 'signed-off' && (
            <a
              href={incidentReportUrl(v.id)}
              download
              className="inline-flex min-h-touch items-center px-2 font-medium text-brand underline"
            >
              Incident report (PDF)
            </a>
          )}
        </>
      )}
    />
  );
}

export const homeSections: Record<Role, ComponentType> = {
  admin: AdminHome,
  director: DirectorHome,
  organiser: OrganiserHome,
  technician: VenuesHome,
};
