import type { ReactNode } from 'react';

export interface ControlA11yProps {
  id: string;
  'aria-invalid': boolean | undefined;
  'aria-describedby': string | undefined;
}

export interface FieldProps {
  id: string;
  label: string;
  error?: string | undefined;
  hint?: string;
  /** Renders the control with the id and ARIA wiring that ties it to its label, hint and error. */
  children: (a11y: ControlA11yProps) => ReactNode;
}

/** A visible label above a control, an optional hint, and the field's error beside it. */
export function Field({ id, label, error, hint, children }: FieldProps) {
  const hintId = hint ? `${id}-hint` : undefined;
  const errorId = error ? `${id}-error` : undefined;
  const describedBy = [hintId, errorId].filter(Boolean).join(' ') || undefined;
  return (
    <div className="flex flex-col gap-1.5">
      <label htmlFor={id} className="text-sm font-medium text-ink-800">
        {label}
      </label>
      {children({ id, 'aria-invalid': error ? true : undefined, 'aria-describedby': describedBy })}
      {hint && (
        <p id={hintId} className="text-xs text-ink-600">
          {hint}
        </p>
      )}
      {error && (
        <p id={errorId} className="text-sm text-bad">
          {error}
        </p>
      )}
    </div>
  );
}
