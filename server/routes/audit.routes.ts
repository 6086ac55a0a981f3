import type { AppDeps } from '../deps';
import { ApiRouter } from '../http/api-router';
import { validate } from '../middleware/validate';
import { idParams } from '../../shared/schemas/params';
import { auditQuerySchema } from '../../shared/schemas/audit';
import { auditService } from '../services/audit.service';

export function auditRoutes(deps: AppDeps) {
  const api = new ApiRouter();
  const audit = auditService(deps);

  api.get('/audit', ['admin', 'director'], validate(auditQuerySchema, 'query'), (req, res) => {
    res.json(audit.list(req.user!, req.query as { entityType?: string; entityId?: string }));
  });
  api.get('/venues/:id/audit', ['admin', 'director', 'organiser'], validate(idParams, 'params'), (req, res) => {
    res.json(audit.ofVenue(req.user!, String(req.params.id)));
  });
  return api;
}
