import { useAbility } from '@casl/react';
import type { AppAbility } from '@revloop/domain/auth';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { textLinkClasses } from '../../../components/ui/text-link';
import { useMailbox } from '../api/get-mailbox';

/** For platform admins only (the mailbox holds reset links), and only when the server runs the local mail stand-in. */
export function MailboxLink() {
  const allowed = useAbility<AppAbility>().can('read', 'Mailbox');
  const probe = useMailbox({ enabled: allowed });
  if (!allowed || !probe.isSuccess) return null;
  return (
    <Link to={paths.dev.mailbox.getHref()} className={textLinkClasses}>
      Development mailbox
    </Link>
  );
}
