import { cn } from '../../lib/cn';

export function Spinner({ label = 'Loading', className }: { label?: string; className?: string }) {
  return (
    <span role="status" className={cn('inline-flex items-center gap-2 text-ink-600', className)}>
      <span
        aria-hidden="true"
        className="size-4 animate-spin rounded-full border-2 border-ink-300 border-t-accent-600"
      />
      <span className="sr-only">{label}</span>
    </span>
  );
}

/** A spinner centred in the page area while a screen loads. */
export function PageSpinner({ label = 'Loading' }: { label?: string }) {
  return (
    <div className="flex min-h-40 items-center justify-center">
      <Spinner label={label} className="scale-150" />
    </div>
  );
}
