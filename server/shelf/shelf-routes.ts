import { memberWrite } from '../records/member-write.js';
import { Router } from 'express';
import {
  containerPatchSchema,
  materialPatchSchema,
  newContainerSchema,
  newMaterialSchema,
  stocktakeSchema,
  wasteSchema,
} from '../../shared/domain-schemas.js';
import { signedIn } from '../auth/session-middleware.js';
import type { ServerContext } from '../context.js';
import { pathId } from '../core/path-ids.js';
import { validate } from '../core/validate.js';
import { getRecord, listRecords } from '../records/synced-records.js';
import {
  CONTAINER,
  createContainer,
  createMaterial,
  deleteContainer,
  deleteMaterial,
  MATERIAL,
  recordStocktake,
  recordWaste,
  updateContainer,
  updateMaterial,
} from './shelf-service.js';
import { shelfOf } from './shelf-view.js';

export function shelfRoutes(ctx: ServerContext): Router {
  const router = Router();
  const base = '/workshops/:workshopId';
  const ids = (params: Record<string, string | string[]>, name: string) =>
    [pathId(params['workshopId']), pathId(params[name])] as const;

  router.get(`${base}/shelf`, async (req, res) => {
    res.json(await shelfOf(ctx, signedIn(res).user.id, pathId(req.params['workshopId'])));
  });

  router.get(`${base}/materials`, async (req, res) => {
    res.json(await listRecords(ctx, signedIn(res).user.id, pathId(req.params['workshopId']), MATERIAL));
  });
  router.post(`${base}/materials`, async (req, res) => {
    const input = validate(newMaterialSchema, req.body);
    res.status(201).json(await memberWrite(ctx, req, res, createMaterial, input));
  });
  router.get(`${base}/materials/:materialId`, async (req, res) => {
    const [workshopId, materialId] = ids(req.params, 'materialId');
    res.json(await getRecord(ctx, signedIn(res).user.id, workshopId, MATERIAL, materialId));
  });
  router.patch(`${base}/materials/:materialId`, async (req, res) => {
    const patch = validate(materialPatchSchema, req.body);
    res.json(await memberWrite(ctx, req, res, updateMaterial, pathId(req.params['materialId']), patch));
  });
  router.delete(`${base}/materials/:materialId`, async (req, res) => {
    await memberWrite(ctx, req, res, deleteMaterial, pathId(req.params['materialId']));
    res.status(204).end();
  });

  router.post(`${base}/containers`, async (req, res) => {
    const input = validate(newContainerSchema, req.body);
    res.status(201).json(await memberWrite(ctx, req, res, createContainer, input));
  });
  router.get(`${base}/containers/:containerId`, async (req, res) => {
    const [workshopId, containerId] = ids(req.params, 'containerId');
    res.json(await getRecord(ctx, signedIn(res).user.id, workshopId, CONTAINER, containerId));
  });
  router.patch(`${base}/containers/:containerId`, async (req, res) => {
    const patch = validate(containerPatchSchema, req.body);
    res.json(await memberWrite(ctx, req, res, updateContainer, pathId(req.params['containerId']), patch));
  });
  router.delete(`${base}/containers/:containerId`, async (req, res) => {
    await memberWrite(ctx, req, res, deleteContainer, pathId(req.params['containerId']));
    res.status(204).end();
  });
  router.post(`${base}/containers/:containerId/waste`, async (req, res) => {
    const input = validate(wasteSchema, req.body);
    res.status(201).json(await memberWrite(ctx, req, res, recordWaste, pathId(req.params['containerId']), input));
  });
  router.post(`${base}/containers/:containerId/stocktake`, async (req, res) => {
    const input = validate(stocktakeSchema, req.body);
    res.status(201).json(await memberWrite(ctx, req, res, recordStocktake, pathId(req.params['containerId']), input));
  });

  return router;
}
