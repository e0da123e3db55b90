import { useNavigate } from 'react-router-dom';
import { AuthCard } from '../../../components/layout/auth-card';
import { PageSpinner } from '../../../components/ui/spinner';
import { TextLink } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';
import { SignInForm } from '../../../features/auth/components/sign-in-form';
import { useRedirectWhenSignedIn } from './use-redirect-when-signed-in';

export function SignInRoute() {
  const navigate = useNavigate();
  const { target, checking } = useRedirectWhenSignedIn();
  if (checking) return <PageSpinner />;
  return (
    <AuthCard
      title="Sign in"
      description="Welcome back. Sign in to your shop."
      footer={
        <>
          New here? <TextLink to={paths.auth.signUp.getHref()}>Create a shop</TextLink>
        </>
      }
    >
      <SignInForm onSuccess={() => navigate(target, { replace: true })} />
    </AuthCard>
  );
}
