import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Datalog, DatalogDetail } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';

/** A log younger than this is polled often: a typical log's report is ready a few hundred ms after its upload. */
const FAST_POLL_WINDOW_MS = 5000;
export const FAST_POLL_MS = 100;
const SLOW_POLL_MS = 700;

/** How soon to ask again about logs still being checked (fast while one is fresh), or false when none is. */
export function processingPollMs(
  logs: readonly Pick<Datalog, 'status' | 'createdAt'>[],
  now = Date.now(),
): number | false {
  const processing = logs.filter((log) => log.status === 'processing');
  if (processing.length === 0) return false;
  return processing.some((log) => now - Date.parse(log.createdAt) < FAST_POLL_WINDOW_MS)
    ? FAST_POLL_MS
    : SLOW_POLL_MS;
}

/** Every datalog query key starts here, so one invalidation refreshes lists and details. */
export const datalogsRootKey = ['datalogs'] as const;

export const getDatalog = (datalogId: string) =>
  api.get<ItemResponse<DatalogDetail>>(`/api/datalogs/${encodeURIComponent(datalogId)}`);

export const getDatalogQueryOptions = (datalogId: string) =>
  queryOptions({
    queryKey: [...datalogsRootKey, 'detail', datalogId],
    queryFn: () => getDatalog(datalogId),
    // Poll while the analysis runs; a ready or failed log no longer changes by itself.
    refetchInterval: (query) => processingPollMs(query.state.data ? [query.state.data.data] : []),
  });

export const useDatalog = (datalogId: string) => useQuery(getDatalogQueryOptions(datalogId));

export const datalogExportHref = (datalogId: string, table: 'trims' | 'wot') =>
  `/api/datalogs/${encodeURIComponent(datalogId)}/export/${table}.csv`;

/** How a revision number reads on screen: round 0 is the calibration the car came with. */
export const revisionLabel = (round: number) =>
  round === 0 ? 'the stock calibration' : `Rev ${round}`;
