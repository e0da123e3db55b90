import { findShopById, type Db, type JobListRow } from '@revloop/db';
import { JOB_STATE_LABELS, nextStep, nextStepAction, type JobState } from '@revloop/domain/jobs';
import { customerLockedJobIds } from '../billing/customer-revision-locks';
import type { NotificationKind } from '../notifications/notify.service';
import { factsOf } from './job.presenter';
import { customerSideOf, shopSideOf } from './job-lookup.service';

export const FLASH_CAUTIONS = [
  'Before you flash: connect a battery supporter, switch the ignition on with the engine off, and do not interrupt the write.',
  'Log only on a closed course or a dyno, obey the law, and keep your eyes on the road. Follow local rules and defer to licensed professionals.',
  'Calibration advice is advice to a tuner, not a guarantee.',
];

function logRequestLines(logRequestJson: string): string[] {
  const lr = JSON.parse(logRequestJson) as { channels?: string[]; warmupMinutes?: number; wotGears?: number; notes?: string };
  return [
    'Log request:',
    `- warm up about ${lr.warmupMinutes ?? 5} minutes, then pull ${lr.wotGears ?? 1} gear(s) at full throttle with the pedal on the floor`,
    `- channels: ${(lr.channels ?? []).join(', ')}`,
    ...(lr.notes ? [`- ${lr.notes}`] : []),
  ];
}

/** The customer's next step after the move: paying first while the job's sent revisions are locked until it is paid. */
async function customerNextStep(db: Db, job: JobListRow): Promise<{ step: string; payFirst: boolean }> {
  const shop = await findShopById(db, job.shop_id);
  const locked = shop ? await customerLockedJobIds(db, shop, job.customer_user_id, job.id) : new Set<string>();
  const context = { revisionsLocked: locked.has(job.id) };
  return { step: nextStep(factsOf(job), 'customer', context), payFirst: nextStepAction(factsOf(job), 'customer', context) === 'pay' };
}

/** Who hears about a move, and what they are told; `note` is what changed in a revision being sent. */
export async function noticesForMove(db: Db, job: JobListRow, to: JobState, note?: string) {
  const vehicle = job.vehicle_description;
  const ref = `Job ${job.number} (${vehicle})`;
  const plan: Array<{ kind: NotificationKind; recipients: string[]; title: string; body: string; emailLines?: string[] }> = [];
  if (to === 'with_customer') {
    plan.push({
      kind: 'revision_ready',
      recipients: await customerSideOf(db, job),
      title: `Revision ${job.round} is ready — ${ref}`,
      body: `Revision ${job.round} is ready.${note ? ` What changed: ${note}` : ''} ${(await customerNextStep(db, job)).step}`,
      emailLines: [...(note ? ['', 'What changed:', note] : []), '', ...logRequestLines(job.log_request), '', ...FLASH_CAUTIONS],
    });
  } else if (to === 'log_review') {
    plan.push({ kind: 'log_received', recipients: await shopSideOf(db, job), title: `Log received — ${ref}`, body: `The log for revision ${job.round} is in and waiting for review.` });
  } else if (to === 'dialed_in') {
    const next = await customerNextStep(db, job);
    const body = next.payFirst ? next.step : `Your calibration is finished: revision ${job.round} is the final one.`;
    plan.push({ kind: 'job_dialed_in', recipients: await customerSideOf(db, job), title: `Dialed in — ${ref}`, body });
  } else {
    plan.push({
      kind: 'job_moved',
      recipients: [...(await customerSideOf(db, job)), ...(await shopSideOf(db, job))],
      title: `${ref} is now ${JOB_STATE_LABELS[to]}`,
      body: (await customerNextStep(db, job)).step,
    });
  }
  return plan;
}
