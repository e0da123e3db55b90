import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { textLinkClasses } from '../../../components/ui/text-link';
import { useMailbox } from '../api/get-mailbox';

/** Shown in development builds, or when the server has a development mailbox to show. */
export function MailboxLink() {
  const inDevelopment = import.meta.env.DEV;
  const probe = useMailbox({ enabled: !inDevelopment });
  if (!inDevelopment && !probe.isSuccess) return null;
  return (
    <Link to={paths.dev.mailbox.getHref()} className={textLinkClasses}>
      Development mailbox
    </Link>
  );
}
