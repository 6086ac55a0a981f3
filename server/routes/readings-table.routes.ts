import type { AppDeps } from '../deps';
import { ApiRouter, STAFF } from '../http/api-router';
import { parsed, validate } from '../middleware/validate';
import { idParams } from '../../shared/schemas/params';
import { readingsTableService } from '../services/readings-table.service';
import { readingsFilterSchema } from '../../shared/schemas/readings-table';

export function readingsTableRoutes(deps: AppDeps) {
  const api = new ApiRouter();
  const table = readingsTableService(deps);

  api.get('/venues/:id/readings', STAFF, validate(idParams, 'params'), validate(readingsFilterSchema, 'query'), (req, res) => {
    res.json(table.list(req.user!, String(req.params.id), parsed(readingsFilterSchema, req.query)));
  });
  api.get('/venues/:id/readings.csv', STAFF, validate(idParams, 'params'), validate(readingsFilterSchema, 'query'), (req, res) => {
    const { fileName, body } = table.csv(req.user!, String(req.params.id), parsed(readingsFilterSchema, req.query));
    res.set('Content-Type', 'text/csv; charset=utf-8');
    res.set('Content-Disposition', `attachment; filename="${fileName}"`);
    res.send(body);
  });
  return api;
}
