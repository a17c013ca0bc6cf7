import { memberWrite } from '../records/member-write.js';
import { Router } from 'express';
import { buildPatchSchema, newBuildSchema, newStepSchema, stepPatchSchema } from '../../shared/domain-schemas.js';
import { signedIn } from '../auth/session-middleware.js';
import type { ServerContext } from '../context.js';
import { pathId } from '../core/path-ids.js';
import { validate } from '../core/validate.js';
import { getRecord, listRecords } from '../records/synced-records.js';
import {
  BUILD,
  createBuild,
  createStep,
  deleteBuild,
  deleteStep,
  STEP,
  stepsOfBuild,
  updateBuild,
  updateStep,
} from './build-service.js';

export function buildRoutes(ctx: ServerContext): Router {
  const router = Router();
  const base = '/workshops/:workshopId';

  router.get(`${base}/builds`, async (req, res) => {
    res.json(await listRecords(ctx, signedIn(res).user.id, pathId(req.params['workshopId']), BUILD));
  });
  router.post(`${base}/builds`, async (req, res) => {
    const input = validate(newBuildSchema, req.body);
    res.status(201).json(await memberWrite(ctx, req, res, createBuild, input));
  });
  router.get(`${base}/builds/:buildId`, async (req, res) => {
    res.json(
      await getRecord(
        ctx,
        signedIn(res).user.id,
        pathId(req.params['workshopId']),
        BUILD,
        pathId(req.params['buildId']),
      ),
    );
  });
  router.patch(`${base}/builds/:buildId`, async (req, res) => {
    const patch = validate(buildPatchSchema, req.body);
    res.json(await memberWrite(ctx, req, res, updateBuild, pathId(req.params['buildId']), patch));
  });
  router.delete(`${base}/builds/:buildId`, async (req, res) => {
    await memberWrite(ctx, req, res, deleteBuild, pathId(req.params['buildId']), ctx);
    res.status(204).end();
  });

  router.get(`${base}/builds/:buildId/steps`, async (req, res) => {
    const buildId = pathId(req.params['buildId']);
    const workshopId = pathId(req.params['workshopId']);
    await getRecord(ctx, signedIn(res).user.id, workshopId, BUILD, buildId);
    res.json(await listRecords(ctx, signedIn(res).user.id, workshopId, STEP, stepsOfBuild(buildId)));
  });
  router.post(`${base}/steps`, async (req, res) => {
    const input = validate(newStepSchema, req.body);
    res.status(201).json(await memberWrite(ctx, req, res, createStep, input));
  });
  router.patch(`${base}/steps/:stepId`, async (req, res) => {
    const patch = validate(stepPatchSchema, req.body);
    res.json(await memberWrite(ctx, req, res, updateStep, pathId(req.params['stepId']), patch));
  });
  router.delete(`${base}/steps/:stepId`, async (req, res) => {
    await memberWrite(ctx, req, res, deleteStep, pathId(req.params['stepId']));
    res.status(204).end();
  });

  return router;
}
