/** A labelled determinate progress bar (native semantics, so screen readers announce it). */
export function ProgressBar({ label, value }: { label: string; value: number }) {
  const pct = Math.round(Math.min(1, Math.max(0, value)) * 100);
  return (
    <div className="flex flex-col gap-1">
      <div className="flex justify-between text-sm text-ink-700">
        <span>{label}</span>
        <span>{pct} %</span>
      </div>
      <div role="progressbar" aria-label={label} aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct} className="h-2 overflow-hidden rounded-full bg-ink-100">
        <div className="h-full rounded-full bg-accent-600 transition-[width]" style={{ width: `${pct}%` }} />
      </div>
    </div>
  );
}
