import type { Ref, SelectHTMLAttributes } from 'react';
import { cn } from '../../lib/cn';
import { controlClasses } from './input';

export interface SelectOption {
  value: string;
  label: string;
}

export function Select({
  options,
  className,
  ref,
  ...rest
}: SelectHTMLAttributes<HTMLSelectElement> & { options: readonly SelectOption[]; ref?: Ref<HTMLSelectElement> }) {
  return (
    <select ref={ref} className={cn(controlClasses, 'h-10 pr-8', className)} {...rest}>
      {options.map((option) => (
        <option key={option.value} value={option.value}>
          {option.label}
        </option>
      ))}
    </select>
  );
}
