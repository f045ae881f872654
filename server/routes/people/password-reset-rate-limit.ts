import type { RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { AppDeps } from '../../deps';
import type { ApiErrorBody } from '../../http-error';
import { HttpStatus } from '../../http-status';
import { normaliseEmail } from '../../services/people';

/**
 * Counts "forgot password" requests per client address and e-mail address,
 * answered or not, so the form cannot be used to flood someone's inbox. The
 * limit is the same whether the address has an account or not.
 */
export function passwordResetRateLimit(deps: Pick<AppDeps, 'env'>): RequestHandler {
  const windowMinutes = Math.ceil(deps.env.SIGN_IN_RATE_LIMIT_WINDOW_MS / 60_000);
  return rateLimit({
    windowMs: deps.env.SIGN_IN_RATE_LIMIT_WINDOW_MS,
    limit: deps.env.PASSWORD_RESET_RATE_LIMIT_MAX,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => {
      const email = typeof req.body?.email === 'string' ? normaliseEmail(req.body.email) : '';
      return `${ipKeyGenerator(req.ip ?? 'unknown')}|${email}`;
    },
    handler: (_req, res) => {
      const body: ApiErrorBody = {
        error: { message: `Too many password links were asked for this address; wait ${windowMinutes} minute(s) and try again.` },
      };
      res.status(HttpStatus.TOO_MANY_REQUESTS).json(body);
    },
  });
}
