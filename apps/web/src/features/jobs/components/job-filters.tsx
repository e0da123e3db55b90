import { useEffect, useState } from 'react';
import { Field } from '../../../components/ui/field';
import { SearchInput } from '../../../components/ui/search-input';
import { Select } from '../../../components/ui/select';
import { JOB_STATES, JOB_STATE_LABELS } from '@revloop/domain/jobs';
import { useCustomers } from '../../customers/api/get-customers';
import { useMembers } from '../../members/api/get-members';
import { usePackages } from '../../packages/api/get-packages';
import type { JobsScreenState } from './job-list-params';

export interface JobFiltersProps {
  state: JobsScreenState;
  onChange: (patch: Partial<JobsScreenState>) => void;
  /** Tuners get "Only mine"; the owner does not work jobs. */
  showMine: boolean;
  /** The table filters by state too; the board has a column per state. */
  showState: boolean;
  /** Staff filter the jobs whose revision draft waits for a second person's approval. */
  showApproval?: boolean;
}

/** Waits for a pause in typing before the search reaches the server. */
function useDebounced(value: string, ms: number) {
  const [debounced, setDebounced] = useState(value);
  useEffect(() => {
    const timer = setTimeout(() => setDebounced(value), ms);
    return () => clearTimeout(timer);
  }, [value, ms]);
  return debounced;
}

/** Filters shared by the board and the table; the server applies them. */
export function JobFilters({ state, onChange, showMine, showState, showApproval = true }: JobFiltersProps) {
  const members = useMembers();
  const customers = useCustomers();
  const packages = usePackages();
  const [text, setText] = useState(state.q);
  const debounced = useDebounced(text, 300);
  useEffect(() => {
    if (debounced !== state.q) onChange({ q: debounced, page: 1 });
  }, [debounced, state.q, onChange]);

  const tuners = (members.data?.data ?? []).filter((m) => m.role === 'tuner');
  const dealers = [...new Map((customers.data?.data ?? []).flatMap((c) => (c.dealer ? [[c.dealer.id, c.dealer.name] as const] : []))).entries()];

  return (
    <div className="flex flex-wrap items-end gap-3">
      <SearchInput id="jobs-search" label="Search" placeholder="Job number, vehicle, VIN or customer" value={text} onChange={setText} />
      <div className="w-44">
        <Field id="jobs-tuner" label="Tuner">
          {(a11y) => (
            <Select
              {...a11y}
              value={state.mine ? '' : state.tuner}
              disabled={state.mine}
              onChange={(event) => onChange({ tuner: event.target.value, page: 1 })}
              options={[{ value: '', label: 'Any tuner' }, { value: 'unassigned', label: 'Unassigned' }, ...tuners.map((t) => ({ value: t.userId, label: t.name }))]}
            />
          )}
        </Field>
      </div>
      <div className="w-44">
        <Field id="jobs-dealer" label="Dealer">
          {(a11y) => (
            <Select
              {...a11y}
              value={state.dealer}
              onChange={(event) => onChange({ dealer: event.target.value, page: 1 })}
              options={[{ value: '', label: 'Any dealer' }, ...dealers.map(([id, name]) => ({ value: id, label: name }))]}
            />
          )}
        </Field>
      </div>
      <div className="w-48">
        <Field id="jobs-package" label="Package">
          {(a11y) => (
            <Select
              {...a11y}
              value={state.package}
              onChange={(event) => onChange({ package: event.target.value, page: 1 })}
              options={[{ value: '', label: 'Any package' }, ...(packages.data?.data ?? []).map((p) => ({ value: p.id, label: p.name }))]}
            />
          )}
        </Field>
      </div>
      {showState && (
        <div className="w-44">
          <Field id="jobs-state" label="State">
            {(a11y) => (
              <Select
                {...a11y}
                value={state.state}
                onChange={(event) => onChange({ state: event.target.value as JobsScreenState['state'], page: 1 })}
                options={[{ value: '', label: 'Any state' }, { value: 'open', label: 'Open jobs' }, ...JOB_STATES.map((s) => ({ value: s, label: JOB_STATE_LABELS[s] }))]}
              />
            )}
          </Field>
        </div>
      )}
      {showApproval && (
        <label className="flex h-10 items-center gap-2 text-sm font-medium text-ink-800">
          <input
            type="checkbox"
            className="size-4 accent-accent-600"
            checked={state.awaitingApproval}
            onChange={(event) => onChange({ awaitingApproval: event.target.checked, page: 1 })}
          />
          Drafts awaiting approval
        </label>
      )}
      {showMine && (
        <label className="flex h-10 items-center gap-2 text-sm font-medium text-ink-800">
          <input type="checkbox" className="size-4 accent-accent-600" checked={state.mine} onChange={(event) => onChange({ mine: event.target.checked, page: 1 })} />
          Only my jobs
        </label>
      )}
    </div>
  );
}
