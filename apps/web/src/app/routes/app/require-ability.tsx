import type { ReactNode } from 'react';
import { useAbility } from '@casl/react';
import type { Action, AppAbility, SubjectName } from '@revloop/domain/auth';
import { EmptyState } from '../../../components/ui/empty-state';
import { TextLink } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';

/** Renders a screen only for users the ability allows; others get a plain explanation, not a broken page. */
export function RequireAbility({ action, subject, children }: { action: Action; subject: SubjectName; children: ReactNode }) {
  const ability = useAbility<AppAbility>();
  if (ability.can(action, subject)) return children;
  return (
    <EmptyState title="This page is not part of your role">
      Your account cannot open it. <TextLink to={paths.home.getHref()}>Go to your start page</TextLink>.
    </EmptyState>
  );
}
