import { useRef, useState, type CSSProperties, type KeyboardEvent } from 'react';
import type { Job } from '@revloop/contract';
import { JOB_STATE_LABELS, type OpenJobState } from '@revloop/domain/jobs';
import { Banner } from '../../../components/ui/banner';
import { PageSpinner } from '../../../components/ui/spinner';
import { cn } from '../../../lib/cn';
import { errorMessage } from '../../../lib/form-errors';
import { useJobs } from '../api/get-jobs';
import { JobCard } from './job-card';
import { BOARD_STATES } from './job-format';
import { BOARD_PAGE_SIZE, boardParams, type JobsScreenState } from './job-list-params';
import { STATE_STYLES, StateIcon } from './job-state-style';

const COLLAPSED_KEY = 'revloop.board.collapsed';

function readCollapsed(): Set<OpenJobState> {
  try {
    const saved: unknown = JSON.parse(localStorage.getItem(COLLAPSED_KEY) ?? '[]');
    return new Set(Array.isArray(saved) ? (saved.filter((s) => (BOARD_STATES as readonly unknown[]).includes(s)) as OpenJobState[]) : []);
  } catch {
    return new Set();
  }
}

/** Folded columns, remembered on this device so a tuner who never looks at Intake keeps it folded. */
function useCollapsedColumns() {
  const [collapsed, setCollapsed] = useState(readCollapsed);
  const toggle = (state: OpenJobState) =>
    setCollapsed((current) => {
      const next = new Set(current);
      if (!next.delete(state)) next.add(state);
      localStorage.setItem(COLLAPSED_KEY, JSON.stringify([...next]));
      return next;
    });
  return { collapsed, toggle };
}

const countText = (count: number, stale: number) => `${count} ${count === 1 ? 'job' : 'jobs'}${stale > 0 ? `, ${stale} stale` : ''}`;

/**
 * The sticky bar above the board: every open state with its count, one tab stop whose arrow keys move between
 * states (a toolbar), Enter jumping to that column. Any column is Tab, a few arrows and Enter away.
 */
function StateBar({ counts, onJump }: { counts: Map<OpenJobState, { count: number; stale: number }>; onJump: (state: OpenJobState) => void }) {
  const [active, setActive] = useState(0);
  const buttons = useRef<Array<HTMLButtonElement | null>>([]);
  const onKeyDown = (event: KeyboardEvent<HTMLDivElement>) => {
    const step = { ArrowRight: 1, ArrowDown: 1, ArrowLeft: -1, ArrowUp: -1 }[event.key];
    const to = event.key === 'Home' ? 0 : event.key === 'End' ? BOARD_STATES.length - 1 : step === undefined ? undefined : (active + step + BOARD_STATES.length) % BOARD_STATES.length;
    if (to === undefined) return;
    event.preventDefault();
    setActive(to);
    buttons.current[to]?.focus();
  };
  return (
    <div
      role="toolbar"
      aria-label="Jump to a column"
      onKeyDown={onKeyDown}
      className="sticky top-14 z-20 -mx-1 flex flex-wrap gap-1.5 border-b border-ink-200 bg-ink-50/95 px-1 py-2 backdrop-blur"
    >
      {BOARD_STATES.map((state, index) => {
        const { count, stale } = counts.get(state) ?? { count: 0, stale: 0 };
        const style = STATE_STYLES[state];
        return (
          <button
            key={state}
            ref={(element) => {
              buttons.current[index] = element;
            }}
            type="button"
            tabIndex={index === active ? 0 : -1}
            onFocus={() => setActive(index)}
            onClick={() => onJump(state)}
            aria-label={`${JOB_STATE_LABELS[state]}: ${countText(count, stale)}`}
            className={cn('inline-flex items-center gap-1.5 rounded-full border border-transparent px-2.5 py-1 text-xs font-medium hover:border-current', style.soft, style.text)}
          >
            <StateIcon state={state} />
            {JOB_STATE_LABELS[state]}
            <span className="rounded-full bg-white/80 px-1.5 tabular-nums">{count}</span>
            {stale > 0 && <span aria-hidden="true">⚠{stale}</span>}
          </button>
        );
      })}
    </div>
  );
}

