import { Link, useParams } from 'react-router';
import { useVenueAudit } from '@/features/audit/api/get-venue-audit';
import { AuditList } from '@/features/audit/components/audit-list';
import { usePlan } from '@/features/plan/api/get-plan';
import { Card, Loading, Notice, PageHeader } from '@/components/ui/card';
import { paths } from '@/config/paths';

export default function VenueAuditPage() {
  const { venueId = '' } = useParams();
  const audit = useVenueAudit(venueId);
  const plan = usePlan(venueId);
  return (
    <>
      <PageHeader
        title={`Audit trail${plan.data ? `: ${plan.data.venue.name}` : ''}`}
        subtitle={
          <>
            Who changed the plan, the readings and the faults, and when.{' '}
            <Link className="text-brand underline" to={paths.venuePlan(venueId)}>
              Open the plan
            </Link>
          </>
        }
      />
      <Card className="p-0!">
        {audit.isPending && <Loading />}
        {audit.isError && <Notice tone="error">{audit.error.message}</Notice>}
        {audit.data && <AuditList entries={audit.data} />}
      </Card>
    </>
  );
}
