import type { AppDeps } from '../deps';
import { ApiRouter, STAFF } from '../http/api-router';
import { validate } from '../middleware/validate';
import { idParams } from '../../shared/schemas/params';
import { createFaultSchema, createRepairSchema, dismissFaultSchema, updateFaultSchema } from '../../shared/schemas/faults';
import { faultEtag, faultsService } from '../services/faults.service';
import { TESTERS } from './readings.routes';

export function faultsRoutes(deps: AppDeps) {
  const api = new ApiRouter();
  const faults = faultsService(deps);

  api.get('/venues/:id/faults', STAFF, validate(idParams, 'params'), (req, res) => {
    res.json(faults.list(req.user!, String(req.params.id)));
  });
  api.get('/faults/:id', STAFF, validate(idParams, 'params'), (req, res) => {
    const fault = faults.detail(req.user!, String(req.params.id));
    res.set('ETag', faultEtag(fault.version)).json(fault);
  });
  api.post('/faults', TESTERS, validate(createFaultSchema), (req, res) => {
    const fault = faults.create(req.user!, req.body);
    res.status(201).set('ETag', faultEtag(fault.version)).location(`/api/faults/${fault.id}`).json(fault);
  });
  api.patch('/faults/:id', TESTERS, validate(idParams, 'params'), validate(updateFaultSchema), (req, res) => {
    const fault = faults.update(req.user!, String(req.params.id), req.get('If-Match'), req.body);
    res.set('ETag', faultEtag(fault.version)).json(fault);
  });
  // The body is one fault-location request (see shared/schemas/fault-location.ts) plus fromEnd;
  // the service validates it, filling the item's length when it is left out.
  api.post('/faults/:id/estimates', TESTERS, validate(idParams, 'params'), (req, res) => {
    const out = faults.addEstimate(req.user!, String(req.params.id), req.body);
    res.status(201).set('ETag', faultEtag(out.fault.version)).json(out);
  });
  api.post('/faults/:id/repairs', TESTERS, validate(idParams, 'params'), validate(createRepairSchema), (req, res) => {
    const out = faults.addRepair(req.user!, String(req.params.id), req.body);
    res.status(201).set('ETag', faultEtag(out.fault.version)).json(out);
  });
  // The event's director only (checked on the fault's venue); If-Match like any fault edit.
  api.post('/faults/:id/dismiss', ['director'], validate(idParams, 'params'), validate(dismissFaultSchema), (req, res) => {
    const fault = faults.dismiss(req.user!, String(req.params.id), req.get('If-Match'), req.body);
    res.set('ETag', faultEtag(fault.version)).json(fault);
  });
  return api;
}
