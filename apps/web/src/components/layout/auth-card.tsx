import type { ReactNode } from 'react';

/** The card that holds a sign-in, sign-up, reset or invitation form. */
export function AuthCard({ title, description, children, footer }: { title: string; description?: ReactNode; children: ReactNode; footer?: ReactNode }) {
  return (
    <div className="w-full max-w-md">
      <div className="rounded-card border border-ink-200 bg-white p-6 shadow-sm sm:p-8">
        <h1 className="text-2xl font-semibold text-ink-900">{title}</h1>
        {description && <div className="mt-1.5 text-sm text-ink-600">{description}</div>}
        <div className="mt-6">{children}</div>
      </div>
      {footer && <div className="mt-4 text-center text-sm text-ink-700">{footer}</div>}
    </div>
  );
}
