import { useEffect, useRef } from 'react';

export interface SummaryItem {
  fieldId?: string;
  message: string;
}

/** Lists every problem of a form at its top, each linked to its field, and takes focus when it appears. */
export function FormErrorSummary({ items, title = 'Please fix the following' }: { items: SummaryItem[]; title?: string }) {
  const ref = useRef<HTMLDivElement>(null);
  const key = items.map((item) => item.message).join('|');
  useEffect(() => {
    if (key) ref.current?.focus();
  }, [key]);
  if (items.length === 0) return null;
  return (
    <div ref={ref} tabIndex={-1} role="alert" className="rounded-lg border border-bad/40 bg-bad-soft p-3 text-sm text-bad">
      <p className="font-medium">{title}</p>
      <ul className="mt-1 list-disc pl-5">
        {items.map((item) => (
          <li key={`${item.fieldId ?? ''}:${item.message}`}>
            {item.fieldId ? (
              <a className="underline underline-offset-2" href={`#${item.fieldId}`}>
                {item.message}
              </a>
            ) : (
              item.message
            )}
          </li>
        ))}
      </ul>
    </div>
  );
}
