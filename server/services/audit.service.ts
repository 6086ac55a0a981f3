// Who changed what and when: plans, profiles, equipment, readings and faults.
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import { auditTrailRepository } from '../db/audit-trail.repository';
import { accessService } from './access.service';

export function auditService(deps: AppDeps) {
  const repo = auditTrailRepository(deps.db);
  const access = accessService(deps.db);
  const present = (rows: ReturnType<typeof repo.list>) =>
    rows.map(({ detailJson, ...r }) => ({ ...r, detail: JSON.parse(detailJson) as Record<string, unknown> }));

  return {
    list: (user: AuthUser, f: { entityType?: string | undefined; entityId?: string | undefined }) =>
      present(repo.list({ orgId: user.orgId, ...f })),
    ofVenue(user: AuthUser, venueId: string) {
      access.requireVenue(user, venueId, 'read');
      return present(repo.ofVenue(user.orgId, venueId));
    },
  };
}
