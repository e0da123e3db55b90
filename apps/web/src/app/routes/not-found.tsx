import { Link } from 'react-router-dom';
import { buttonClasses } from '../../components/ui/button';
import { paths } from '../../config/paths';

export function NotFoundRoute() {
  return (
    <div className="flex flex-col items-center gap-3 py-16 text-center">
      <p className="text-sm font-medium text-accent-700">404</p>
      <h1 className="text-2xl font-semibold text-ink-900">Page not found</h1>
      <p className="max-w-md text-sm text-ink-600">There is no page at this address. It may have moved, or the link may be mistyped.</p>
      <Link to={paths.home.getHref()} className={buttonClasses('primary', 'md', 'mt-2')}>
        Go to the start page
      </Link>
    </div>
  );
}
