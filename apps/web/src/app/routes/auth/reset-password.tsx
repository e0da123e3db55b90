import { useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { AuthCard } from '../../../components/layout/auth-card';
import { Banner } from '../../../components/ui/banner';
import { TextLink } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';
import { ResetPasswordForm } from '../../../features/auth/components/reset-password-form';

export function ResetPasswordRoute() {
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const [done, setDone] = useState(false);
  return (
    <AuthCard title="Choose a new password" footer={<TextLink to={paths.auth.signIn.getHref()}>Back to sign in</TextLink>}>
      {done ? (
        <Banner tone="ok" title="Password changed">
          You can now <TextLink to={paths.auth.signIn.getHref()}>sign in</TextLink> with your new password.
        </Banner>
      ) : token ? (
        <ResetPasswordForm token={token} onSuccess={() => setDone(true)} />
      ) : (
        <Banner tone="warn" title="This link is incomplete">
          Open the link from the e-mail again, or <TextLink to={paths.auth.forgotPassword.getHref()}>ask for a new one</TextLink>.
        </Banner>
      )}
    </AuthCard>
  );
}
