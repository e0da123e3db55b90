import type { ReactNode } from 'react';
import { cn } from '../../lib/cn';
import type { Tone } from './badge';

const TONES: Record<Tone, string> = {
  neutral: 'border-ink-200 bg-white text-ink-800',
  accent: 'border-accent-200 bg-accent-50 text-accent-900',
  ok: 'border-ok/30 bg-ok-soft text-ok',
  warn: 'border-warn/30 bg-warn-soft text-warn',
  bad: 'border-bad/30 bg-bad-soft text-bad',
};

export function Banner({ tone = 'neutral', title, children, className }: { tone?: Tone; title?: string; children?: ReactNode; className?: string }) {
  return (
    <div role={tone === 'bad' ? 'alert' : 'status'} className={cn('rounded-lg border px-4 py-3 text-sm', TONES[tone], className)}>
      {title && <p className="font-medium">{title}</p>}
      {children && <div className={title ? 'mt-0.5' : undefined}>{children}</div>}
    </div>
  );
}
