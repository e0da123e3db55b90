import type { ReactNode } from 'react';

export function EmptyState({ title, children, action }: { title: string; children?: ReactNode; action?: ReactNode }) {
  return (
    <div className="flex flex-col items-center gap-2 rounded-lg border border-dashed border-ink-300 px-6 py-10 text-center">
      <p className="font-medium text-ink-800">{title}</p>
      {children && <div className="max-w-md text-sm text-ink-600">{children}</div>}
      {action && <div className="mt-2">{action}</div>}
    </div>
  );
}
