import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { faultsContracts as c } from '../../shared/contracts/faults';
import { faultEtag, faultsService } from '../services/faults.service';

export function faultsRoutes(deps: AppDeps) {
  const api = apiRouter(deps);
  const faults = faultsService(deps);
  api.route(c.ofVenue, ({ user, params }) => faults.list(user, params.id));
  api.route(c.get, ({ user, params, res }) => {
    const fault = faults.detail(user, params.id);
    res.set('ETag', faultEtag(fault.version));
    return fault;
  });
  api.route(c.create, ({ user, body, res }) => {
    const fault = faults.create(user, body);
    res.set('ETag', faultEtag(fault.version)).location(`/api/faults/${fault.id}`);
    return fault;
  });
  api.route(c.update, ({ user, params, body, req, res }) => {
    const fault = faults.update(user, params.id, req.get('If-Match'), body);
    res.set('ETag', faultEtag(fault.version));
    return fault;
  });
  api.route(c.addEstimate, ({ user, params, body, res }) => {
    const out = faults.addEstimate(user, params.id, body);
    res.set('ETag', faultEtag(out.fault.version));
    return out;
  });
  api.route(c.addRepair, ({ user, params, body, res }) => {
    const out = faults.addRepair(user, params.id, body);
    res.set('ETag', faultEtag(out.fault.version));
    return out;
  });
  // The event's director only (checked on the fault's venue); If-Match like any fault edit.
  api.route(c.dismiss, ({ user, params, body, req, res }) => {
    const fault = faults.dismiss(user, params.id, req.get('If-Match'), body);
    res.set('ETag', faultEtag(fault.version));
    return fault;
  });
  return api;
}
