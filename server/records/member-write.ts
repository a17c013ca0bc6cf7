import type { Request, Response } from 'express';
import { signedIn } from '../auth/session-middleware.js';
import type { ServerContext } from '../context.js';
import { pathId } from '../core/path-ids.js';
import { writeRecords, type UnitOfWork } from './unit-of-work.js';

/** A route's write: the signed-in member's, to the workshop in the path, as one unit of work. */
export function memberWrite<Args extends unknown[], T>(
  ctx: ServerContext,
  req: Request,
  res: Response,
  service: (work: UnitOfWork, ...args: Args) => Promise<T>,
  ...args: Args
): Promise<T> {
  return writeRecords(ctx, signedIn(res).user.id, pathId(req.params['workshopId']), service, ...args);
}
