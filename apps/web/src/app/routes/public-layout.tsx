import { Outlet } from 'react-router-dom';
import { PublicFrame } from '../../components/layout/public-frame';
import { MailboxLink } from '../../features/mailbox/components/mailbox-link';

export function PublicLayout() {
  return (
    <PublicFrame footer={<MailboxLink />}>
      <Outlet />
    </PublicFrame>
  );
}
