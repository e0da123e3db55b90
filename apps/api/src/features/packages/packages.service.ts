import { insertPackage, newId, updatePackage, type PackageRow } from '@revloop/db';
import type { PackageInput } from '@revloop/domain/jobs';
import type { AppDeps } from '../../context';
import type { AuthContext } from '../../http/auth-context';
import { writeWithAudit } from '../audit/audit.service';

const packageColumns = (input: PackageInput) => ({
  name: input.name,
  description: input.description,
  modules: JSON.stringify(input.modules),
  retail_price_minor: input.retailPriceMinor,
  dealer_price_minor: input.dealerPriceMinor,
  rounds_included: input.roundsIncluded,
});

/** Adds a package to the shop's list, and audits it. */
export async function createPackage({ db, clock }: AppDeps, auth: AuthContext & { shop: { id: string } }, input: PackageInput): Promise<PackageRow> {
  return writeWithAudit(
    db,
    (trx) => insertPackage(trx, { id: newId(), shop_id: auth.shop.id, ...packageColumns(input), created_at: clock.now().toISOString() }),
    (row) => ({ shopId: auth.shop.id, actorUserId: auth.user.id, action: 'package.created', subjectType: 'Package', subjectId: row.id, at: clock.now() }),
  );
}

/** Replaces a package's terms. */
export async function editPackage({ db }: AppDeps, shopId: string, packageId: string, input: PackageInput): Promise<PackageRow | undefined> {
  return updatePackage(db, shopId, packageId, packageColumns(input));
}

/** Offers a package again, or stops offering it. */
export async function setPackageActive({ db }: AppDeps, shopId: string, packageId: string, active: boolean): Promise<PackageRow | undefined> {
  return updatePackage(db, shopId, packageId, { active: active ? 1 : 0 });
}
