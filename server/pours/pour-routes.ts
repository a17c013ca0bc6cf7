import { memberWrite } from '../records/member-write.js';
import { Router } from 'express';
import { newPourSchema } from '../../shared/domain-schemas.js';
import { signedIn } from '../auth/session-middleware.js';
import { BUILD } from '../builds/build-service.js';
import type { ServerContext } from '../context.js';
import { pathId } from '../core/path-ids.js';
import { validate } from '../core/validate.js';
import { getRecord, listRecords } from '../records/synced-records.js';
import { createPour, deletePour, POUR, poursOfBuild } from './pour-service.js';

export function pourRoutes(ctx: ServerContext): Router {
  const router = Router();
  const base = '/workshops/:workshopId';

  router.get(`${base}/builds/:buildId/pours`, async (req, res) => {
    const workshopId = pathId(req.params['workshopId']);
    const buildId = pathId(req.params['buildId']);
    await getRecord(ctx, signedIn(res).user.id, workshopId, BUILD, buildId);
    res.json(await listRecords(ctx, signedIn(res).user.id, workshopId, POUR, poursOfBuild(buildId)));
  });
  router.post(`${base}/pours`, async (req, res) => {
    const input = validate(newPourSchema, req.body);
    res.status(201).json(await memberWrite(ctx, req, res, createPour, input));
  });
  router.get(`${base}/pours/:pourId`, async (req, res) => {
    res.json(
      await getRecord(ctx, signedIn(res).user.id, pathId(req.params['workshopId']), POUR, pathId(req.params['pourId'])),
    );
  });
  router.delete(`${base}/pours/:pourId`, async (req, res) => {
    await memberWrite(ctx, req, res, deletePour, pathId(req.params['pourId']));
    res.status(204).end();
  });

  return router;
}
