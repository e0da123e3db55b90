import { useEffect, useState, type ReactNode } from 'react';
import { NavLink, useLocation } from 'react-router-dom';
import { cn } from '../../lib/cn';
import { Wordmark } from './wordmark';

export interface ShellNavItem {
  label: string;
  to: string;
}

export interface AppShellProps {
  nav: ShellNavItem[];
  /** Shown beside the wordmark: the shop the user works in, or the platform. */
  context?: ReactNode;
  userMenu: ReactNode;
  /** The notification bell, beside the user menu. */
  notifications?: ReactNode;
  banner?: ReactNode;
  footer?: ReactNode;
  children: ReactNode;
}

const navLinkClasses = ({ isActive }: { isActive: boolean }) =>
  cn(
    'block rounded-lg px-3 py-2 text-sm font-medium transition-colors',
    isActive ? 'bg-accent-50 text-accent-800' : 'text-ink-700 hover:bg-ink-100 hover:text-ink-900',
  );

/** The signed-in frame: header, navigation (a side column, folded behind a button on phones), content, footer. */
export function AppShell({ nav, context, userMenu, notifications, banner, footer, children }: AppShellProps) {
  const [navOpen, setNavOpen] = useState(false);
  const location = useLocation();
  useEffect(() => setNavOpen(false), [location.pathname]);

  return (
    <div className="flex min-h-dvh flex-col">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:top-2 focus:left-2 focus:z-50 focus:rounded focus:bg-white focus:px-3 focus:py-2">
        Skip to content
      </a>
      <header className="sticky top-0 z-30 border-b border-ink-200 bg-white/95 backdrop-blur">
        <div className="mx-auto flex h-14 max-w-7xl items-center gap-3 px-4">
          <button
            type="button"
            className="-ml-1 rounded-lg p-2 text-ink-700 hover:bg-ink-100 md:hidden"
            aria-expanded={navOpen}
            aria-controls="main-nav"
            onClick={() => setNavOpen((open) => !open)}
          >
            <span className="sr-only">{navOpen ? 'Close menu' : 'Open menu'}</span>
            <svg aria-hidden="true" viewBox="0 0 24 24" className="size-5" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round">
              {navOpen ? <path d="M6 6l12 12M18 6L6 18" /> : <path d="M4 7h16M4 12h16M4 17h16" />}
            </svg>
          </button>
          <Wordmark />
          {context && (
            <>
              <span aria-hidden="true" className="hidden h-5 w-px bg-ink-200 sm:block" />
              <div className="hidden min-w-0 truncate text-sm text-ink-700 sm:block">{context}</div>
            </>
          )}
          <div className="ml-auto flex items-center gap-1">
            {notifications}
            {userMenu}
          </div>
        </div>
      </header>
      <div className="mx-auto flex w-full max-w-7xl flex-1 flex-col md:flex-row">
        <nav
          id="main-nav"
          aria-label="Main"
          className={cn('border-b border-ink-200 bg-white px-4 py-3 md:block md:w-52 md:shrink-0 md:border-r md:border-b-0 md:bg-transparent md:py-6', navOpen ? 'block' : 'hidden')}
        >
          {context && <div className="mb-2 truncate px-3 text-sm text-ink-700 sm:hidden">{context}</div>}
          <ul className="flex flex-col gap-1">
            {nav.map((item) => (
              <li key={item.to}>
                <NavLink to={item.to} className={navLinkClasses}>
                  {item.label}
                </NavLink>
              </li>
            ))}
          </ul>
        </nav>
        <main id="main" tabIndex={-1} className="min-w-0 flex-1 px-4 py-6 md:px-8">
          {banner && <div className="mb-6">{banner}</div>}
          {children}
        </main>
      </div>
      <footer className="border-t border-ink-200 bg-white">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center justify-between gap-2 px-4 py-3 text-xs text-ink-600">
          <span>Revloop — remote calibration for tuning shops</span>
          {footer}
        </div>
      </footer>
    </div>
  );
}
