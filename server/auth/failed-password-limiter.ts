import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { sendProblem } from '../middleware/error-handler';

/**
 * Per address: at most `limit` wrong passwords (answers 401) in 15 minutes from one address (an
 * IPv6 /56 counts as one), whichever accounts they name. Successful and refused requests are taken
 * back out of the count, so a venue's tablets behind one address sign in as often as they like.
 * Over the limit: 429 with Retry-After and problem+json, before any password is hashed.
 */
export function failedPasswordLimiter(limit: number, what: string) {
  return rateLimit({
    windowMs: 15 * 60_000,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => ipKeyGenerator(req.ip ?? ''),
    skipSuccessfulRequests: true,
    requestWasSuccessful: (_req, res) => res.statusCode !== 401,
    handler: (_req, res) =>
      sendProblem(res, 429, 'too-many-attempts', `Too many failed ${what} from this address. Wait a few minutes and try again.`),
  });
}
