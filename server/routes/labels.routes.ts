import type { Response } from 'express';
import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { labelsContracts as c } from '../../shared/contracts/labels';
import { labelsService } from '../services/labels.service';
import { slug } from '../services/certificates.service';

function sendPdf(res: Response, fileName: string, pdf: Buffer) {
  res.set({
    'Content-Type': 'application/pdf',
    // Shown in the browser's viewer first, to print from there; the name is slugged (OWASP ASVS 5.4.1).
    'Content-Disposition': `inline; filename="${fileName}"`,
    'X-Content-Type-Options': 'nosniff',
  });
  res.send(pdf);
}

// Mounted before the register's routes: /equipment/labels.pdf is not an item id.
export function labelsRoutes(deps: AppDeps) {
  const api = apiRouter(deps);
  const labels = labelsService(deps);
  api.route(c.venueSheet, async ({ user, params, res }) => {
    const { pdf, venueName } = await labels.venueSheet(user, params.id);
    sendPdf(res, `labels-${slug(venueName)}.pdf`, pdf);
  });
  api.route(c.registerSheet, async ({ user, query, res }) => {
    sendPdf(res, 'labels-equipment-register.pdf', await labels.registerSheet(user, query));
  });
  api.route(c.lookupTag, ({ user, params }) => labels.lookupTag(user, params.tag));
  return api;
}
