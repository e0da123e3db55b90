import { useState } from 'react';
import type { DatalogMapping } from '@revloop/contract';
import type { AfrScale, DatalogMappingInput } from '@revloop/domain/datalog';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { Select } from '../../../components/ui/select';
import { Spinner } from '../../../components/ui/spinner';
import { errorMessage } from '../../../lib/form-errors';
import { useDatalogMapping } from '../api/get-datalog-mapping';
import { useUpdateDatalogMapping } from '../api/update-datalog-mapping';

const NOT_LOGGED = '';
/** No unit stated: the one the header names is used, else the channel's own. */
const FROM_HEADER = '';
const UNSTATED = '';

const AFR_SCALE_OPTIONS = [
  { value: UNSTATED, label: 'Not confirmed: check it against cruise' },
  { value: 'fuel', label: "The fuel's own (e.g. 9.8 for E85)" },
  { value: 'gasoline', label: "Petrol's 14.7 (λ × 14.7), whatever the fuel" },
] satisfies { value: AfrScale | typeof UNSTATED; label: string }[];

const TRIM_AXIS_OPTIONS = [
  { value: UNSTATED, label: 'MAP where logged, else airflow' },
  { value: 'map', label: 'Manifold pressure (kPa)' },
  { value: 'maf', label: 'Mass airflow (g/s)' },
];

function MappingForm({ datalogId, mapping, onDone }: { datalogId: string; mapping: DatalogMapping; onDone: () => void }) {
  const update = useUpdateDatalogMapping();
  const [choice, setChoice] = useState<Record<string, string>>(() =>
    Object.fromEntries(mapping.canonical.map(({ channel }) => [channel, mapping.channels[channel] ?? NOT_LOGGED])),
  );
  const [units, setUnits] = useState<Record<string, string>>(() => ({ ...mapping.stated }));
  const [afrScale, setAfrScale] = useState<string>(mapping.afrScale ?? UNSTATED);
  const [trimAxis, setTrimAxis] = useState<string>(mapping.trimAxis ?? UNSTATED);
  const options = [{ value: NOT_LOGGED, label: 'Not logged' }, ...mapping.headers.map((h) => ({ value: h, label: h }))];
  const submit = () => {
    const input: DatalogMappingInput = {
      channels: choice,
      // A unit only means something for a channel that has a column.
      units: Object.fromEntries(Object.entries(units).filter(([channel, unit]) => unit !== FROM_HEADER && choice[channel] !== NOT_LOGGED)),
      ...(afrScale !== UNSTATED && { afrScale: afrScale as AfrScale }),
      ...(trimAxis !== UNSTATED && { trimAxis: trimAxis as 'map' | 'maf' }),
    };
    update.mutate({ datalogId, ...input }, { onSuccess: onDone });
  };
  return (
    <form
      className="flex flex-col gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        submit();
      }}
    >
      <p>
        Which column holds each channel, and in which unit? The log is checked again with your choice, and the shop remembers it for every log with these same
        columns.
        {mapping.remembered && ' This header set already has a confirmed mapping.'}
      </p>
      {mapping.unmapped.length > 0 && <p className="text-sm text-ink-700">Columns no channel takes now: {mapping.unmapped.join(', ')}.</p>}
      <div className="grid max-h-[50vh] gap-2 overflow-y-auto pr-1">
        {mapping.canonical.map(({ channel, label, unit, unitChoices }) => {
          const header = choice[channel] ?? NOT_LOGGED;
          const read = mapping.channels[channel] === header ? mapping.units[channel] : null;
          // Short labels: the dialog is narrow on a phone.
          const unitOptions = [{ value: FROM_HEADER, label: read ? `${read} (header)` : `${unit || '—'} (default)` }, ...unitChoices];
          return (
            <div key={channel} className="grid grid-cols-[minmax(0,1fr)_minmax(0,1.3fr)_minmax(0,0.9fr)] items-center gap-2">
              <label htmlFor={`map-${channel}`} className="text-ink-800">
                {label}
                {unit && <span className="text-ink-500"> ({unit})</span>}
              </label>
              <Select id={`map-${channel}`} options={options} value={header} onChange={(e) => setChoice((c) => ({ ...c, [channel]: e.target.value }))} />
              {unitChoices.length > 1 ? (
                <Select
                  aria-label={`Unit of ${label}`}
                  options={unitOptions}
                  value={units[channel] ?? FROM_HEADER}
                  disabled={header === NOT_LOGGED}
                  onChange={(e) => setUnits((u) => ({ ...u, [channel]: e.target.value }))}
                />
              ) : (
                <span />
              )}
            </div>
          );
        })}
      </div>
      <div className="grid gap-2 sm:grid-cols-2">
        <label className="flex flex-col gap-1 text-sm text-ink-800">
          Air-fuel ratio columns are written on
          <Select options={AFR_SCALE_OPTIONS} value={afrScale} onChange={(e) => setAfrScale(e.target.value)} />
          <span className="text-xs text-ink-600">Many wideband controllers print petrol's scale whatever the fuel. A wrong scale turns into fuel advice that can harm an engine.</span>
        </label>
        <label className="flex flex-col gap-1 text-sm text-ink-800">
          Fuel-trim grid by
          <Select options={TRIM_AXIS_OPTIONS} value={trimAxis} onChange={(e) => setTrimAxis(e.target.value)} />
        </label>
      </div>
      {update.isError && (
        <Banner tone="bad" title="The mapping was not saved">
          {errorMessage(update.error)}
        </Banner>
      )}
      <div className="flex justify-end gap-2">
        <Button variant="secondary" onClick={onDone} disabled={update.isPending}>
          Cancel
        </Button>
        <Button type="submit" pending={update.isPending}>
          Confirm and check again
        </Button>
      </div>
    </form>
  );
}

/** Confirm or fix which log column feeds which channel, in which unit, and the scale of its AFR columns. */
export function MappingDialog({ datalogId, open, onClose }: { datalogId: string; open: boolean; onClose: () => void }) {
  const mapping = useDatalogMapping(datalogId, { enabled: open });
  return (
    <Dialog open={open} title="Confirm the column mapping" onClose={onClose}>
      {mapping.isPending && <Spinner label="Loading the mapping" />}
      {mapping.isError && <Banner tone="bad">{errorMessage(mapping.error)}</Banner>}
      {mapping.data && <MappingForm datalogId={datalogId} mapping={mapping.data.data} onDone={onClose} />}
    </Dialog>
  );
}
