import { findJob, listMembers, type Db, type JobListRow, type JobRow } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import { jobScopeFor } from '@revloop/domain/auth';
import type { AuthContext } from '../../http/auth-context';

/** Loads a job the signed-in user may see; anything else, in this shop or another, is a 404. */
export async function loadJob(db: Db, auth: AuthContext & { shop: { id: string } }, jobId: string): Promise<JobListRow> {
  const row = await findJob(db, auth.shop.id, jobId, jobScopeFor(auth.actor));
  if (!row) throw new DomainError('not_found', 'Job not found.');
  return row;
}

async function activeUserIds(db: Db, shopId: string, role: 'owner' | 'tuner' | 'dealer', dealerId?: string): Promise<string[]> {
  const rows = await listMembers(db, shopId, { role, ...(dealerId && { dealerId }) });
  return rows.filter((r) => r.status === 'active').map((r) => r.user_id);
}

/** The shop side of a job: its tuner, or every tuner when nobody has it yet, and the owners. */
export async function shopSideOf(db: Db, job: JobRow): Promise<string[]> {
  const owners = await activeUserIds(db, job.shop_id, 'owner');
  const tuners = job.assigned_tuner_id ? [job.assigned_tuner_id] : await activeUserIds(db, job.shop_id, 'tuner');
  return [...tuners, ...owners];
}

/** The customer side of a job: the customer and, for a dealer's customer, the dealer's users. */
export async function customerSideOf(db: Db, job: JobRow): Promise<string[]> {
  const dealerUsers = job.dealer_id ? await activeUserIds(db, job.shop_id, 'dealer', job.dealer_id) : [];
  return [job.customer_user_id, ...dealerUsers];
}

export const jobLink = (appOrigin: string, jobId: string) => `${appOrigin}/jobs/${jobId}`;
