import type { Db } from '../client';
import { newId, nowIso } from '../ids';
import { insertShop } from '../shops/shop.repository';
import { insertMembership, insertUser } from '../users/user.repository';
import { createTestDb } from './postgres';

/** A fresh database (in-memory SQLite, or PostgreSQL in db-pg) with two shops, each with one owner: the fixture for tenant-isolation tests. */
export async function twoShops(): Promise<{ db: Db; shopA: string; shopB: string; ownerA: string; ownerB: string }> {
  const db = await createTestDb();
  const at = nowIso();
  const [shopA, shopB] = [newId(), newId()];
  await insertShop(db, { id: shopA, name: 'Shop A', created_at: at });
  await insertShop(db, { id: shopB, name: 'Shop B', created_at: at });
  const ownerA = (await insertUser(db, { id: newId(), email: 'a@example.test', name: 'A', created_at: at })).id;
  const ownerB = (await insertUser(db, { id: newId(), email: 'b@example.test', name: 'B', created_at: at })).id;
  await insertMembership(db, { id: newId(), shop_id: shopA, user_id: ownerA, role: 'owner', created_at: at });
  await insertMembership(db, { id: newId(), shop_id: shopB, user_id: ownerB, role: 'owner', created_at: at });
  return { db, shopA, shopB, ownerA, ownerB };
}
