import { inTransaction, insertJobMessage, listJobMessages, newId, type JobListRow } from '@revloop/db';
import type { AuthContext } from '../../http/auth-context';
import { drainMailOutbox } from '../mail/mail-outbox.service';
import { notify } from '../notifications/notify.service';
import { jobMessageToApi } from './job.presenter';
import { customerSideOf, jobLink, shopSideOf } from './job-lookup.service';
import type { JobFlowDeps } from './job-workflow.service';

type ShopAuth = AuthContext & { shop: { id: string } };

/** The job's messages as this viewer sees them, oldest first. */
export async function jobMessages(deps: Pick<JobFlowDeps, 'db'>, auth: ShopAuth, job: JobListRow) {
  const rows = await listJobMessages(deps.db, auth.shop.id, job.id);
  return rows.map((m) => jobMessageToApi(m, auth.user.id));
}

/** Posts a message on a job and tells the other side (the shop, or the customer and their dealer). */
export async function postJobMessage(deps: JobFlowDeps, auth: ShopAuth, job: JobListRow, body: string) {
  const { clock } = deps;
  const message = await inTransaction(deps.db, async (trx) => {
    const row = await insertJobMessage(trx, { id: newId(), shop_id: auth.shop.id, job_id: job.id, author_user_id: auth.user.id, body, created_at: clock.now().toISOString() });
    const fromShop = auth.actor.role === 'owner' || auth.actor.role === 'tuner';
    await notify(
      trx,
      {
        shopId: auth.shop.id,
        jobId: job.id,
        kind: 'message_received',
        recipients: fromShop ? await customerSideOf(trx, job) : await shopSideOf(trx, job),
        title: `Message from ${auth.user.name} — job ${job.number}`,
        body: body.length > 280 ? `${body.slice(0, 277)}…` : body,
        link: jobLink(deps.env.APP_ORIGIN, job.id),
        at: clock.now(),
      },
      auth.user.id,
    );
    return row;
  });
  await drainMailOutbox(deps);
  return jobMessageToApi({ ...message, author_name: auth.user.name }, auth.user.id);
}
