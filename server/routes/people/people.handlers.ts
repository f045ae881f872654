import type { RequestHandler } from 'express';
import type { AppDeps } from '../../deps';
import { HttpStatus } from '../../http-status';
import { listPeople } from '../../services/people';
import type { ListPeopleQuery } from './people.schemas';

export function getPeople(deps: AppDeps): RequestHandler {
  return async (_req, res) => {
    const query = res.locals.query as ListPeopleQuery;
    res.status(HttpStatus.OK).json({ people: await listPeople(deps.db, { active: query.active }) });
  };
}
