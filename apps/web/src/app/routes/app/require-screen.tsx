import type { ReactNode } from 'react';
import { useAbility } from '@casl/react';
import type { AppAbility } from '@revloop/domain/auth';
import { EmptyState } from '../../../components/ui/empty-state';
import { TextLink } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';
import { useSignedInMe } from '../../../features/auth/api/get-me';
import { canOpen, type Screen } from '../../../features/auth/components/nav-items';

/** Renders a screen only for users who may open it (the same rule as the navigation); others get a plain explanation. */
export function RequireScreen({ screen, children }: { screen: Screen; children: ReactNode }) {
  const ability = useAbility<AppAbility>();
  const me = useSignedInMe();
  if (canOpen(screen, ability, me)) return children;
  return (
    <EmptyState title="This page is not part of your role">
      Your account cannot open it. <TextLink to={paths.home.getHref()}>Go to your start page</TextLink>.
    </EmptyState>
  );
}
