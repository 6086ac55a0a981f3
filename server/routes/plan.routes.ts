import type { Response } from 'express';
import type { AppDeps } from '../deps';
import { apiRouter } from '../http/api-router';
import { ifMatchOf, setVersionTag } from '../http/etag';
import { planContracts as c, type VenuePlan } from '../../shared/contracts/plan';
import { eventsService } from '../services/events.service';
import { venuePlanService } from '../services/venue-plan.service';
import { stripPlanService } from '../services/strip-plan.service';
import { assetTagsService } from '../services/asset-tags.service';

// Events, venues and the venue plan. Plan answers carry ETag = the venue's version; every plan
// edit needs If-Match with it (412 when someone else changed the plan meanwhile, 428 without).
export function planRoutes(deps: AppDeps) {
  const api = apiRouter(deps);
  const events = eventsService(deps);
  const venue = venuePlanService(deps);
  const strip = stripPlanService(deps);
  const tags = assetTagsService(deps);
  const tagged = (res: Response, plan: VenuePlan) => {
    setVersionTag(res, plan.venue.version);
    return plan;
  };

  api.route(c.people, ({ user }) => events.people(user));
  api.route(c.listEvents, ({ user }) => events.listEvents(user));
  api.route(c.createEvent, ({ user, body }) => events.createEvent(user, body));
  api.route(c.getEvent, ({ user, params }) => events.getEvent(user, params.id));
  api.route(c.createVenue, ({ user, params, body, res }) => tagged(res, venue.createVenue(user, params.id, body)));

  api.route(c.getPlan, ({ user, params, res }) => tagged(res, venue.plan(user, params.id)));
  api.route(c.updateVenue, ({ user, params, body, req, res }) => tagged(res, venue.updateVenue(user, params.id, ifMatchOf(req), body)));
  api.route(c.addStrips, ({ user, params, body, req, res }) => tagged(res, venue.addStrips(user, params.id, ifMatchOf(req), body)));
  api.route(c.setAssetTags, ({ user, params, body, req, res }) =>
    tagged(res, tags.setAssetTags(user, params.id, ifMatchOf(req), body.positions)),
  );
  api.route(c.setTechnicians, ({ user, params, body, req, res }) =>
    tagged(res, venue.setTechnicians(user, params.id, ifMatchOf(req), body.userIds)),
  );

  api.route(c.updateStrip, ({ user, params, body, req, res }) => tagged(res, strip.updateStrip(user, params.id, ifMatchOf(req), body)));
  api.route(c.withdrawStrip, ({ user, params, body, req, res }) =>
    tagged(res, strip.withdrawStrip(user, params.id, ifMatchOf(req), body.reason)),
  );
  api.route(c.reinstateStrip, ({ user, params, req, res }) => tagged(res, strip.reinstateStrip(user, params.id, ifMatchOf(req))));
  api.route(c.addPosition, ({ user, params, body, req, res }) => tagged(res, strip.addPosition(user, params.id, ifMatchOf(req), body)));

  api.route(c.removePosition, ({ user, params, req, res }) => tagged(res, strip.removePosition(user, params.id, ifMatchOf(req))));
  api.route(c.attachEquipment, ({ user, params, body, req, res }) =>
    tagged(res, strip.attachEquipment(user, params.id, ifMatchOf(req), body.assetTag)),
  );
  api.route(c.addStep, ({ user, params, body, req, res }) => tagged(res, strip.addStep(user, params.id, ifMatchOf(req), body)));
  api.route(c.dropStep, ({ user, params, req, res }) => tagged(res, strip.dropStep(user, params.id, ifMatchOf(req))));
  return api;
}
