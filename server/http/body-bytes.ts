// A text body (an uploaded trace) received chunk by chunk into a ReceivedBody (server/workers/
// parcel.ts): each chunk leaves the event loop's heap as it arrives and the worker that reads the
// trace gets them whole. Nothing joins 40 MB in one piece here: express.raw's join held the event
// loop for 50–100 ms, and a buffer of the whole body set off a full collection of this heap.
import express, { type RequestHandler } from 'express';
import { AppError } from '../lib/app-error';
import { ReceivedBody } from '../workers/parcel';

const incomplete = () =>
  new AppError(400, 'incomplete-body', 'The upload did not arrive whole (its size is not the one announced). Send it again.');

export function bodyBytes(opts: { contentTypes: readonly string[]; maxBytes: number }): RequestHandler {
  const types = [...opts.contentTypes];
  // Everything but the usual case goes through express.raw: an unknown length (chunked), a content
  // coding to undo, a body over the limit (refused there from its length, unread), another type.
  const general = express.raw({ type: types, limit: opts.maxBytes });
  return (req, res, next) => {
    const declared = req.headers['content-length'];
    const length = declared === undefined ? NaN : Number(declared);
    const coding = (req.headers['content-encoding'] ?? 'identity').toLowerCase();
    const body = new ReceivedBody();
    // Whatever becomes of the request, what nobody read is freed once the answer has gone.
    res.once('close', () => body.close());
    if (
      !Number.isSafeInteger(length) ||
      length <= 0 ||
      length > opts.maxBytes ||
      coding !== 'identity' ||
      req.headers['transfer-encoding'] !== undefined ||
      !req.is(types)
    ) {
      return general(req, res, (err?: unknown) => {
        if (err) return next(err);
        // Another type leaves no bytes: the contract's check answers 415.
        if (Buffer.isBuffer(req.body)) {
          body.add(req.body);
          req.body = body;
        }
        next();
      });
    }
    let settled = false;
    const settle = (err?: unknown) => {
      if (settled) return;
      settled = true;
      req.off('data', onData);
      if (err) next(err);
      else {
        req.body = body;
        next();
      }
    };
    // Node's HTTP parser never delivers more than Content-Length; checked anyway, as the parser does.
    const onData = (chunk: Buffer) => {
      if (body.byteLength + chunk.length > length) return settle(incomplete());
      body.add(chunk);
    };
    req.on('data', onData);
    req.once('end', () => settle(body.byteLength === length ? undefined : incomplete()));
    // The client went away: nobody reads the answer, but the chain must still end.
    req.once('aborted', () => settle(incomplete()));
    req.once('error', (err) => settle(err));
  };
}
