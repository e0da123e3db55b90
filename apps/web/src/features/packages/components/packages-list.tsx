import { useState } from 'react';
import { formatMoney } from '@revloop/domain/billing';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { EmptyState } from '../../../components/ui/empty-state';
import { errorMessage } from '../../../lib/form-errors';
import type { Package } from '@revloop/contract';
import { useSetPackageActive } from '../api/set-package-active';
import { PackageForm } from './package-form';
import { ScrollRegion } from '../../../components/ui/scroll-region';

/** The shop's packages with prices, rounds and whether intake still offers them; the owner edits them here. */
export function PackagesList({ packages, currency, canEdit }: { packages: Package[]; currency: string; canEdit: boolean }) {
  const [editing, setEditing] = useState<Package | 'new' | null>(null);
  const setActive = useSetPackageActive();
  return (
    <div className="flex flex-col gap-4">
      {canEdit && (
        <div>
          <Button onClick={() => setEditing('new')}>New package</Button>
        </div>
      )}
      {setActive.error && (
        <p role="alert" className="text-sm text-bad">
          {errorMessage(setActive.error)}
        </p>
      )}
      {packages.length === 0 ? (
        <EmptyState title="No packages yet">
          {canEdit ? 'Add the first package: what it covers, its retail and dealer price and the rounds included. Jobs open for a package, and your public page lists them.' : 'The owner has not set up any packages yet.'}
        </EmptyState>
      ) : (
      <ScrollRegion label="Packages" className="rounded-lg border border-ink-200 bg-white">
        <table className="w-full min-w-[44rem] border-collapse text-left text-sm">
          <caption className="sr-only">Packages</caption>
          <thead className="bg-ink-50 text-xs tracking-wide text-ink-600 uppercase">
            <tr>
              <th scope="col" className="px-4 py-2.5 font-medium">Package</th>
              <th scope="col" className="px-4 py-2.5 font-medium">Modules</th>
              <th scope="col" className="px-4 py-2.5 font-medium">Retail</th>
              <th scope="col" className="px-4 py-2.5 font-medium">Dealer</th>
              <th scope="col" className="px-4 py-2.5 font-medium">Rounds</th>
              <th scope="col" className="px-4 py-2.5 font-medium">Status</th>
              {canEdit && <th scope="col" className="px-4 py-2.5 font-medium"><span className="sr-only">Actions</span></th>}
            </tr>
          </thead>
          <tbody>
            {packages.map((pkg) => (
              <tr key={pkg.id} className="border-t border-ink-100">
                <th scope="row" className="px-4 py-3 text-left font-medium text-ink-900">
                  {pkg.name}
                  {pkg.description && <span className="block text-xs font-normal text-ink-600">{pkg.description}</span>}
                </th>
                <td className="px-4 py-3">{pkg.modules.join(' + ')}</td>
                <td className="px-4 py-3">{formatMoney(pkg.retailPriceMinor, currency)}</td>
                <td className="px-4 py-3">{pkg.dealerPriceMinor === null ? '—' : formatMoney(pkg.dealerPriceMinor, currency)}</td>
                <td className="px-4 py-3">{pkg.roundsIncluded}</td>
                <td className="px-4 py-3">{pkg.active ? <Badge tone="ok">Offered</Badge> : <Badge>Not offered</Badge>}</td>
                {canEdit && (
                  <td className="px-4 py-3">
                    <span className="flex justify-end gap-2">
                      <Button size="sm" variant="secondary" onClick={() => setEditing(pkg)} aria-label={`Edit ${pkg.name}`}>
                        Edit
                      </Button>
                      <Button
                        size="sm"
                        variant="ghost"
                        pending={setActive.isPending && setActive.variables?.id === pkg.id}
                        onClick={() => setActive.mutate({ id: pkg.id, active: !pkg.active })}
                        aria-label={`${pkg.active ? 'Stop offering' : 'Offer'} ${pkg.name}`}
                      >
                        {pkg.active ? 'Stop offering' : 'Offer again'}
                      </Button>
                    </span>
                  </td>
                )}
              </tr>
            ))}
          </tbody>
        </table>
      </ScrollRegion>
      )}
      <Dialog open={editing !== null} title={editing === 'new' ? 'New package' : 'Edit package'} onClose={() => setEditing(null)}>
        {editing !== null && <PackageForm pkg={editing === 'new' ? null : editing} currency={currency} onDone={() => setEditing(null)} onCancel={() => setEditing(null)} />}
      </Dialog>
    </div>
  );
}
