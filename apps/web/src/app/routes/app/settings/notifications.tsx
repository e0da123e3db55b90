import { Banner } from '../../../../components/ui/banner';
import { Button } from '../../../../components/ui/button';
import { Card } from '../../../../components/ui/card';
import { PageSpinner } from '../../../../components/ui/spinner';
import { useNotifications } from '../../../../features/notifications/api/get-notifications';
import { useMarkNotificationsRead } from '../../../../features/notifications/api/mark-notifications-read';
import { NotificationList } from '../../../../features/notifications/components/notification-list';
import { NotificationPreferencesForm } from '../../../../features/notifications/components/notification-preferences-form';
import { errorMessage } from '../../../../lib/form-errors';

export function NotificationsSettingsRoute() {
  const notifications = useNotifications();
  const markRead = useMarkNotificationsRead();
  const unread = notifications.data?.meta.unread ?? 0;
  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]">
      <Card
        title="Notifications"
        description={unread > 0 ? `${unread} unread` : 'All read.'}
        actions={
          unread > 0 ? (
            <Button size="sm" variant="secondary" pending={markRead.isPending} onClick={() => markRead.mutate(undefined)}>
              Mark all read
            </Button>
          ) : undefined
        }
      >
        {notifications.isPending ? (
          <PageSpinner label="Loading notifications" />
        ) : notifications.isError ? (
          <Banner tone="bad">{errorMessage(notifications.error)}</Banner>
        ) : (
          <NotificationList items={notifications.data.data} onMarkRead={(id) => markRead.mutate([id])} />
        )}
      </Card>
      <Card title="E-mail">
        <NotificationPreferencesForm />
      </Card>
    </div>
  );
}
