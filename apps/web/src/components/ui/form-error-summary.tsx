import { useEffect, useRef } from 'react';

export interface SummaryItem {
  fieldId?: string;
  message: string;
}

/**
 * Lists every problem of a form at its top, each linked to its field. It is announced as an alert. Given a
 * `focusKey` (the form's submit count), it takes focus and scrolls into view after each failed submit, so a long
 * form shows its problems first rather than its last invalid field.
 */
export function FormErrorSummary({ items, title = 'Please fix the following', focusKey }: { items: SummaryItem[]; title?: string; focusKey?: number }) {
  const ref = useRef<HTMLDivElement & HTMLParagraphElement>(null);
  const hasItems = items.length > 0;
  useEffect(() => {
    if (focusKey === undefined || !hasItems || !ref.current) return;
    ref.current.focus({ preventScroll: true });
    ref.current.scrollIntoView({ block: 'start' });
  }, [focusKey, hasItems]);
  if (items.length === 0) return null;
  const only = items.length === 1 ? items[0] : undefined;
  if (only && !only.fieldId) {
    return (
      <p ref={ref} tabIndex={-1} role="alert" className="scroll-mt-20 rounded-lg border border-bad/40 bg-bad-soft p-3 text-sm text-bad">
        {only.message}
      </p>
    );
  }
  return (
    <div ref={ref} tabIndex={-1} role="alert" className="scroll-mt-20 rounded-lg border border-bad/40 bg-bad-soft p-3 text-sm text-bad">
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
