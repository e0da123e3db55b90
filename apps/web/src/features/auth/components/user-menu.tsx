import { Link, useNavigate } from 'react-router-dom';
import type { Me } from '@revloop/contract';
import { ROLE_LABELS } from '@revloop/domain/auth';
import { paths } from '../../../config/paths';
import { usePopover } from '../../../lib/use-popover';
import { useSignOut } from '../api/sign-out';

const itemClasses =
  'block w-full rounded-md px-3 py-2 text-left text-sm text-ink-800 hover:bg-ink-100';

/** The signed-in user's name; opens profile and sign-out. Closes on Escape or a click outside. */
export function UserMenu({ me }: { me: Me }) {
  const { open, setOpen, rootRef, buttonProps, panelId } = usePopover();
  const navigate = useNavigate();
  const signOut = useSignOut();

  const initials = me.user.name
    .split(/\s+/)
    .filter(Boolean)
    .slice(0, 2)
    .map((part) => part[0]?.toUpperCase())
    .join('');
  const role = me.role ? ROLE_LABELS[me.role] : null;

  return (
    <div ref={rootRef} className="relative">
      <button
        {...buttonProps}
        aria-label={`${me.user.name}, account menu`}
        className="flex items-center gap-2 rounded-lg py-1 pr-2 pl-1 text-sm text-ink-800 hover:bg-ink-100"
      >
        <span
          aria-hidden="true"
          className="flex size-8 items-center justify-center rounded-full bg-accent-100 text-xs font-semibold text-accent-800"
        >
          {initials || '?'}
        </span>
        <span className="hidden max-w-40 truncate sm:inline">{me.user.name}</span>
      </button>
      {open && (
        <div
          id={panelId}
          className="absolute right-0 z-40 mt-2 w-60 rounded-lg border border-ink-200 bg-white p-1.5 shadow-lg"
        >
          <div className="border-b border-ink-100 px-3 pt-1.5 pb-2.5">
            <p className="truncate text-sm font-medium text-ink-900">{me.user.name}</p>
            <p className="truncate text-xs text-ink-600">{me.user.email}</p>
            {role && <p className="mt-1 text-xs text-ink-600">{role}</p>}
          </div>
          <ul className="pt-1.5">
            <li>
              <Link
                to={paths.settings.profile.getHref()}
                className={itemClasses}
                onClick={() => setOpen(false)}
              >
                Profile
              </Link>
            </li>
            <li>
              <button
                type="button"
                className={itemClasses}
                disabled={signOut.isPending}
                onClick={() =>
                  signOut.mutate(undefined, {
                    onSuccess: () => navigate(paths.auth.signIn.getHref(), { replace: true }),
                  })
                }
              >
                {signOut.isPending ? 'Signing out…' : 'Sign out'}
              </button>
            </li>
          </ul>
        </div>
      )}
    </div>
  );
}
