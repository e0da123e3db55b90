import { Router, type Response } from 'express';
import { eachJobBatch, jobListVersion, listJobs, type JobListFilter, type JobListRow, type ShopRow } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import { asSubject, jobScopeFor } from '@revloop/domain/auth';
import { csvLine } from '@revloop/domain/csv';
import { logRequestSchema } from '@revloop/domain/datalog';
import { JOB_STATE_LABELS, jobIntakeSchema, messageInputSchema } from '@revloop/domain/jobs';
import { jobListQuerySchema as listQuerySchema, jobTransitionInputSchema } from '@revloop/contract';
import { z } from 'zod';
import type { AppDeps } from '../../context';
import { revisionLinkLines } from '../files/file.service';
import { authorize, authorizeRow, requireShop, type AuthContext } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { jobAnswerChangesAt, jobRowToJob, jobSubject } from './job.presenter';
import { openJob } from './job-intake.service';
import { JobListCache } from './job-list-cache';
import { loadJob } from './job-lookup.service';
import { jobMessages, postJobMessage } from './job-messages.service';
import { timelineFor } from './job-timeline.service';
import { assignJob, changeLogRequest, moveJob, takeJob } from './job-workflow.service';
import { lockedJobIdsForCustomer } from '../billing/download-lock.service';

function filterFrom(q: z.infer<typeof listQuerySchema>, auth: AuthContext): JobListFilter {
  return {
    ...(q.state ? { states: q.state } : q.open === 'true' && { open: true }),
    ...(q.mine === 'true' ? { tunerId: auth.user.id } : q.tuner ? { tunerId: q.tuner } : {}),
    ...(q.dealer && { dealerId: q.dealer }),
    ...(q.package && { packageId: q.package }),
    ...(q.customer && { customerUserId: q.customer }),
    ...(q.awaiting === 'approval' && { awaitingApproval: true }),
    ...(q.q && { text: q.q }),
  };
}

const assignSchema = z.object({ tunerId: z.string().min(1).nullable() });

/** Resolves when the response takes more data again, or when the client has gone. */
function drained(res: Response): Promise<void> {
  return new Promise((resolve) => {
    const done = () => {
      res.off('drain', done);
      res.off('close', done);
      resolve();
    };
    res.once('drain', done);
    res.once('close', done);
  });
}

