import type { TimelineEntry } from '@revloop/contract';
import { Card } from '../../../components/ui/card';
import { formatDateTime } from '../../../lib/format';

/** Everything that happened to the job, newest first. */
export function JobTimeline({ entries }: { entries: TimelineEntry[] }) {
  return (
    <Card title="Timeline">
      {entries.length === 0 ? (
        <p className="text-sm text-ink-600">Nothing yet.</p>
      ) : (
        <ol className="flex flex-col gap-3 border-l-2 border-ink-200 pl-4">
          {entries.map((entry) => (
            <li key={entry.id} className="relative text-sm">
              <span aria-hidden="true" className="absolute top-1.5 -left-[1.3rem] size-2 rounded-full bg-accent-600" />
              <p className="text-ink-900">{entry.text}</p>
              <p className="text-xs text-ink-600">
                <time dateTime={entry.at}>{formatDateTime(entry.at)}</time>
                {entry.actor && ` · ${entry.actor}`}
              </p>
            </li>
          ))}
        </ol>
      )}
    </Card>
  );
}
