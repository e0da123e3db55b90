import { useKitBookings } from '../../kits/api/get-kit-bookings';
import { useKits } from '../../kits/api/get-kits';
import { monthOf, MonthCalendar } from '../../kits/components/month-calendar';
import { Field } from '../../../components/ui/field';
import { Input } from '../../../components/ui/input';
import { Select } from '../../../components/ui/select';

export interface KitDates {
  kitId: string;
  startDate: string;
  dueDate: string;
}

/** Pick a kit and dates; the chosen kit's busy days (shipping days included) show on the start month's calendar. */
export function KitDatesPicker({ value, onChange, idPrefix, withKit = true }: { value: KitDates; onChange: (v: KitDates) => void; idPrefix: string; withKit?: boolean }) {
  const kits = useKits({ enabled: withKit });
  const month = monthOf(value.startDate);
  const calendar = useKitBookings(withKit && value.kitId ? value.kitId : undefined, month);
  const options = [{ value: '', label: 'Choose a kit' }, ...(kits.data?.data ?? []).filter((k) => k.status !== 'retired').map((k) => ({ value: k.id, label: `${k.name} (${k.interfaceSerial})` }))];
  return (
    <div className="flex flex-col gap-3">
      <div className="grid gap-3 sm:grid-cols-3">
        {withKit && (
          <Field id={`${idPrefix}-kit`} label="Kit">
            {(a) => <Select {...a} options={options} value={value.kitId} onChange={(e) => onChange({ ...value, kitId: e.target.value })} />}
          </Field>
        )}
        <Field id={`${idPrefix}-start`} label="Start date">
          {(a) => <Input {...a} type="date" value={value.startDate} onChange={(e) => onChange({ ...value, startDate: e.target.value })} />}
        </Field>
        <Field id={`${idPrefix}-due`} label="Due back">
          {(a) => <Input {...a} type="date" value={value.dueDate} onChange={(e) => onChange({ ...value, dueDate: e.target.value })} />}
        </Field>
      </div>
      {calendar.data && (
        <div>
          <p className="mb-1 text-sm text-ink-700">
            Busy days of this kit in {month.from.slice(0, 7)} ({calendar.data.data.shippingDays} shipping days each way included):
          </p>
          <MonthCalendar month={month} busy={calendar.data.data.busy} />
        </div>
      )}
    </div>
  );
}
