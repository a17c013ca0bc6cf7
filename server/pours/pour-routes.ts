import { memberWrite } from '../records/member-write.js';
import { Router } from 'express';
import {
  newPourLayerSchema,
  newPourSchema,
  pourLayerPatchSchema,
  pourPatchSchema,
} from '../../shared/domain-schemas.js';
import { signedIn } from '../auth/session-middleware.js';
import { BUILD } from '../builds/build-service.js';
import type { ServerContext } from '../context.js';
import { pathId } from '../core/path-ids.js';
import { validate } from '../core/validate.js';
import { getRecord, listRecords } from '../records/synced-records.js';
import { createPourLayer, deletePourLayer, layersOfPour, patchPourLayer } from './pour-layer-service.js';
import { createPour, deletePour, patchPour, POUR, POUR_LAYER, poursOfBuild } from './pour-service.js';

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
  router.patch(`${base}/pours/:pourId`, async (req, res) => {
    const patch = validate(pourPatchSchema, req.body);
    res.json(await memberWrite(ctx, req, res, patchPour, pathId(req.params['pourId']), patch));
  });
  router.delete(`${base}/pours/:pourId`, async (req, res) => {
    await memberWrite(ctx, req, res, deletePour, pathId(req.params['pourId']));
    res.status(204).end();
  });
  router.get(`${base}/pours/:pourId/layers`, async (req, res) => {
    const workshopId = pathId(req.params['workshopId']);
    const pourId = pathId(req.params['pourId']);
    await getRecord(ctx, signedIn(res).user.id, workshopId, POUR, pourId);
    res.json(await listRecords(ctx, signedIn(res).user.id, workshopId, POUR_LAYER, layersOfPour(pourId)));
  });
  router.post(`${base}/layers`, async (req, res) => {
    const input = validate(newPourLayerSchema, req.body);
    res.status(201).json(await memberWrite(ctx, req, res, createPourLayer, input));
  });
  router.patch(`${base}/layers/:layerId`, async (req, res) => {
    const patch = validate(pourLayerPatchSchema, req.body);
    res.json(await memberWrite(ctx, req, res, patchPourLayer, pathId(req.params['layerId']), patch));
  });
  router.delete(`${base}/layers/:layerId`, async (req, res) => {
    await memberWrite(ctx, req, res, deletePourLayer, pathId(req.params['layerId']));
    res.status(204).end();
  });

  return router;
}
