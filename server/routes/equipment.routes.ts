import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { ifMatchOf, setVersionTag } from '../http/etag';
import { equipmentContracts as c } from '../../shared/contracts/equipment';
import { equipmentService } from '../services/equipment.service';

// Technicians and organisers read the register; admins and directors keep it.
export function equipmentRoutes(deps: AppDeps) {
  const api = apiRouter(deps);
  const equipment = equipmentService(deps);
  api.route(c.list, ({ user, query }) => equipment.list(user, query));
  api.route(c.create, ({ user, body, res }) => {
    const item = equipment.create(user, body);
    setVersionTag(res, item.version);
    return item;
  });
  api.route(c.get, ({ user, params, res }) => {
    const detail = equipment.detail(user, params.id);
    setVersionTag(res, detail.item.version);
    return detail;
  });
  api.route(c.update, ({ user, params, body, req, res }) => {
    const item = equipment.update(user, params.id, ifMatchOf(req), body);
    setVersionTag(res, item.version);
    return item;
  });
  api.route(c.calibrate, ({ user, params, body, res }) => {
    const result = equipment.calibrate(user, params.id, body);
    setVersionTag(res, result.item.version);
    return result;
  });
  return api;
}
