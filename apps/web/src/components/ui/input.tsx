import type { InputHTMLAttributes, Ref } from 'react';
import { cn } from '../../lib/cn';

export const controlClasses =
  'block w-full rounded-lg border border-ink-300 bg-white px-3 text-sm text-ink-900 placeholder:text-ink-500 ' +
  'hover:border-ink-400 focus-visible:border-accent-600 aria-invalid:border-bad disabled:bg-ink-100 disabled:text-ink-600';

export function Input({ className, ref, ...rest }: InputHTMLAttributes<HTMLInputElement> & { ref?: Ref<HTMLInputElement> }) {
  return <input ref={ref} className={cn(controlClasses, 'h-10', className)} {...rest} />;
}
