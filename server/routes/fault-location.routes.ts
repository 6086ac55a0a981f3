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
  const service = faultLocationService(deps.workers);

  api.post('/fault-location', 'signed-in', validate(faultLocationRequestSchema), (req, res) => {
    res.json(service.locate(req.user!, parsed(faultLocationRequestSchema, req.body)));
  });

  // The trace is the body itself (a scope's CSV export), far over the 100 kB JSON limit.
  api.post(
    '/waveforms/analyse',
    'signed-in',
    validate(waveformQuerySchema, 'query'),
    // Kept as bytes: they go to a worker thread whole (moved, not copied) and are decoded there.
    express.raw({ type: [...WAVEFORM_CONTENT_TYPES], limit: WAVEFORM_MAX_BYTES }),
    async (req, res) => {
      if (!Buffer.isBuffer(req.body)) {
        throw new AppError(415, 'unsupported-type', `Send the trace as the request body with Content-Type ${WAVEFORM_CONTENT_TYPES.join(', ')}.`);
      }
      const charset = /;\s*charset="?([^";\s]+)"?/i.exec(req.get('content-type') ?? '')?.[1];
      res.json(await service.analyse(req.user!, req.body, charset, parsed(waveformQuerySchema, req.query)));
    },
  );
  return api;
}
