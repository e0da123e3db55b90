import { CHECK_TITLES, type CheckStatus, type DatalogCheck } from '@revloop/domain/datalog';
import { cn } from '../../../lib/cn';

// Word and shape as well as colour, so the result never rests on colour alone.
const STATUS: Record<CheckStatus, { word: string; mark: string; className: string }> = {
  pass: { word: 'Pass', mark: '✓', className: 'bg-ok-soft text-ok' },
  warn: { word: 'Check', mark: '!', className: 'bg-warn-soft text-warn' },
  fail: { word: 'Redo', mark: '✕', className: 'bg-bad-soft text-bad' },
};

/** The log's checks in plain words, each with pass / check / redo. */
export function Checklist({ checks }: { checks: DatalogCheck[] }) {
  return (
    <ul aria-label="Log checks" className="flex flex-col gap-2">
      {checks.map((check) => {
        const status = STATUS[check.status];
        return (
          <li key={check.id} className="flex items-start gap-3 rounded-lg border border-ink-100 px-3 py-2">
            <span className={cn('mt-0.5 inline-flex min-w-16 items-center justify-center gap-1 rounded-full px-2 py-0.5 text-xs font-semibold', status.className)}>
              <span aria-hidden="true">{status.mark}</span>
              {status.word}
            </span>
            <div className="min-w-0 text-sm">
              <p className="font-medium text-ink-900">{CHECK_TITLES[check.id] ?? check.id}</p>
              <p className="text-ink-700">{check.message}</p>
            </div>
          </li>
        );
      })}
    </ul>
  );
}

/** One line that sums a checklist up: a customer sees at once whether to log again. */
export function checksSummary(checks: DatalogCheck[]): { tone: 'ok' | 'warn' | 'bad'; text: string } {
  const fails = checks.filter((c) => c.status === 'fail').length;
  const warns = checks.filter((c) => c.status === 'warn').length;
  if (fails > 0) return { tone: 'bad', text: `${fails} check${fails === 1 ? '' : 's'} failed: this log needs to be redone. See what to change below.` };
  if (warns > 0) return { tone: 'warn', text: `Usable, with ${warns} point${warns === 1 ? '' : 's'} to look at.` };
  return { tone: 'ok', text: 'Every check passed: the log is usable.' };
}
