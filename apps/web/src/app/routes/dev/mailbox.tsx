import { PageHeader } from '../../../components/layout/page-header';
import { MailboxView } from '../../../features/mailbox/components/mailbox-view';
import { RequireScreen } from '../app/require-screen';

export function MailboxRoute() {
  return (
    <RequireScreen screen="mailbox">
      <div className="w-full max-w-6xl">
        <PageHeader title="Development mailbox" description="Mails the app sent through the local mail stand-in (development and demo). Only platform admins see them." />
        <MailboxView />
      </div>
    </RequireScreen>
  );
}
