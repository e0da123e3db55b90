import {
  datalogComparisonResponseSchema,
  datalogDetailResponseSchema,
  datalogMappingResponseSchema,
  datalogSeriesResponseSchema,
  dealerBalancesResponseSchema,
  dealerDetailResponseSchema,
  dealersResponseSchema,
  dealerLedgerResponseSchema,
  diffHexResponseSchema,
  fileDiffResponseSchema,
  invitationLookupResponseSchema,
  invitationsResponseSchema,
  jobDatalogsResponseSchema,
  jobDetailResponseSchema,
  jobFilesResponseSchema,
  jobListResponseSchema,
  jobMessagesResponseSchema,
  jobPaymentsResponseSchema,
  mailboxResponseSchema,
  meSessionResponseSchema,
  membersResponseSchema,
  notificationPreferencesResponseSchema,
  notificationsResponseSchema,
  packagesResponseSchema,
  platformShopsResponseSchema,
  revenueResponseSchema,
  shopResponseSchema,
  subscriptionResponseSchema,
  vehicleResponseSchema,
  vehiclesResponseSchema,
  verificationResponseSchema,
  type JobSortKey,
  type Verification,
} from '@revloop/contract';
import type { JobSort } from '@revloop/db';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, expectTypeOf, it } from 'vitest';
import type { z } from 'zod';
import type { Verification as ApiVerification } from './features/files/file-verify.service';
import { createCustomer, createJob, createLedgerEntry, createPayment, createPlatformAdmin, createTwoShops } from './testing/factories';
import { createTestApp, linkFromMail, signIn, type TestApp } from './testing/test-app';

// Every answer below is what the web reads; each must parse with the contract schema the web is typed by.
let t: TestApp;
let w: Awaited<ReturnType<typeof world>>;
let owner: Awaited<ReturnType<typeof signIn>>;

/** A shop with every role, a job two rounds in (two reads of the unit's files, two logs), a paid job, a dealer's job; an admin. */
async function world() {
  const two = await createTwoShops(t);
  await createLedgerEntry(t, two.dealer);
  const twoRounds = await createJob(t, two.shop, { customer: two.people.customer, state: 'log_review', round: 2 });
  await createPayment(t, twoRounds);
  await createJob(t, two.shop, { customer: await createCustomer(t, two.shop, { dealer: two.dealer }) });
  return { ...two, twoRounds, admin: await createPlatformAdmin(t) };
}

beforeAll(async () => {
  t = await createTestApp();
  w = await world();
  owner = await signIn(t.app, w.shop.owner.email);
});
afterAll(async () => {
  await t.close();
});