/**
 * Open jobs in a column per state, oldest move first, so the longest waits sit at the top. On a laptop all six
 * columns sit side by side with compact cards; a folded column gives its width to the others. On narrower
 * screens the columns wrap, and on a phone they stack.
 */
export function JobBoard({ state }: { state: JobsScreenState }) {
  const jobs = useJobs(boardParams(state));
  const { collapsed, toggle } = useCollapsedColumns();
  if (jobs.isPending) return <PageSpinner label="Loading jobs" />;
  if (jobs.isError) return <Banner tone="bad">{errorMessage(jobs.error)}</Banner>;
  const byState = new Map<OpenJobState, Job[]>(BOARD_STATES.map((s) => [s, []]));
  for (const job of jobs.data.data) byState.get(job.state as OpenJobState)?.push(job);
  const counts = new Map(BOARD_STATES.map((s) => [s, { count: byState.get(s)?.length ?? 0, stale: byState.get(s)?.filter((job) => job.stale).length ?? 0 }]));
  const { total } = jobs.data.meta;

  const jump = (target: OpenJobState) => {
    if (collapsed.has(target)) toggle(target);
    const column = document.getElementById(`board-column-${target}`);
    column?.focus({ preventScroll: true });
    column?.scrollIntoView({ block: 'start', behavior: 'smooth' });
  };
  // Folded columns shrink to a narrow strip on a laptop; the others share the rest.
  const template = BOARD_STATES.map((s) => (collapsed.has(s) ? '2.75rem' : 'minmax(0, 1fr)')).join(' ');

  return (
    <div className="flex flex-col gap-3">
      {total > BOARD_PAGE_SIZE && (
        <Banner tone="warn">
          The board shows the {BOARD_PAGE_SIZE} longest-waiting of {total} open jobs. Narrow the filters or use the table view.
        </Banner>
      )}
      <StateBar counts={counts} onJump={jump} />
      <div className="grid grid-cols-1 gap-2 sm:grid-cols-2 lg:grid-cols-3 xl:[grid-template-columns:var(--board-columns)]" style={{ '--board-columns': template } as CSSProperties}>
        {BOARD_STATES.map((s) => {
          const column = byState.get(s) ?? [];
          const { stale } = counts.get(s)!;
          const folded = collapsed.has(s);
          const style = STATE_STYLES[s];
          return (
            <section
              key={s}
              id={`board-column-${s}`}
              tabIndex={-1}
              aria-labelledby={`board-${s}`}
              className="flex min-w-0 scroll-mt-28 flex-col gap-2 rounded-card bg-ink-100 p-1.5"
            >
              <div className={cn('flex items-start gap-1 rounded-md border-t-4 bg-white/70 px-1.5 py-1', folded && 'xl:flex-col xl:items-center', style.text)} style={{ borderTopColor: 'currentColor' }}>
                <h2 id={`board-${s}`} className={cn('flex min-w-0 flex-1 flex-wrap items-center gap-x-1.5 text-sm font-semibold', folded && 'xl:[writing-mode:vertical-rl]')}>
                  <StateIcon state={s} />
                  <span>{JOB_STATE_LABELS[s]}</span>
                  <span className="text-xs font-normal text-ink-700">{countText(column.length, stale)}</span>
                </h2>
                <button
                  type="button"
                  aria-expanded={!folded}
                  aria-controls={`board-cards-${s}`}
                  aria-label={`${folded ? 'Unfold' : 'Fold'} ${JOB_STATE_LABELS[s]}`}
                  title={folded ? 'Unfold' : 'Fold'}
                  onClick={() => toggle(s)}
                  className="rounded p-0.5 text-ink-600 hover:bg-ink-200 hover:text-ink-900"
                >
                  <svg aria-hidden="true" viewBox="0 0 16 16" className={cn('size-4 transition-transform', folded ? '-rotate-90' : '')} fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round">
                    <path d="M4 6l4 4 4-4" />
                  </svg>
                </button>
              </div>
              <div id={`board-cards-${s}`} hidden={folded} className="flex flex-col gap-1.5">
                {column.length === 0 ? <p className="px-1 py-4 text-center text-xs text-ink-600">No jobs here.</p> : column.map((job) => <JobCard key={job.id} job={job} />)}
              </div>
            </section>
          );
        })}
      </div>
    </div>
  );
}
