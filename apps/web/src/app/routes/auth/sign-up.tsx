import { useNavigate } from 'react-router-dom';
import { AuthCard } from '../../../components/layout/auth-card';
import { PageSpinner } from '../../../components/ui/spinner';
import { TextLink } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';
import { SignUpForm } from '../../../features/auth/components/sign-up-form';
import { useRedirectWhenSignedIn } from './use-redirect-when-signed-in';

export function SignUpRoute() {
  const navigate = useNavigate();
  const { checking } = useRedirectWhenSignedIn();
  if (checking) return <PageSpinner />;
  return (
    <AuthCard
      title="Create your shop"
      description="Set up a shop and its owner account. You can invite tuners, dealers and customers next."
      footer={
        <>
          Already have an account? <TextLink to={paths.auth.signIn.getHref()}>Sign in</TextLink>
        </>
      }
    >
      <SignUpForm onSuccess={() => navigate(paths.home.getHref(), { replace: true })} />
    </AuthCard>
  );
}
