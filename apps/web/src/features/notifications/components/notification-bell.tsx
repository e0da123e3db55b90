import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { usePopover } from '../../../lib/use-popover';
import { useNotifications } from '../api/get-notifications';
import { useMarkNotificationsRead } from '../api/mark-notifications-read';
import { NotificationList } from './notification-list';

const PREVIEW = 8;

/** The header bell: unread count on the button, the latest notifications in a panel. Escape or a click outside closes it. */
export function NotificationBell() {
  const notifications = useNotifications();
  const markRead = useMarkNotificationsRead();
  const { open, setOpen, rootRef, buttonProps, panelId } = usePopover();
  const unread = notifications.data?.meta.unread ?? 0;

  return (
    <div ref={rootRef} className="relative">
      <button
        {...buttonProps}
        aria-label={unread > 0 ? `Notifications, ${unread} unread` : 'Notifications'}
        className="relative rounded-lg p-2 text-ink-700 hover:bg-ink-100"
      >
        <svg
          aria-hidden="true"
          viewBox="0 0 24 24"
          className="size-5"
          fill="none"
          stroke="currentColor"
          strokeWidth="2"
          strokeLinecap="round"
          strokeLinejoin="round"
        >
          <path d="M6 8a6 6 0 1 1 12 0c0 7 3 9 3 9H3s3-2 3-9" />
          <path d="M10.3 21a1.94 1.94 0 0 0 3.4 0" />
        </svg>
        {unread > 0 && (
          <span
            aria-hidden="true"
            className="absolute -top-0.5 -right-0.5 min-w-5 rounded-full bg-bad px-1 text-center text-[0.7rem] leading-5 font-semibold text-white"
          >
            {unread > 99 ? '99+' : unread}
          </span>
        )}
      </button>
      {open && (
        <div
          id={panelId}
          role="region"
          aria-label="Notifications"
          className="absolute right-0 z-40 mt-2 w-[min(24rem,calc(100vw-2rem))] rounded-card border border-ink-200 bg-white p-3 shadow-lg"
        >
          <div className="flex items-center justify-between gap-2 px-1">
            <p className="text-sm font-semibold text-ink-900">Notifications</p>
            {unread > 0 && (
              <button
                type="button"
                className="rounded px-2 py-1 text-xs font-medium text-accent-700 hover:bg-accent-50"
                onClick={() => markRead.mutate(undefined)}
              >
                Mark all read
              </button>
            )}
          </div>
          <div className="max-h-96 overflow-y-auto">
            <NotificationList
              items={(notifications.data?.data ?? []).slice(0, PREVIEW)}
              onOpen={() => setOpen(false)}
              onMarkRead={(id) => markRead.mutate([id])}
            />
          </div>
          <Link
            to={paths.settings.notifications.getHref()}
            onClick={() => setOpen(false)}
            className="mt-2 block rounded px-1 py-1 text-sm font-medium text-accent-700 hover:underline"
          >
            All notifications and e-mail settings
          </Link>
        </div>
      )}
    </div>
  );
}
