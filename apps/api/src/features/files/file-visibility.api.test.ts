import type request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { asSubject, defineAbilityFor, type Actor } from '@revloop/domain/auth';
import { createDemoTestApp } from '../../testing/demo-fixture';
import { signIn } from '../../testing/test-app';

let t: Awaited<ReturnType<typeof createDemoTestApp>>;
beforeEach(async () => {
  t = await createDemoTestApp();
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
      // Any tuner of the shop reviews the files of a job whose draft waits for a second person's approval.
      awaitingApproval: job.drafts_awaiting_approval > 0,
      kind: f.kind,
      // A revision is made for the coming round and reaches the customer side when that round starts.
      sent: f.kind !== 'revision' || (f.for_round ?? 0) <= job.round,
      uploadedByUserId: f.uploaded_by_user_id,
      approvalPending: f.approval_required === 1 && f.approved_by_user_id === null,
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
      const job = t.ids.jobs.find(
        (j) =>
          j.shopId === t.ids.kestrel.shopId &&
          j.state === 'on_bench' &&
          j.modules.length === 2 &&
          (j.dealerId !== null) === dealerSide,
      );
      expect(job).toBeDefined();
      const members = await membersOf(job!.shopId, job!.customerUserId);
      const row = await t.db
        .selectFrom('jobs')
        .selectAll()
        .where('id', '=', job!.id)
        .executeTakeFirstOrThrow();
      const tunerEmail =
        members.find((m) => m.actor.userId === row.assigned_tuner_id)?.email ??
        'owner@kestrel.test';
      const customerEmail = members.find((m) => m.actor.userId === job!.customerUserId)!.email;
      const uploadAs = async (email: string, seed: number, kind: string) =>
        (
          await upload(await signIn(t.app, email), job!.id, rawImage(seed), `${kind}.bin`, {
            module: 'ECM',
            kind,
          })
        ).status;
      // One module of two: the revision stays a draft the customer side may not see yet.
      expect(await uploadAs(tunerEmail, dealerSide ? 11 : 12, 'revision')).toBe(201);
      expect(await uploadAs(customerEmail, dealerSide ? 21 : 22, 're_read')).toBe(201);

      // The job as it stands after the uploads: a draft waiting for approval opens it to every tuner of the shop.
      const now = await t.db.selectFrom('jobs').selectAll().where('id', '=', job!.id).executeTakeFirstOrThrow();
      let hidden = 0;
      for (const { email, actor } of members) {
        const allowed = await filesTheAbilityAllows(actor, job!.id);
        const agent = await signIn(t.app, email);
        const list = await agent.get(`/api/jobs/${job!.id}/files`);
        const jobAsSubject = asSubject('Job', {
          shopId: now.shop_id,
          assignedTunerId: now.assigned_tuner_id,
          dealerId: now.dealer_id,
          customerUserId: now.customer_user_id,
          awaitingApproval: now.drafts_awaiting_approval > 0,
        });
        const seesJob = defineAbilityFor(actor).can('read', jobAsSubject);
        // A tuner reviewing a draft outside the job reads its files but downloads only from jobs in their reach.
        const downloads = defineAbilityFor(actor).can('download', jobAsSubject);
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
          }).toEqual({ email, id, status: !sees ? 404 : downloads ? 200 : 403 });
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
