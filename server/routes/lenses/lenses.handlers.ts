import type { RequestHandler } from 'express';
import type { AppDeps } from '../../deps';
import { HttpStatus } from '../../http-status';
import { actorOf, signedInUser } from '../../services/catalogue-queries';
import { getLens, updateLens } from '../../services/lenses';
import type { LensIdParams, UpdateLensInput } from './lenses.schemas';

export function getLensById(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { lensId } = res.locals.params as LensIdParams;
    res.status(HttpStatus.OK).json({ lens: await getLens(deps.db, lensId, signedInUser(req)) });
  };
}

export function patchLens(deps: AppDeps): RequestHandler {
  return async (req, res) => {
    const { lensId } = res.locals.params as LensIdParams;
    await updateLens(deps.db, lensId, res.locals.body as UpdateLensInput, actorOf(req));
    res.status(HttpStatus.OK).json({ lens: await getLens(deps.db, lensId, signedInUser(req)) });
  };
}
