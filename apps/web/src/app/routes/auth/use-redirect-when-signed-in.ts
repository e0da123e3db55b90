import { useEffect } from 'react';
import { useNavigate, useSearchParams } from 'react-router-dom';
import { useMe } from '../../../features/auth/api/get-me';
import { paths } from '../../../config/paths';

/** Only same-app paths are followed after sign-in, so a crafted link cannot send the user elsewhere. */
export function safeRedirect(target: string | null): string {
  return target && target.startsWith('/') && !target.startsWith('//') ? target : paths.home.getHref();
}

/** Sends a user who is already signed in away from the sign-in and sign-up pages. */
export function useRedirectWhenSignedIn() {
  const me = useMe();
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const target = safeRedirect(params.get('redirectTo'));
  useEffect(() => {
    if (me.data) navigate(target, { replace: true });
  }, [me.data, navigate, target]);
  return { target, checking: me.isPending };
}
