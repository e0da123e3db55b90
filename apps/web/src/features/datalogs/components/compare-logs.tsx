import { useState } from 'react';
import type { Datalog } from '@revloop/contract';
import { Banner } from '../../../components/ui/banner';
import { Select } from '../../../components/ui/select';
import { Spinner } from '../../../components/ui/spinner';
import { errorMessage } from '../../../lib/form-errors';
import { formatDateTime } from '../../../lib/format';
import { revisionLabel } from '../api/get-datalog';
import { useDatalogComparison } from '../api/get-datalog-comparison';
import { formatSigned } from '../../../lib/format';

const pct = (v: number | null) => (v === null ? '—' : `${formatSigned(v)} %`);

/** Before/after: this log against another log of the same job, cell by cell and rpm bin by rpm bin. */
export function CompareLogs({ datalogId, others }: { datalogId: string; others: Datalog[] }) {
  const [otherId, setOtherId] = useState<string | null>(null);
  const comparison = useDatalogComparison(datalogId, otherId);
  if (others.length === 0) return <p className="text-sm text-ink-600">This job has no other checked log to compare with yet.</p>;
  const data = comparison.data?.data;
  return (
    <div className="flex flex-col gap-4">
      <label className="flex max-w-md flex-col gap-1.5 text-sm font-medium text-ink-800">
        Compare with
        <Select
          value={otherId ?? ''}
          onChange={(e) => setOtherId(e.target.value || null)}
          options={[
            { value: '', label: 'Choose another log of this job' },
            ...others.map((o) => ({ value: o.id, label: `${o.originalName} — ${revisionLabel(o.round)}, ${formatDateTime(o.createdAt)}` })),
          ]}
        />
      </label>
      {comparison.isFetching && <Spinner label="Comparing" />}
      {comparison.isError && <Banner tone="bad">{errorMessage(comparison.error)}</Banner>}
      {data && (
        <div className="grid gap-6 lg:grid-cols-2">
          <div>
            <h3 className="mb-1 text-sm font-semibold text-ink-900">Full-throttle λ error by rpm (+ lean)</h3>
            <table className="w-full text-sm tabular-nums">
              <thead className="text-left text-ink-600">
                <tr>
                  <th scope="col" className="font-medium">rpm</th>
                  <th scope="col" className="font-medium">This log</th>
                  <th scope="col" className="font-medium">Other</th>
                  <th scope="col" className="font-medium">Change</th>
                </tr>
              </thead>
              <tbody>
                {data.lambdaError.map((b) => (
                  <tr key={b.rpm[0]} className="border-t border-ink-100">
                    <td>{b.rpm[0]}–{b.rpm[1]}</td>
                    <td>{pct(b.baseErrorPct)}</td>
                    <td>{pct(b.otherErrorPct)}</td>
                    <td>{pct(b.deltaPct)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <div>
            <h3 className="mb-1 text-sm font-semibold text-ink-900">Fuel trim by cell (+ lean)</h3>
            <div className="max-h-80 overflow-y-auto">
              <table className="w-full text-sm tabular-nums">
                <thead className="text-left text-ink-600">
                  <tr>
                    <th scope="col" className="font-medium">rpm</th>
                    <th scope="col" className="font-medium">MAP kPa</th>
                    <th scope="col" className="font-medium">This log</th>
                    <th scope="col" className="font-medium">Other</th>
                    <th scope="col" className="font-medium">Change</th>
                  </tr>
                </thead>
                <tbody>
                  {data.fuelTrim.map((c) => (
                    <tr key={`${c.rpm[0]}:${c.map[0]}`} className="border-t border-ink-100">
                      <td>{c.rpm[0]}–{c.rpm[1]}</td>
                      <td>{c.map[0]}–{c.map[1]}</td>
                      <td>{pct(c.baseTrimPct)}</td>
                      <td>{pct(c.otherTrimPct)}</td>
                      <td>{pct(c.deltaPct)}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          </div>
        </div>
      )}
    </div>
  );
}
