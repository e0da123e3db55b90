import { useState } from 'react';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { Select } from '../../../components/ui/select';
import { Spinner } from '../../../components/ui/spinner';
import { errorMessage } from '../../../lib/form-errors';
import { useDatalogMapping, type DatalogMapping } from '../api/get-datalog-mapping';
import { useUpdateDatalogMapping } from '../api/update-datalog-mapping';

const NOT_LOGGED = '';

function MappingForm({ datalogId, mapping, onDone }: { datalogId: string; mapping: DatalogMapping; onDone: () => void }) {
  const update = useUpdateDatalogMapping();
  const [choice, setChoice] = useState<Record<string, string>>(() =>
    Object.fromEntries(mapping.canonical.map(({ channel }) => [channel, mapping.channels[channel] ?? NOT_LOGGED])),
  );
  const options = [{ value: NOT_LOGGED, label: 'Not logged' }, ...mapping.headers.map((h) => ({ value: h, label: h }))];
  return (
    <form
      className="flex flex-col gap-3"
      onSubmit={(e) => {
        e.preventDefault();
        update.mutate({ datalogId, channels: choice }, { onSuccess: onDone });
      }}
    >
      <p>
        Which column holds each channel? The log is checked again with your choice, and the shop remembers it for every log with these same columns.
        {mapping.remembered && ' This header set already has a confirmed mapping.'}
      </p>
      <div className="grid max-h-[55vh] gap-2 overflow-y-auto pr-1">
        {mapping.canonical.map(({ channel, label, unit }) => (
          <label key={channel} className="grid grid-cols-[minmax(0,1fr)_minmax(0,1.3fr)] items-center gap-2">
            <span className="text-ink-800">
              {label}
              {unit && <span className="text-ink-500"> ({unit})</span>}
            </span>
            <Select options={options} value={choice[channel] ?? NOT_LOGGED} onChange={(e) => setChoice((c) => ({ ...c, [channel]: e.target.value }))} />
          </label>
        ))}
      </div>
      {update.isError && <Banner tone="bad" title="The mapping was not saved">{errorMessage(update.error)}</Banner>}
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

/** Confirm or fix which log column feeds which channel. */
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
