import { useNavigate, useParams } from 'react-router-dom';
import { AuthCard } from '../../../components/layout/auth-card';
import { Banner } from '../../../components/ui/banner';
import { PageSpinner } from '../../../components/ui/spinner';
import { TextLink } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';
import { useInvitationByToken } from '../../../features/auth/api/get-invitation-by-token';
import { AcceptInvitationForm, InvitationSummary } from '../../../features/auth/components/accept-invitation-form';
import { isApiError } from '../../../lib/api-client';
import { errorMessage } from '../../../lib/form-errors';

export function InvitationRoute() {
  const { token = '' } = useParams();
  const navigate = useNavigate();
  const lookup = useInvitationByToken(token);

  if (lookup.isPending) return <PageSpinner label="Loading the invitation" />;
  if (lookup.isError) {
    const gone = isApiError(lookup.error) && lookup.error.status === 404;
    return (
      <AuthCard title="Invitation" footer={<TextLink to={paths.auth.signIn.getHref()}>Go to sign in</TextLink>}>
        <Banner tone="warn" title={gone ? 'This invitation is not valid' : 'The invitation could not be loaded'}>
          {gone ? 'It may have expired, been revoked or already been accepted. Ask the shop to send a new one.' : errorMessage(lookup.error)}
        </Banner>
      </AuthCard>
    );
  }
  const invitation = lookup.data.data;
  return (
    <AuthCard title={`Join ${invitation.shopName}`} description="You have been invited to Revloop. Choose your name and a password to accept.">
      <div className="flex flex-col gap-6">
        <InvitationSummary invitation={invitation} />
        <AcceptInvitationForm token={token} onSuccess={() => navigate(paths.home.getHref(), { replace: true })} />
      </div>
    </AuthCard>
  );
}
