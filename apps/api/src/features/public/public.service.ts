import {
  consumePublicSignUp,
  findPackage,
  findPublicShopBySlug,
  findPublicSignUp,
  findShopById,
  findUserByEmail,
  insertMembership,
  insertPublicSignUp,
  insertUser,
  listPackages,
  newId,
  type PackageRow,
  type ShopRow,
} from '@revloop/db';
import { publicIntakeSchema, type PublicShop, type PublicStartInput } from '@revloop/contract';
import { DomainError } from '@revloop/domain';
import type { PackageModule } from '@revloop/domain/jobs';
import type { AppDeps } from '../../context';
import { authorize, loadAuthContext } from '../../http/auth-context';
import { writeWithAudit } from '../audit/audit.service';
import { hashPassword } from '../auth/password';
import { createSession, generateToken, hashToken } from '../auth/session.service';
import { sessionPolicyOf } from '../auth/start-session';
import { assertJobRoom } from '../billing/plan-limits.service';
import { openJob } from '../jobs/job-intake.service';
import { startTuneMail } from './public.mails';

const SIGN_UP_TTL_MS = 24 * 60 * 60_000;

/** The shop behind a public page, or the same 404 whether the slug is unknown or the page is off. */
export async function requirePublicShop(deps: Pick<AppDeps, 'db'>, slug: string): Promise<ShopRow> {
  const shop = await findPublicShopBySlug(deps.db, slug);
  if (!shop) throw new DomainError('not_found', 'There is no public page at this address.');
  return shop;
}

/** Only what a visitor may see: named fields, retail prices; the dealer price never leaves this function. */
export const packageToPublic = (p: PackageRow) => ({
  id: p.id,
  name: p.name,
  description: p.description,
  modules: JSON.parse(p.modules) as PackageModule[],
  retailPriceMinor: p.retail_price_minor,
  roundsIncluded: p.rounds_included,
});

export async function publicShopView(deps: Pick<AppDeps, 'db'>, shop: ShopRow): Promise<PublicShop> {
  const packages = await listPackages(deps.db, shop.id, { activeOnly: true });
  return { slug: shop.slug!, name: shop.name, description: shop.description, currency: shop.currency, packages: packages.map(packageToPublic) };
}

async function requireActivePackage(deps: Pick<AppDeps, 'db'>, shopId: string, packageId: string): Promise<PackageRow> {
  const pkg = await findPackage(deps.db, shopId, packageId);
  if (!pkg || pkg.active !== 1) throw new DomainError('validation', 'Choose one of the shop’s packages.');
  return pkg;
}

const accountExists = () => new DomainError('conflict', 'An account with this e-mail already exists. Sign in instead.');

/** Keeps the sign-up and its intake until the e-mailed link is opened; nothing is written to the shop yet. */
export async function startTune(deps: AppDeps, shop: ShopRow, input: PublicStartInput): Promise<{ email: string }> {
  const { db, clock, env, mailer } = deps;
  const pkg = await requireActivePackage(deps, shop.id, input.packageId);
  if (await findUserByEmail(db, input.email)) throw accountExists();
  const { name, email, password, ...intake } = input;
  const token = generateToken();
  const now = clock.now();
  const expiresAt = new Date(now.getTime() + SIGN_UP_TTL_MS);
  await insertPublicSignUp(db, {
    token_hash: hashToken(token),
    shop_id: shop.id,
    email,
    name,
    password_hash: await hashPassword(password),
    intake: JSON.stringify(intake),
    created_at: now.toISOString(),
    expires_at: expiresAt.toISOString(),
    used_at: null,
  });
  const url = `${env.APP_ORIGIN}/s/${encodeURIComponent(shop.slug!)}/verify?token=${encodeURIComponent(token)}`;
  await mailer.send(startTuneMail(email, { shopName: shop.name, packageName: pkg.name, url, expiresAt }));
  return { email };
}

/**
 * Opens the link: the customer account (a member of this shop only), a session and the job with its vehicle.
 * Returns the session token for the cookie and the new job's id.
 */
export async function finishStartTune(deps: AppDeps, token: string): Promise<{ sessionToken: string; expiresAt: number; jobId: string }> {
  const { db, clock } = deps;
  const at = clock.now().toISOString();
  // The package and the plan's job room are checked before the link is spent, so a refusal leaves the link usable.
  const peek = await findPublicSignUp(db, hashToken(token));
  const shop = peek && (await findShopById(db, peek.shop_id));
  if (!peek || !shop || shop.status !== 'active') throw invalidLink();
  const intake = publicIntakeSchema.parse(JSON.parse(peek.intake));
  await requireActivePackage(deps, shop.id, intake.packageId);
  await assertJobRoom(db, shop.id, clock.now());

  const userId = await writeWithAudit(
    db,
    async (trx) => {
      const row = await consumePublicSignUp(trx, hashToken(token), at);
      if (!row) throw invalidLink();
      if (await findUserByEmail(trx, row.email)) throw accountExists();
      const user = await insertUser(trx, { id: newId(), email: row.email, name: row.name, password_hash: row.password_hash, created_at: at });
      await insertMembership(trx, { id: newId(), shop_id: shop.id, user_id: user.id, role: 'customer', dealer_id: null, created_at: at });
      return user.id;
    },
    (id) => ({ shopId: shop.id, actorUserId: id, action: 'customer.signed_up', subjectType: 'User', subjectId: id, details: { via: 'public_page' }, at: clock.now() }),
  );
  const { token: sessionToken, session } = await createSession(db, sessionPolicyOf(deps.env), userId, shop.id, clock.now());
  const auth = await loadAuthContext(db, session.id, userId, shop.id);
  if (!auth?.shop) throw invalidLink();
  authorize(auth, 'create', 'Job');
  const job = await openJob(deps, { ...auth, shop: auth.shop }, { ...intake, customer: { kind: 'existing', customerUserId: userId }, vehicle: intake.vehicle });
  return { sessionToken, expiresAt: session.expires_at, jobId: job.id };
}

const invalidLink = () => new DomainError('validation', 'This link is invalid, used or expired. Start again from the shop’s page.');
