import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { readingsTableContracts as c } from '../../shared/contracts/readings-table';
import { readingsTableService } from '../services/readings-table.service';

export function readingsTableRoutes(deps: AppDeps) {
  const api = apiRouter(deps);
  const table = readingsTableService(deps);
  api.route(c.list, ({ user, params, query }) => table.list(user, params.id, query));
  api.route(c.csv, ({ user, params, query, res }) => {
    const { fileName, body } = table.csv(user, params.id, query);
    res.set('Content-Type', 'text/csv; charset=utf-8');
    res.set('Content-Disposition', `attachment; filename="${fileName}"`);
    res.send(body);
  });
  return api;
}
