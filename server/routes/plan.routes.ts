import type { Response } from 'express';
import type { AppDeps } from '../deps';
import { ApiRouter, STAFF } from '../http/api-router';
import { validate } from '../middleware/validate';
import { ifMatchOf, setVersionTag } from '../http/etag';
import { idParams } from '../../shared/schemas/params';
import {
  addPositionSchema,
  addStepSchema,
  attachEquipmentSchema,
  bulkStripsSchema,
  createEventSchema,
  createVenueSchema,
  updateStripSchema,
  updateVenueSchema,
  venueTechniciansSchema,
  withdrawStripSchema,
} from '../../shared/schemas/plan';
import { planService } from '../services/plan.service';

const PLANNERS = ['director'] as const;
const id = validate(idParams, 'params');

// Events, venues and the venue plan. Plan answers carry ETag = the venue's version; every plan
// edit needs If-Match with it (412 when someone else changed the plan meanwhile, 428 without).
export function planRoutes(deps: AppDeps) {
  const api = new ApiRouter();
  const plan = planService(deps);
  const send = (res: Response, body: ReturnType<typeof plan.plan>, status = 200) => {
    setVersionTag(res, body.venue.version);
    res.status(status).json(body);
  };

  api.get('/planning/people', PLANNERS, (req, res) => {
    res.json(plan.people(req.user!));
  });
  api.get('/events', STAFF, (req, res) => {
    res.json(plan.listEvents(req.user!));
  });
  api.post('/events', PLANNERS, validate(createEventSchema), (req, res) => {
    res.status(201).json(plan.createEvent(req.user!, req.body));
  });
  api.get('/events/:id', STAFF, id, (req, res) => {
    res.json(plan.getEvent(req.user!, String(req.params.id)));
  });
  api.post('/events/:id/venues', PLANNERS, id, validate(createVenueSchema), (req, res) => {
    send(res, plan.createVenue(req.user!, String(req.params.id), req.body), 201);
  });

  api.get('/venues/:id', STAFF, id, (req, res) => {
    send(res, plan.plan(req.user!, String(req.params.id)));
  });
  api.patch('/venues/:id', PLANNERS, id, validate(updateVenueSchema), (req, res) => {
    send(res, plan.updateVenue(req.user!, String(req.params.id), ifMatchOf(req), req.body));
  });
  api.post('/venues/:id/strips/bulk', PLANNERS, id, validate(bulkStripsSchema), (req, res) => {
    send(res, plan.addStrips(req.user!, String(req.params.id), ifMatchOf(req), req.body), 201);
  });
  api.put('/venues/:id/technicians', PLANNERS, id, validate(venueTechniciansSchema), (req, res) => {
    send(res, plan.setTechnicians(req.user!, String(req.params.id), ifMatchOf(req), req.body.userIds));
  });

  api.patch('/strips/:id', PLANNERS, id, validate(updateStripSchema), (req, res) => {
    send(res, plan.updateStrip(req.user!, String(req.params.id), ifMatchOf(req), req.body));
  });
  api.post('/strips/:id/withdraw', PLANNERS, id, validate(withdrawStripSchema), (req, res) => {
    send(res, plan.withdrawStrip(req.user!, String(req.params.id), ifMatchOf(req), req.body.reason));
  });
  api.post('/strips/:id/reinstate', PLANNERS, id, (req, res) => {
    send(res, plan.reinstateStrip(req.user!, String(req.params.id), ifMatchOf(req)));
  });

  api.post('/strips/:id/positions', PLANNERS, id, validate(addPositionSchema), (req, res) => {
    send(res, plan.addPosition(req.user!, String(req.params.id), ifMatchOf(req), req.body), 201);
  });
  api.delete('/positions/:id', PLANNERS, id, (req, res) => {
    send(res, plan.removePosition(req.user!, String(req.params.id), ifMatchOf(req)));
  });
  api.put('/positions/:id/equipment', PLANNERS, id, validate(attachEquipmentSchema), (req, res) => {
    send(res, plan.attachEquipment(req.user!, String(req.params.id), ifMatchOf(req), req.body.assetTag));
  });
  api.post('/positions/:id/steps', PLANNERS, id, validate(addStepSchema), (req, res) => {
    send(res, plan.addStep(req.user!, String(req.params.id), ifMatchOf(req), req.body), 201);
  });
  api.delete('/steps/:id', PLANNERS, id, (req, res) => {
    send(res, plan.dropStep(req.user!, String(req.params.id), ifMatchOf(req)));
  });
  return api;
}
