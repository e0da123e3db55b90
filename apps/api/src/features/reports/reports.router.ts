import { Router, type Request, type Response } from 'express';
import { reportQuerySchema, revenueQuerySchema, type ReportQuery } from '@revloop/contract';
import type { AppDeps } from '../../context';
import { authorize, requireShop } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { logQuality, revenue, rounds, tunerLoad, turnaround, weeklyJobs, type ReportAnswer } from './reports.service';

/** JSON by default; `format=csv` sends the same table as a file named after the report and its days. */
function send(res: Response, name: string, query: ReportQuery, answer: ReportAnswer<unknown>): void {
  if (query.format === 'csv') {
    res.set('Content-Type', 'text/csv; charset=utf-8');
    res.set('Content-Disposition', `attachment; filename="${name}-${query.from}-to-${query.to}.csv"`);
    res.send(answer.csv());
    return;
  }
  res.json({ data: answer.json });
}

/** The owner's shop reports: every route reads only the signed-in shop's rows, over `from`…`to` in its time zone. */
export function createReportsRouter({ db }: AppDeps): Router {
  const router = Router();
  const ownerQuery = (req: Request) => {
    const auth = requireShop(req);
    authorize(auth, 'read', 'Report');
    return { shop: auth.shop, query: parseInput(reportQuerySchema, req.query) };
  };

  router.get('/turnaround', async (req, res) => {
    const { shop, query } = ownerQuery(req);
    send(res, 'turnaround', query, await turnaround(db, shop, query));
  });
  router.get('/rounds', async (req, res) => {
    const { shop, query } = ownerQuery(req);
    send(res, 'rounds', query, await rounds(db, shop, query));
  });
  router.get('/weekly-jobs', async (req, res) => {
    const { shop, query } = ownerQuery(req);
    send(res, 'weekly-jobs', query, await weeklyJobs(db, shop, query));
  });
  router.get('/tuner-load', async (req, res) => {
    const { shop, query } = ownerQuery(req);
    send(res, 'tuner-load', query, await tunerLoad(db, shop, query));
  });
  router.get('/revenue', async (req, res) => {
    const { shop, query } = ownerQuery(req);
    const { by } = parseInput(revenueQuerySchema, req.query);
    send(res, `revenue-by-${by}`, query, await revenue(db, shop, query, by));
  });
  router.get('/log-quality', async (req, res) => {
    const { shop, query } = ownerQuery(req);
    send(res, 'log-quality', query, await logQuality(db, shop, query));
  });
  return router;
}
