import { Link } from 'react-router';
import { paths } from '@/config/paths';

/** "Sign-off" for a venue: readiness and, for the event's director, the sign-off itself. */
export function SignOffLink({ venueId, className = '' }: { venueId: string; className?: string }) {
  return (
    <Link className={`inline-flex min-h-touch items-center font-medium text-brand underline ${className}`} to={paths.venueSignOff(venueId)}>
      Sign-off
    </Link>
  );
}
