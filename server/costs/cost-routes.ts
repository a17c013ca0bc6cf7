import { Router } from 'express';
import { signedIn } from '../auth/session-middleware.js';
import type { ServerContext } from '../context.js';
import { pathId } from '../core/path-ids.js';
import { exportCsv, exportJson } from '../export/export-service.js';
import { costReportCsv } from './cost-csv.js';
import { costReport } from './cost-service.js';

export function costRoutes(ctx: ServerContext): Router {
  const router = Router();
  const base = '/workshops/:workshopId';

  router.get(`${base}/costs`, async (req, res) => {
    res.json(await costReport(ctx, signedIn(res).user.id, pathId(req.params['workshopId'])));
  });
  router.get(`${base}/costs.csv`, async (req, res) => {
    const report = await costReport(ctx, signedIn(res).user.id, pathId(req.params['workshopId']));
    res.type('text/csv').attachment('benchtide-costs.csv').send(costReportCsv(report));
  });
  router.get(`${base}/export.json`, async (req, res) => {
    const record = await exportJson(ctx, signedIn(res).user.id, pathId(req.params['workshopId']));
    res.attachment('benchtide-workshop.json').json(record);
  });
  router.get(`${base}/export/:table.csv`, async (req, res) => {
    const csv = await exportCsv(
      ctx,
      signedIn(res).user.id,
      pathId(req.params['workshopId']),
      req.params['table'] ?? '',
    );
    res.type('text/csv').attachment(`benchtide-${req.params['table']}.csv`).send(csv);
  });

  return router;
}
