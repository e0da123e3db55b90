import { useState } from 'react';
import { useParams } from 'react-router-dom';
import { useAbility } from '@casl/react';
import type { AppAbility } from '@revloop/domain/auth';
import { addDays, KIT_STATUS_LABELS, RENTAL_STATE_LABELS } from '@revloop/domain/rentals';
import { formatMoney } from '@revloop/domain/billing';
import { PageHeader } from '../../../../components/layout/page-header';
import { Banner } from '../../../../components/ui/banner';
import { Button } from '../../../../components/ui/button';
import { Card } from '../../../../components/ui/card';
import { PageSpinner } from '../../../../components/ui/spinner';
import { TextLink } from '../../../../components/ui/text-link';
import { paths } from '../../../../config/paths';
import { useKit } from '../../../../features/kits/api/get-kit';
import { useKitBookings } from '../../../../features/kits/api/get-kit-bookings';
import { KitForm } from '../../../../features/kits/components/kit-form';
import { KitPhotos } from '../../../../features/kits/components/kit-photos';
import { monthOf, MonthCalendar } from '../../../../features/kits/components/month-calendar';
import { errorMessage } from '../../../../lib/form-errors';
import { formatDate, formatDateTime } from '../../../../lib/format';
import { RequireScreen } from '../require-screen';

function KitBookings({ kitId }: { kitId: string }) {
  const [month, setMonth] = useState(() => monthOf(new Date().toISOString().slice(0, 10)));
  const calendar = useKitBookings(kitId, month);
  const bookings = calendar.data?.data.bookings ?? [];
  const title = new Date(`${month.from}T00:00:00Z`).toLocaleDateString('en-US', { month: 'long', year: 'numeric', timeZone: 'UTC' });
  return (
    <Card
      title={`Bookings — ${title}`}
      actions={
        <div className="flex gap-2">
          <Button variant="secondary" size="sm" onClick={() => setMonth(monthOf(addDays(month.from, -1)))}>Previous month</Button>
          <Button variant="secondary" size="sm" onClick={() => setMonth(monthOf(addDays(month.to, 1)))}>Next month</Button>
        </div>
      }
    >
      {calendar.isError && <Banner tone="bad">{errorMessage(calendar.error)}</Banner>}
      <MonthCalendar
        month={month}
        busy={calendar.data?.data.busy ?? []}
        labelFor={(day) => bookings.find((b) => b.startDate <= day && day <= b.dueDate)?.customerName ?? null}
      />
      {bookings.length > 0 && (
        <ul className="mt-4 flex flex-col gap-1 text-sm">
          {bookings.map((b) => (
            <li key={b.rentalId}>
              <TextLink to={paths.job.getHref(b.jobId)}>{b.customerName}</TextLink>: {formatDate(b.startDate)} to {formatDate(b.dueDate)} ({RENTAL_STATE_LABELS[b.state]}; blocked {formatDate(b.blocked.from)}–{formatDate(b.blocked.to)})
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}

function KitScreen({ kitId }: { kitId: string }) {
  const ability = useAbility<AppAbility>();
  const kit = useKit(kitId);
  const [editing, setEditing] = useState(false);
  if (kit.isPending) return <PageSpinner label="Loading the kit" />;
  if (kit.isError) return <Banner tone="bad">{errorMessage(kit.error)}</Banner>;
  const k = kit.data.data;
  return (
    <>
      <PageHeader
        title={k.name}
        description={`${KIT_STATUS_LABELS[k.status]} · interface ${k.interfaceSerial}${k.laptopAssetTag ? ` · laptop ${k.laptopAssetTag}` : ''}`}
        actions={ability.can('update', 'Kit') && !editing ? <Button onClick={() => setEditing(true)}>Edit kit</Button> : undefined}
      />
      <div className="flex flex-col gap-6">
        {editing ? (
          <Card title="Edit kit" actions={<Button variant="ghost" onClick={() => setEditing(false)}>Cancel</Button>}>
            <KitForm kit={k} currency={k.currency} onDone={() => setEditing(false)} />
          </Card>
        ) : (
          <Card title="Kit">
            <dl className="grid gap-3 text-sm sm:grid-cols-3">
              <div><dt className="text-ink-600">Per week</dt><dd>{formatMoney(k.weeklyPriceMinor, k.currency)}</dd></div>
              <div><dt className="text-ink-600">Deposit (held)</dt><dd>{formatMoney(k.depositMinor, k.currency)}</dd></div>
              <div><dt className="text-ink-600">Late fee per day</dt><dd>{formatMoney(k.lateFeePerDayMinor, k.currency)}</dd></div>
              <div><dt className="text-ink-600">Contents</dt><dd>{k.contents.join(', ') || '—'}</dd></div>
              <div><dt className="text-ink-600">Platforms</dt><dd>{k.platforms.join(', ') || '—'}</dd></div>
              <div><dt className="text-ink-600">Condition notes</dt><dd className="whitespace-pre-line">{k.conditionNotes || '—'}</dd></div>
            </dl>
          </Card>
        )}
        <KitBookings kitId={k.id} />
        <KitPhotos kitId={k.id} photos={k.photos} canEdit={ability.can('update', 'Kit')} />
        <Card title="History">
          {k.history.length === 0 ? (
            <p className="text-sm text-ink-600">Nothing has happened to this kit yet.</p>
          ) : (
            <ol className="flex flex-col gap-2 text-sm">
              {k.history.map((h, i) => (
                <li key={`${h.at}-${i}`}>
                  <time dateTime={h.at} className="text-ink-600">{formatDateTime(h.at)}</time> — {h.summary}
                </li>
              ))}
            </ol>
          )}
        </Card>
      </div>
    </>
  );
}

export function KitRoute() {
  const { kitId = '' } = useParams();
  return (
    <RequireScreen screen="kits">
      <KitScreen kitId={kitId} />
    </RequireScreen>
  );
}
