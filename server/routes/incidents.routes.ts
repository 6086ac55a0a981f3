import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { incidentsContracts as c } from '../../shared/contracts/incidents';
import { incidentsService } from '../services/incidents.service';
import { sparesService } from '../services/spares.service';
import { amendmentsService } from '../services/amendments.service';
import { incidentReport } from '../services/incident-report.service';
import { slug } from '../services/certificates.service';
import { failedPasswordLimiter } from '../auth/failed-password-limiter';
import { ACCOUNT_THROTTLE, accountThrottle, throttleAccount } from '../auth/throttle';

export function incidentsRoutes(deps: AppDeps) {
  const api = apiRouter(deps);
  const incidents = incidentsService(deps);
  const spares = sparesService(deps);
  const amendments = amendmentsService(deps);

  api.route(c.open, ({ user, params, body, res }) => {
    const { replayed, incident } = incidents.open(user, params.id, body);
    // The same clientId again (a tablet replaying its queue): the incident it made, nothing new.
    res.status(replayed ? 200 : 201).location(`/api/incidents/${incident.id}`);
    return incident;
  });
  api.route(c.ofVenue, ({ user, params }) => incidents.list(user, params.id));
  api.route(c.get, ({ user, params }) => incidents.get(user, params.id));
  api.route(c.swap, ({ user, params, body }) => incidents.swap(user, params.id, body));
  api.route(c.resolve, ({ user, params }) => incidents.resolve(user, params.id));
  api.route(c.spares, ({ user, params }) => spares.get(user, params.id));
  api.route(c.setSpares, ({ user, params, body }) => spares.set(user, params.id, body));
  // The password re-entered to amend is limited like the sign-off password: per address, and per account slowed.
  const perAddress = failedPasswordLimiter(deps.env.SIGNIN_RATE_LIMIT, 'password checks');
  const perAccount = throttleAccount(accountThrottle(ACCOUNT_THROTTLE), (req) => `sign-off:${req.user!.id}`);
  api.route(c.amend, ({ user, params, body }) => amendments.amend(user, params.id, body), { first: [perAddress], after: [perAccount] });
  api.route(c.reportPdf, async ({ user, params, res }) => {
    const report = await incidentReport(deps, user, params.id);
    res.set({
      'Content-Type': 'application/pdf',
      'Content-Disposition': `attachment; filename="incidents-${slug(report.venueName)}.pdf"`,
      'X-Content-Type-Options': 'nosniff',
    });
    res.send(report.pdf);
  });
  return api;
}
