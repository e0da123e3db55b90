import type { ReactNode } from 'react';
import { Link, type LinkProps } from 'react-router-dom';
import { cn } from '../../lib/cn';

export const textLinkClasses = 'font-medium text-accent-700 underline-offset-2 hover:underline';

export function TextLink({ className, children, ...rest }: LinkProps & { children: ReactNode }) {
  return (
    <Link className={cn(textLinkClasses, className)} {...rest}>
      {children}
    </Link>
  );
}
