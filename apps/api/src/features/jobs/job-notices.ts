import type { Db, JobListRow } from '@revloop/db';
import { JOB_STATE_LABELS, nextStep, type JobState } from '@revloop/domain/jobs';
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
      body: `Revision ${job.round} is ready to flash.${note ? ` What changed: ${note}` : ''} Flash it, warm up, then log as requested.`,
      emailLines: [...(note ? ['', 'What changed:', note] : []), '', ...logRequestLines(job.log_request), '', ...FLASH_CAUTIONS],
    });
  } else if (to === 'log_review') {
    plan.push({ kind: 'log_received', recipients: await shopSideOf(db, job), title: `Log received — ${ref}`, body: `The log for revision ${job.round} is in and waiting for review.` });
  } else if (to === 'dialed_in') {
    plan.push({ kind: 'job_dialed_in', recipients: await customerSideOf(db, job), title: `Dialed in — ${ref}`, body: `Your calibration is finished: revision ${job.round} is the final one.` });
  } else {
    plan.push({
      kind: 'job_moved',
      recipients: [...(await customerSideOf(db, job)), ...(await shopSideOf(db, job))],
      title: `${ref} is now ${JOB_STATE_LABELS[to]}`,
      body: nextStep(factsOf(job), 'customer'),
    });
  }
  return plan;
}
