import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { Wordmark } from './wordmark';

/** The frame around signed-out pages: the name at the top, the form in the middle. */
export function PublicFrame({ children, footer }: { children: ReactNode; footer?: ReactNode }) {
  return (
    <div className="flex min-h-dvh flex-col bg-linear-to-b from-accent-50 to-ink-50">
      <header className="px-6 py-5">
        <Link to="/" className="inline-block rounded-lg">
          <Wordmark />
        </Link>
      </header>
      <main id="main" className="flex flex-1 items-start justify-center px-4 pt-4 pb-12 sm:pt-10">
        {children}
      </main>
      <footer className="flex flex-wrap items-center justify-between gap-2 px-6 py-4 text-xs text-ink-600">
        <span>Revloop — remote calibration for tuning shops</span>
        {footer}
      </footer>
    </div>
  );
}
