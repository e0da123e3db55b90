import type { ReactNode } from 'react';
import { cn } from '../../lib/cn';

/**
 * Wide content (a table, a hex dump) scrolls sideways inside this box instead of widening the page. It is a
 * named region that takes focus, so keyboard users can scroll it with the arrow keys (axe: scrollable-region-focusable).
 */
export function ScrollRegion({ label, className, children }: { label: string; className?: string; children: ReactNode }) {
  return (
    // Inline-size containment: the width comes from the page, not the content; `relative` keeps sr-only text inside.
    <div role="region" aria-label={label} tabIndex={0} className={cn('relative max-w-full overflow-x-auto [contain:inline-size]', className)}>
      {children}
    </div>
  );
}