/** GETs `path` as `agent`, expects 200 and a body the schema accepts (the failing paths are printed). */
async function expectParses(agent: typeof owner, path: string, schema: z.ZodType) {
  const res = await agent.get(path);
  expect(res.status, `${path}: ${JSON.stringify(res.body)}`).toBe(200);
  const parsed = schema.safeParse(res.body);
  expect(parsed.success ? [] : parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`), path).toEqual([]);
  return res.body as unknown;
}

describe('the API answers in the shapes of @revloop/contract', () => {
  it('keeps the list sort keys and the verification shape of the API', () => {
    // The repository orders by these keys and the contract accepts them: the two lists must be the same set.
    expectTypeOf<JobSortKey>().toEqualTypeOf<JobSort>();
    expectTypeOf<Verification>().toEqualTypeOf<ApiVerification>();
  });

  it('jobs: list, detail and messages', async () => {
    const list = (await expectParses(owner, '/api/jobs?pageSize=200', jobListResponseSchema)) as { data: { id: string }[] };
    expect(list.data.length).toBeGreaterThan(0);
    for (const sort of ['number', 'customer', 'vehicle'] satisfies JobSortKey[]) await expectParses(owner, `/api/jobs?sort=${sort}`, jobListResponseSchema);
    for (const { id } of list.data.slice(0, 10)) {
      await expectParses(owner, `/api/jobs/${id}`, jobDetailResponseSchema);
      await expectParses(owner, `/api/jobs/${id}/messages`, jobMessagesResponseSchema);
    }
    const customer = await signIn(t.app, w.people.customer.email);
    await expectParses(customer, '/api/jobs', jobListResponseSchema);
  });

  it('files: list, verification, diff and hex rows', async () => {
    const pair = await t.db
      .selectFrom('calibration_files as a')
      .innerJoin('calibration_files as b', (j) => j.onRef('a.job_id', '=', 'b.job_id').onRef('a.module', '=', 'b.module').onRef('a.id', '<', 'b.id'))
      .innerJoin('jobs', 'jobs.id', 'a.job_id')
      .select(['a.id as a', 'b.id as b', 'a.job_id as jobId'])
      .where('jobs.shop_id', '=', w.shop.id)
      .executeTakeFirstOrThrow();
    await expectParses(owner, `/api/jobs/${pair.jobId}/files`, jobFilesResponseSchema);
    await expectParses(owner, `/api/files/${pair.a}/verify`, verificationResponseSchema);
    await expectParses(owner, `/api/files/${pair.b}/verify`, verificationResponseSchema);
    await expectParses(owner, `/api/files/${pair.a}/diff/${pair.b}`, fileDiffResponseSchema);
    await expectParses(owner, `/api/files/${pair.a}/diff/${pair.b}/hex?range=0-256`, diffHexResponseSchema);
  });

  it('datalogs: list, detail with report, series, mapping and comparison', async () => {
    const logs = await t.db
      .selectFrom('datalogs')
      .innerJoin('jobs', 'jobs.id', 'datalogs.job_id')
      .select(['datalogs.id', 'datalogs.job_id as jobId'])
      .where('datalogs.status', '=', 'ready')
      .where('jobs.shop_id', '=', w.shop.id)
      .execute();
    const [first] = logs;
    if (!first) throw new Error('the world has no ready log');
    await expectParses(owner, `/api/jobs/${first.jobId}/datalogs`, jobDatalogsResponseSchema);
    await expectParses(owner, `/api/datalogs/${first.id}`, datalogDetailResponseSchema);
    await expectParses(owner, `/api/datalogs/${first.id}/series?channels=rpm,map`, datalogSeriesResponseSchema);
    await expectParses(owner, `/api/datalogs/${first.id}/series?channels=rpm,map&sampling=rows`, datalogSeriesResponseSchema);
    await expectParses(owner, `/api/datalogs/${first.id}/mapping`, datalogMappingResponseSchema);
    const other = logs.find((l) => l.jobId === first.jobId && l.id !== first.id);
    expect(other).toBeDefined();
    if (other) await expectParses(owner, `/api/datalogs/${first.id}/compare/${other.id}`, datalogComparisonResponseSchema);
  });

  it('billing: subscription, job payments, dealer ledger and balances, platform revenue', async () => {
    await expectParses(owner, '/api/billing/subscription', subscriptionResponseSchema);
    const balances = (await expectParses(owner, '/api/billing/dealer-balances', dealerBalancesResponseSchema)) as { data: { id: string }[] };
    for (const { id } of balances.data) await expectParses(owner, `/api/dealers/${id}/ledger`, dealerLedgerResponseSchema);
    expect(balances.data.map((d) => d.id)).toEqual([w.dealer.id]);
    await expectParses(owner, `/api/billing/jobs/${w.twoRounds.id}/payments`, jobPaymentsResponseSchema);
    const admin = await signIn(t.app, w.admin.email);
    await expectParses(admin, '/api/admin/revenue', revenueResponseSchema);
  });

  it('vehicles: list and one vehicle, with what its numbers mean', async () => {
    const list = (await expectParses(owner, '/api/vehicles', vehiclesResponseSchema)) as { data: { id: string; derived: unknown }[] };
    expect(list.data.length).toBeGreaterThan(0);
    expect(list.data.every((v) => v.derived !== null)).toBe(true);
    await expectParses(owner, `/api/vehicles/${list.data[0]!.id}`, vehicleResponseSchema);
    await expectParses(await signIn(t.app, w.people.customer.email), '/api/vehicles', vehiclesResponseSchema);
  });

  it('members and the session', async () => {
    await expectParses(owner, '/api/members', membersResponseSchema);
    for (const { email } of [w.shop.owner, w.people.dealer, w.people.customer, w.admin]) {
      await expectParses(await signIn(t.app, email), '/api/me/session', meSessionResponseSchema);
    }
    await expectParses(request.agent(t.app), '/api/me/session', meSessionResponseSchema);
  });

  it('shop, packages, dealers, invitations, notifications, the platform’s shops and the development mailbox', async () => {
    await owner.post('/api/invitations').send({ email: 'contract@invite.test', role: 'dealer', dealerId: w.dealer.id }).expect(201);
    await expectParses(owner, '/api/shop', shopResponseSchema);
    await expectParses(owner, '/api/packages', packagesResponseSchema);
    await expectParses(await signIn(t.app, w.people.customer.email), '/api/packages', packagesResponseSchema);
    await expectParses(owner, '/api/dealers', dealersResponseSchema);
    await expectParses(owner, `/api/dealers/${w.dealer.id}`, dealerDetailResponseSchema);
    await expectParses(await signIn(t.app, w.people.tuner.email), `/api/dealers/${w.dealer.id}`, dealerDetailResponseSchema);
    await expectParses(owner, '/api/invitations', invitationsResponseSchema);
    const token = linkFromMail(t.mailbox, 'contract@invite.test').split('/invitations/')[1]!;
    await expectParses(request.agent(t.app), `/api/invitations/lookup/${token}`, invitationLookupResponseSchema);
    await expectParses(owner, '/api/notifications/preferences', notificationPreferencesResponseSchema);
    const notices = (await expectParses(await signIn(t.app, w.people.tuner.email), '/api/notifications', notificationsResponseSchema)) as { data: unknown[] };
    expect(notices.data.length).toBeGreaterThan(0);
    const admin = await signIn(t.app, w.admin.email);
    await expectParses(admin, '/api/admin/shops', platformShopsResponseSchema);
    const mails = (await expectParses(admin, '/api/dev/mailbox', mailboxResponseSchema)) as { data: unknown[] };
    expect(mails.data.length).toBeGreaterThan(0);
  });
});
