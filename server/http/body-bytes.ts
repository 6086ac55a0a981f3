// A text body (an uploaded trace) read straight into one buffer of its declared length, chunk by
// chunk as it arrives. express.raw keeps the chunks and joins them at the end: for a 40 MB trace
// that one copy held the event loop for 50–100 ms, and every reading waiting behind it with it.
// The buffer is the whole of its own memory, so it moves to a worker thread without another copy.
import express, { type RequestHandler } from 'express';
import { AppError } from '../lib/app-error';

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
    if (
      !Number.isSafeInteger(length) ||
      length <= 0 ||
      length > opts.maxBytes ||
      coding !== 'identity' ||
      req.headers['transfer-encoding'] !== undefined ||
      !req.is(types)
    ) {
      return general(req, res, next);
    }
    const body = Buffer.allocUnsafeSlow(length);
    let received = 0;
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
      if (received + chunk.length > length) return settle(incomplete());
      chunk.copy(body, received);
      received += chunk.length;
    };
    req.on('data', onData);
    req.once('end', () => settle(received === length ? undefined : incomplete()));
    // The client went away: nobody reads the answer, but the chain must still end.
    req.once('aborted', () => settle(incomplete()));
    req.once('error', (err) => settle(err));
  };
}
