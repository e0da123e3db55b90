/** The Revloop name with its loop mark: two arrows chasing each other, for the revise-and-log cycle. */
export function Wordmark({ className }: { className?: string }) {
  return (
    <span className={className}>
      <span className="inline-flex items-center gap-2 text-lg font-semibold tracking-tight text-ink-900">
        <svg aria-hidden="true" viewBox="0 0 24 24" className="size-6 text-accent-600" fill="none" stroke="currentColor" strokeWidth="2.2" strokeLinecap="round" strokeLinejoin="round">
          <path d="M4 12a8 8 0 0 1 13.7-5.6" />
          <path d="M18 2.8v3.9h-3.9" />
          <path d="M20 12a8 8 0 0 1-13.7 5.6" />
          <path d="M6 21.2v-3.9h3.9" />
        </svg>
        Revloop
      </span>
    </span>
  );
}