export function createJobsRouter(deps: AppDeps): Router {
  const router = Router();
  const { db, clock } = deps;
  const listCache = new JobListCache();
  /** One job as this viewer gets it, its next step reading the customer's paid-before-download lock. */
  const present = async (auth: AuthContext & { shop: ShopRow }, job: JobListRow) =>
    jobRowToJob(job, auth, clock.now(), await lockedJobIdsForCustomer(db, auth, job.id));

  router.get('/', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'read', 'Job');
    const q = parseInput(listQuerySchema, req.query);
    const now = clock.now();
    // Everything the answer depends on besides the data: the viewer (scope, role, transitions) and the parsed query.
    const { userId, role, dealerId, shopReadOnly, platformAdmin } = auth.actor;
    // A customer's next steps also read which of their jobs wait to be paid; payments are no job-list write, so the
    // locked jobs are part of the key (one small read of the customer's own jobs) and a payment misses the cache.
    const locked = await lockedJobIdsForCustomer(db, auth);
    const key = JSON.stringify([auth.shop.id, userId, role, dealerId, shopReadOnly, platformAdmin, q, [...locked]]);
    // Read before the rows: an answer may be newer than its version tag, never older.
    const version = await jobListVersion(db, auth.shop.id);
    const entry =
      listCache.get(key, version, now.getTime()) ??
      (await (async () => {
        const { rows, total } = await listJobs(db, auth.shop.id, jobScopeFor(auth.actor), filterFrom(q, auth), {
          sort: q.sort,
          direction: q.dir,
          offset: (q.page - 1) * q.pageSize,
          limit: q.pageSize,
        });
        const body = JSON.stringify({
          data: rows.map((r) => jobRowToJob(r, auth, now, locked)),
          meta: { total, page: q.page, pageSize: q.pageSize, pageCount: Math.max(1, Math.ceil(total / q.pageSize)) },
        });
        const until = rows.reduce((at, r) => Math.min(at, jobAnswerChangesAt(r, now)), Number.POSITIVE_INFINITY);
        return listCache.set(key, version, now.getTime(), until, body);
      })());
    // Express answers 304 itself when the client sends this ETag back.
    res.set('Content-Type', 'application/json; charset=utf-8').set('ETag', entry.etag).send(entry.body);
  });

  router.get('/export.csv', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'read', 'Job');
    const q = parseInput(listQuerySchema, req.query);
    res.set('Content-Type', 'text/csv; charset=utf-8');
    res.set('Content-Disposition', `attachment; filename="jobs-${clock.now().toISOString().slice(0, 10)}.csv"`);
    // Streams every matching job, a batch at a time, waiting for the client to take each one: no row limit.
    res.write(csvLine(['Job', 'State', 'Round', 'Customer', 'Customer e-mail', 'Dealer', 'Vehicle', 'VIN', 'Package', 'Tuner', 'In state since', 'Opened']));
    for await (const rows of eachJobBatch(db, auth.shop.id, jobScopeFor(auth.actor), filterFrom(q, auth), { sort: q.sort, direction: q.dir })) {
      const chunk = rows
        .map((r) => csvLine([r.number, JOB_STATE_LABELS[r.state], r.round, r.customer_name, r.customer_email, r.dealer_name, r.vehicle_description, r.vehicle_vin, r.package_name, r.tuner_name, r.state_changed_at, r.created_at]))
        .join('');
      if (!res.write(chunk)) await drained(res);
      if (res.destroyed) return;
    }
    res.end();
  });

  router.post('/', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'create', 'Job');
    const input = parseInput(jobIntakeSchema, req.body);
    const job = await openJob(deps, auth, input);
    res.status(201).json({ data: await present(auth, job) });
  });

  router.get('/:id', async (req, res) => {
    const auth = requireShop(req);
    const job = await loadJob(db, auth, req.params.id);
    authorizeRow(auth, 'read', 'Job', jobSubject(job));
    const timeline = await timelineFor(db, auth, job);
    res.json({ data: { ...(await present(auth, job)), timeline } });
  });

  router.post('/:id/transitions', async (req, res) => {
    const auth = requireShop(req);
    const { to, kitOutOverride, note } = parseInput(jobTransitionInputSchema, req.body);
    const current = await loadJob(db, auth, req.params.id);
    // Send revision e-mails a signed link to each draft it sends.
    const extraEmailLines = current.state === 'on_bench' && to === 'with_customer' ? await revisionLinkLines(deps, current) : undefined;
    const job = await moveJob(deps, auth, req.params.id, to, { kitOutOverride: kitOutOverride ?? false, note, extraEmailLines });
    res.json({ data: await present(auth, job) });
  });

  router.post('/:id/assign', async (req, res) => {
    const auth = requireShop(req);
    const current = await loadJob(db, auth, req.params.id);
    authorizeRow(auth, 'assign', 'Job', jobSubject(current));
    const { tunerId } = parseInput(assignSchema, req.body);
    const job = await assignJob(deps, auth, req.params.id, tunerId);
    res.json({ data: await present(auth, job) });
  });

  router.post('/:id/take', async (req, res) => {
    const auth = requireShop(req);
    const current = await loadJob(db, auth, req.params.id);
    authorizeRow(auth, 'take', 'Job', jobSubject(current));
    const job = await takeJob(deps, auth, req.params.id);
    res.json({ data: await present(auth, job) });
  });

  router.put('/:id/log-request', async (req, res) => {
    const auth = requireShop(req);
    const current = await loadJob(db, auth, req.params.id);
    authorizeRow(auth, 'update', 'Job', jobSubject(current));
    const logRequest = parseInput(logRequestSchema, req.body);
    const job = await changeLogRequest(deps, auth, current, logRequest);
    res.json({ data: await present(auth, job) });
  });

  router.get('/:id/messages', async (req, res) => {
    const auth = requireShop(req);
    const job = await loadJob(db, auth, req.params.id);
    authorizeRow(auth, 'read', 'Message', jobSubject(job));
    const data = await jobMessages(deps, auth, job);
    res.json({ data, meta: { total: data.length } });
  });

  router.post('/:id/messages', async (req, res) => {
    const auth = requireShop(req);
    const job = await loadJob(db, auth, req.params.id);
    if (!auth.ability.can('create', asSubject('Message', jobSubject(job)))) {
      throw new DomainError(auth.actor.shopReadOnly ? 'shop_read_only' : 'forbidden', 'You cannot post on this job.');
    }
    const { body } = parseInput(messageInputSchema, req.body);
    res.status(201).json({ data: await postJobMessage(deps, auth, job, body) });
  });

  return router;
}
