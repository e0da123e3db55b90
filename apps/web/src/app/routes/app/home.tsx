import { Navigate } from 'react-router-dom';
import { useAbility } from '@casl/react';
import type { AppAbility } from '@revloop/domain/auth';
import { useSignedInMe } from '../../../features/auth/api/get-me';
import { homePathFor } from '../../../features/auth/components/nav-items';

/** `/` opens the first screen of the user's role. */
export function HomeRoute() {
  const ability = useAbility<AppAbility>();
  const me = useSignedInMe();
  return <Navigate to={homePathFor(ability, me)} replace />;
}
