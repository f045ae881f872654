import type { RequestHandler } from 'express';
import type { AppDeps } from '../../deps';
import { HttpError } from '../../http-error';
import { HttpStatus } from '../../http-status';
import type { ListOutboundMailQuery } from '../../../shared/schemas/admin';
import { recordAuditEvent } from '../../services/audit-log';
import { actorOf } from '../../services/catalogue-queries';
import { retryMailNow } from '../../services/outbound-mail/retry-mail-now';
import { getOutboundMailMessage, listOutboundMail } from './outbound-mail.queries';

export function getOutboundMailList(deps: AppDeps): RequestHandler {
  return async (_req, res) => {
    res.status(HttpStatus.OK).json(await listOutboundMail(deps.db, res.locals.query as ListOutboundMailQuery));
  };
}

export function getOutboundMailById(deps: AppDeps): RequestHandler {
  return async (_req, res) => {
    const { mailId } = res.locals.params as { mailId: string };
    res.status(HttpStatus.OK).json({ message: await getOutboundMailMessage(deps.db, mailId) });
  };
}

export function postOutboundMailRetry(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { mailId } = res.locals.params as { mailId: string };
    const before = await getOutboundMailMessage(deps.db, mailId);
    const actor = actorOf(req);
    const retried = await deps.db.transaction(async (tx) => {
      if (!(await retryMailNow(tx, mailId))) return false;
      await recordAuditEvent(tx, {
        actorId: actor.actorId,
        action: 'outbound-mail.retried',
        subjectType: 'outbound-mail',
        subjectId: mailId,
        details: { kind: before.kind, to: before.to, previousStatus: before.status, attempts: before.attempts },
        ip: actor.ip,
      });
      return true;
    });
    if (!retried) {
      throw new HttpError(HttpStatus.CONFLICT, `This message is ${before.status}; only a message waiting to be retried or one that failed can be sent again now.`);
    }
    res.status(HttpStatus.ACCEPTED).json({ message: await getOutboundMailMessage(deps.db, mailId) });
  };
}
