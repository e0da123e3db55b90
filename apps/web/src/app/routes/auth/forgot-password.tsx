import { AuthCard } from '../../../components/layout/auth-card';
import { TextLink } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';
import { ForgotPasswordForm } from '../../../features/auth/components/forgot-password-form';

export function ForgotPasswordRoute() {
  return (
    <AuthCard
      title="Reset your password"
      description="Enter the e-mail you sign in with. We will send a link to choose a new password."
      footer={<TextLink to={paths.auth.signIn.getHref()}>Back to sign in</TextLink>}
    >
      <ForgotPasswordForm />
    </AuthCard>
  );
}
