import { Link } from 'react-router';
import { paths } from '@/config/paths';

/** "Certificates" for a venue, for lists and home pages. */
export function CertificatesLink({ venueId, className = '' }: { venueId: string; className?: string }) {
  return (
    <Link
      className={`inline-flex min-h-touch items-center font-medium text-brand underline ${className}`}
      to={paths.venueCertificates(venueId)}
    >
      Certificates
    </Link>
  );
}
