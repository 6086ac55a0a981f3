import express from 'express';
import type { AppDeps } from '../deps';
import { ApiRouter } from '../http/api-router';
import { parsed, validate } from '../middleware/validate';
import { AppError } from '../lib/app-error';
import { faultLocationRequestSchema } from '../../shared/schemas/fault-location';
import { WAVEFORM_CONTENT_TYPES, WAVEFORM_MAX_BYTES, waveformQuerySchema } from '../../shared/schemas/waveforms';
import { faultLocationService } from '../services/fault-location.service';

export function faultLocationRoutes(deps: AppDeps) {
  const api = new ApiRouter();
  const service = faultLocationService(deps.env);

  api.post('/fault-location', 'signed-in', validate(faultLocationRequestSchema), (req, res) => {
    res.json(service.locate(req.user!, parsed(faultLocationRequestSchema, req.body)));
  });

  // The trace is the body itself (a scope's CSV export), far over the 100 kB JSON limit.
  api.post(
    '/waveforms/analyse',
    'signed-in',
    validate(waveformQuerySchema, 'query'),
    express.text({ type: [...WAVEFORM_CONTENT_TYPES], limit: WAVEFORM_MAX_BYTES }),
    (req, res) => {
      if (typeof req.body !== 'string') {
        throw new AppError(415, 'unsupported-type', `Send the trace as the request body with Content-Type ${WAVEFORM_CONTENT_TYPES.join(', ')}.`);
      }
      res.json(service.analyse(req.user!, req.body, parsed(waveformQuerySchema, req.query)));
    },
  );
  return api;
}
