import { sql } from 'kysely';
import { createDb } from '@revloop/db';
import { testDbUrl, testEngine } from '@revloop/db/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createTwoShops } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';

// A change and its audit event commit together (writeWithAudit): with every audit insert refused by a trigger, the
// change itself must leave nothing behind, and mail that follows the commit must not leave either.

let t: TestApp;
let w: Awaited<ReturnType<typeof createTwoShops>>;
beforeEach(async () => {
  t = await createTestApp();
  w = await createTwoShops(t);
});
afterEach(async () => {
  await t.close();
});

async function refuseAuditEvents() {
  if (testEngine() === 'postgres') {
    // The app's role may not create functions or triggers: the cluster's admin does, on this test's database.
    const [base, query] = process.env.REVLOOP_PG_TEST_ADMIN_URL!.split('?') as [string, string?];
    const name = testDbUrl(t.db).split('?')[0]!.split('/').pop()!;
    const admin = createDb(`${base.slice(0, base.lastIndexOf('/'))}/${name}${query ? `?${query}` : ''}`, { poolSize: 1 });
    try {
      await sql`create or replace function refuse_audit() returns trigger language plpgsql as $$ begin raise exception 'audit refused'; end $$`.execute(admin);
      await sql`create or replace trigger refuse_audit before insert on audit_events for each row execute function refuse_audit()`.execute(admin);
    } finally {
      await admin.destroy();
    }
  } else {
    await sql`create trigger refuse_audit before insert on audit_events begin select raise(abort, 'audit refused'); end`.execute(t.db);
  }
}

const countWhere = async (table: 'dealers' | 'invitations', column: 'name' | 'email', value: string) =>
  Number((await t.db.selectFrom(table).select((eb) => eb.fn.countAll().as('n')).where(column, '=', value).executeTakeFirstOrThrow()).n);

describe('a write whose audit event fails is not written', () => {
  it('POST /api/dealers keeps no dealer', async () => {
    const owner = await signIn(t.app, w.people.owner.email);
    await refuseAuditEvents();
    const res = await owner.post('/api/dealers').send({ name: 'Unaudited Motors', contactName: 'Pat Doe', contactEmail: 'pat@unaudited.test' });
    expect(res.status).toBe(500);
    expect(await countWhere('dealers', 'name', 'Unaudited Motors')).toBe(0);
  });

  it('deactivating a member changes neither the membership nor their session (two writes and the event, all or none)', async () => {
    const tuner = await signIn(t.app, w.people.tuner.email);
    const owner = await signIn(t.app, w.people.owner.email);
    const member = ((await owner.get('/api/members')).body.data as Array<{ id: string; userId: string; status: string }>).find((m) => m.userId === w.people.tuner.id)!;
    await refuseAuditEvents();
    expect((await owner.post(`/api/members/${member.id}/deactivate`)).status).toBe(500);
    const after = ((await owner.get('/api/members')).body.data as Array<{ id: string; status: string }>).find((m) => m.id === member.id)!;
    expect(after.status).toBe('active');
    expect((await tuner.get('/api/me')).status).toBe(200);
  });

  it('POST /api/invitations keeps no invitation and sends no mail (the mail follows the commit)', async () => {
    const owner = await signIn(t.app, w.people.owner.email);
    await refuseAuditEvents();
    const res = await owner.post('/api/invitations').send({ email: 'unaudited.tuner@invite.test', role: 'tuner' });
    expect(res.status).toBe(500);
    expect(await countWhere('invitations', 'email', 'unaudited.tuner@invite.test')).toBe(0);
    expect(t.mailbox.list().filter((m) => m.to.includes('unaudited.tuner@invite.test'))).toEqual([]);
  });
});
