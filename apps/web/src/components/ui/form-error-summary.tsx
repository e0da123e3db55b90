export interface SummaryItem {
  fieldId?: string;
  message: string;
}

/**
 * Lists every problem of a form at its top, each linked to its field. It is announced as an alert; focus
 * stays with the first invalid field, where react-hook-form puts it.
 */
export function FormErrorSummary({ items, title = 'Please fix the following' }: { items: SummaryItem[]; title?: string }) {
  if (items.length === 0) return null;
  const only = items.length === 1 ? items[0] : undefined;
  if (only && !only.fieldId) {
    return (
      <p role="alert" className="rounded-lg border border-bad/40 bg-bad-soft p-3 text-sm text-bad">
        {only.message}
      </p>
    );
  }
  return (
    <div role="alert" className="rounded-lg border border-bad/40 bg-bad-soft p-3 text-sm text-bad">
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
