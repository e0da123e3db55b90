import { useParams } from 'react-router-dom';
import { Banner } from '../../../components/ui/banner';
import { PageSpinner } from '../../../components/ui/spinner';
import { TextLink } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';
import { usePublicShop } from '../../../features/public/api/get-public-shop';
import { PublicShopPage } from '../../../features/public/components/public-shop-page';
import { isApiError } from '../../../lib/api-client';
import { errorMessage } from '../../../lib/form-errors';

/** `/s/:slug`: a shop's public page, open to anyone. */
export function PublicShopRoute() {
  const { slug = '' } = useParams();
  const shop = usePublicShop(slug);
  if (shop.isPending) return <PageSpinner label="Loading the shop's page" />;
  if (shop.isError) {
    return (
      <div className="w-full max-w-xl">
        <Banner
          tone={isApiError(shop.error) && shop.error.status === 404 ? 'neutral' : 'bad'}
          title="No shop page here"
        >
          {isApiError(shop.error) && shop.error.status === 404
            ? 'This address has no public page: check the link with the shop.'
            : errorMessage(shop.error)}{' '}
          <TextLink to={paths.auth.signIn.getHref()}>Sign in</TextLink> if you already have an
          account.
        </Banner>
      </div>
    );
  }
  return <PublicShopPage shop={shop.data.data} />;
}
