import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { cn } from '../../../lib/cn';
import { formatDateTime } from '../../../lib/format';
import type { Notification } from '@revloop/contract';

/** Notifications newest first; unread ones are marked in words and with a dot. */
export function NotificationList({ items, onOpen, onMarkRead }: { items: Notification[]; onOpen?: () => void; onMarkRead: (id: string) => void }) {
  if (items.length === 0) return <p className="px-1 py-4 text-sm text-ink-600">No notifications yet.</p>;
  return (
    <ul className="flex flex-col divide-y divide-ink-100">
      {items.map((n) => (
        <li key={n.id} className={cn('flex gap-3 py-3', !n.readAt && 'bg-accent-50/60')}>
          <span aria-hidden="true" className={cn('mt-1.5 size-2 shrink-0 rounded-full', n.readAt ? 'bg-transparent' : 'bg-accent-600')} />
          <div className="min-w-0 flex-1 text-sm">
            <p className="font-medium text-ink-900">
              {!n.readAt && <span className="sr-only">Unread: </span>}
              {n.jobId ? (
                <Link to={paths.job.getHref(n.jobId)} className="hover:underline" onClick={() => { if (!n.readAt) onMarkRead(n.id); onOpen?.(); }}>
                  {n.title}
                </Link>
              ) : (
                n.title
              )}
            </p>
            <p className="text-ink-700">{n.body}</p>
            <p className="mt-0.5 text-xs text-ink-600">
              <time dateTime={n.createdAt}>{formatDateTime(n.createdAt)}</time>
            </p>
          </div>
          {!n.readAt && (
            <button type="button" className="self-start rounded px-2 py-1 text-xs font-medium text-accent-700 hover:bg-accent-50" onClick={() => onMarkRead(n.id)}>
              Mark read
            </button>
          )}
        </li>
      ))}
    </ul>
  );
}
