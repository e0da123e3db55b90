import type { UseQueryResult } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { buttonClasses } from '../../../components/ui/button';
import { Banner } from '../../../components/ui/banner';
import { Card } from '../../../components/ui/card';
import { Spinner } from '../../../components/ui/spinner';
import { errorMessage } from '../../../lib/form-errors';

/**
 * One report: what it measures and how, a CSV download of its table, then its chart and table once loaded.
 * `isEmpty` shows a plain sentence instead of an empty chart.
 */
export function ReportSection<T>({
  title,
  description,
  query,
  csvHref,
  csvLabel,
  isEmpty,
  emptyMessage,
  children,
}: {
  title: string;
  description: ReactNode;
  query: UseQueryResult<{ data: T }>;
  csvHref: string;
  csvLabel: string;
  isEmpty: (report: T) => boolean;
  emptyMessage: string;
  children: (report: T) => ReactNode;
}) {
  return (
    <Card
      title={title}
      description={description}
      actions={
        <a href={csvHref} download className={buttonClasses('secondary', 'sm')}>
          Download CSV<span className="sr-only"> of {csvLabel}</span>
        </a>
      }
    >
      {query.isPending ? (
        <div className="flex justify-center py-10">
          <Spinner label={`Loading ${title.toLowerCase()}`} />
        </div>
      ) : query.isError ? (
        <Banner tone="bad" title={`${title} could not be loaded`}>
          {errorMessage(query.error)}
        </Banner>
      ) : isEmpty(query.data.data) ? (
        <p className="py-6 text-center text-sm text-ink-600">{emptyMessage}</p>
      ) : (
        <div className="flex flex-col gap-5">{children(query.data.data)}</div>
      )}
    </Card>
  );
}
