import { useEffect, useRef } from 'react';
import { useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { AuthCard } from '../../../components/layout/auth-card';
import { Banner } from '../../../components/ui/banner';
import { PageSpinner } from '../../../components/ui/spinner';
import { TextLink } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';
import { useVerifyStart } from '../../../features/public/api/verify-start';
import { errorMessage } from '../../../lib/form-errors';

/** `/s/:slug/verify?token=…`: the e-mailed link; confirms the address, signs in and lands on the new job. */
export function PublicVerifyRoute() {
  const { slug = '' } = useParams();
  const [params] = useSearchParams();
  const token = params.get('token') ?? '';
  const navigate = useNavigate();
  const verify = useVerifyStart(slug);
  const sent = useRef(false);
  useEffect(() => {
    // The link works once: a second effect run (React's development double-run) must not spend it again.
    if (sent.current) return;
    sent.current = true;
    verify.mutate(token, {
      onSuccess: (res) => navigate(paths.job.getHref(res.data.jobId), { replace: true }),
    });
  }, [token, verify, navigate]);

  if (verify.isError) {
    return (
      <AuthCard title="This link did not work">
        <Banner tone="bad">{errorMessage(verify.error)}</Banner>
        <p className="mt-4 text-sm text-ink-700">
          <TextLink to={paths.publicShop.getHref(slug)}>Back to the shop's page</TextLink> ·{' '}
          <TextLink to={paths.auth.signIn.getHref()}>Sign in</TextLink>
        </p>
      </AuthCard>
    );
  }
  return <PageSpinner label="Opening your job" />;
}
