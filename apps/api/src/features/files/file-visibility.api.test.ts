import type request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { asSubject, defineAbilityFor, type Actor } from '@revloop/domain/auth';
import { createCustomer, createJob, createLedgerEntry, createMember, createPackage, createTwoShops, payJob } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(async () => {
  await t.close();
});

/** A raw image distinct per seed, binary beyond doubt. */
const rawImage = (seed: number) =>
  Buffer.from(Array.from({ length: 512 }, (_, i) => (i * 7 + seed) & 0xff));

const upload = (
  agent: ReturnType<typeof request.agent>,
  jobId: string,
  body: Buffer,
  name: string,
  fields: Record<string, string>,
) => {
  let req = agent.post(`/api/jobs/${jobId}/files`);
  for (const [key, value] of Object.entries(fields)) req = req.field(key, value);
  return req.attach('file', body, name);
};

/**
 * The active members of the shop who could be near the job: every owner, tuner and dealer user, the job's customer and
 * one other customer (customers differ only by whose job it is), each as the actor its session would build.
 */
async function membersOf(shopId: string, customerUserId: string) {
  const rows = await t.db
    .selectFrom('memberships')
    .innerJoin('users', 'users.id', 'memberships.user_id')
    .select(['users.id as userId', 'users.email', 'memberships.role', 'memberships.dealer_id'])
    .where('memberships.shop_id', '=', shopId)
    .where('memberships.status', '=', 'active')
    .execute();
  const otherCustomer = rows.find((r) => r.role === 'customer' && r.userId !== customerUserId);
  return rows
    .filter((r) => r.role !== 'customer' || r.userId === customerUserId || r === otherCustomer)
    .map((r) => ({
      email: r.email,
      actor: {
        userId: r.userId,
        platformAdmin: false,
        shopId,
        role: r.role,
        dealerId: r.dealer_id,
        shopReadOnly: false,
      } satisfies Actor,
    }));
}

/**
 * What the abilities say this actor sees of the job's files, built from the database rows alone: the File rules are
 * the authority, and the API's lists, single reads and checks must agree with them file by file.
 */
async function filesTheAbilityAllows(actor: Actor, jobId: string) {
  const job = await t.db
    .selectFrom('jobs')
    .selectAll()
    .where('id', '=', jobId)
    .executeTakeFirstOrThrow();
  const files = await t.db
    .selectFrom('calibration_files')
    .selectAll()
    .where('job_id', '=', jobId)
    .execute();
  const ability = defineAbilityFor(actor);
  const subjectOf = (f: (typeof files)[number]) =>
    asSubject('File', {
      shopId: job.shop_id,
      assignedTunerId: job.assigned_tuner_id,
      dealerId: job.dealer_id,
      customerUserId: job.customer_user_id,
      kind: f.kind,
      // A revision is made for the coming round and reaches the customer side when that round starts.
      sent: f.kind !== 'revision' || (f.for_round ?? 0) <= job.round,
      uploadedByUserId: f.uploaded_by_user_id,
    });
  return {
    all: files.map((f) => f.id).sort(),
    read: files
      .filter((f) => ability.can('read', subjectOf(f)))
      .map((f) => f.id)
      .sort(),
    verify: files
      .filter((f) => ability.can('verify', subjectOf(f)))
      .map((f) => f.id)
      .sort(),
  };
}

describe('the files API agrees with the File abilities', () => {
  for (const dealerSide of [false, true]) {
    it(`for every role near a ${dealerSide ? 'dealer' : 'direct'} job: list, single read, download and check, with a draft revision`, async () => {
      // A shop with a person in every role, a second tuner and a second customer, and one job back on the bench for two
      // modules after a first revision was sent: a direct job, or one of the dealer's customers.
      const { shop, dealer, people } = await createTwoShops(t);
      await createMember(t, shop, 'tuner');
      await createCustomer(t, shop);
      await createLedgerEntry(t, dealer);
      const job = await createJob(t, shop, {
        state: 'on_bench',
        round: 1,
        tuner: people.tuner,
        customer: dealerSide ? await createCustomer(t, shop, { dealer }) : people.customer,
        package: await createPackage(t, shop, { modules: ['ECM', 'TCM'] }),
      });
      // Paid, so the paid-before-download lock (tested in download-lock.api.test.ts) does not hide what visibility decides.
      if (!dealerSide) await payJob(t, job);
      const members = await membersOf(shop.id, job.customer.id);
      const row = await t.db
        .selectFrom('jobs')
        .selectAll()
        .where('id', '=', job.id)
        .executeTakeFirstOrThrow();
      const tunerEmail = members.find((m) => m.actor.userId === row.assigned_tuner_id)!.email;
      const customerEmail = job.customer.email;
      const uploadAs = async (email: string, seed: number, kind: string) =>
        (
          await upload(await signIn(t.app, email), job.id, rawImage(seed), `${kind}.bin`, {
            module: 'ECM',
            kind,
          })
        ).status;
      // One module of two: the revision stays a draft the customer side may not see yet.
      expect(await uploadAs(tunerEmail, dealerSide ? 11 : 12, 'revision')).toBe(201);
      expect(await uploadAs(customerEmail, dealerSide ? 21 : 22, 're_read')).toBe(201);

      let hidden = 0;
      for (const { email, actor } of members) {
        const allowed = await filesTheAbilityAllows(actor, job.id);
        const agent = await signIn(t.app, email);
        const list = await agent.get(`/api/jobs/${job.id}/files`);
        const seesJob = defineAbilityFor(actor).can(
          'read',
          asSubject('Job', {
            shopId: row.shop_id,
            assignedTunerId: row.assigned_tuner_id,
            dealerId: row.dealer_id,
            customerUserId: row.customer_user_id,
          }),
        );
        expect({ email, status: list.status }).toEqual({ email, status: seesJob ? 200 : 404 });
        const listed = seesJob
          ? (list.body.data as Array<{ id: string }>).map((f) => f.id).sort()
          : [];
        expect({ email, listed }).toEqual({ email, listed: allowed.read });
        if (seesJob)
          expect({ email, canVerify: list.body.meta.canVerify }).toEqual({
            email,
            canVerify: allowed.verify.length > 0,
          });
        for (const id of allowed.all) {
          const sees = allowed.read.includes(id);
          if (!sees) hidden += 1;
          expect({ email, id, status: (await agent.get(`/api/files/${id}`)).status }).toEqual({
            email,
            id,
            status: sees ? 200 : 404,
          });
          expect({
            email,
            id,
            status: (await agent.get(`/api/files/${id}/download`)).status,
          }).toEqual({ email, id, status: sees ? 200 : 404 });
          const verify = (await agent.get(`/api/files/${id}/verify`)).status;
          expect({ email, id, verify }).toEqual({
            email,
            id,
            verify: !sees ? 404 : allowed.verify.includes(id) ? 200 : 403,
          });
        }
      }
      // The job's files are not all visible to all: the draft and others' uploads are hidden from someone.
      expect(hidden).toBeGreaterThan(0);
    }, 60_000);
  }
});
