import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DatalogReport } from '@revloop/domain/datalog';
import { api, type ItemResponse } from '../../../lib/api-client';

export type DatalogStatus = 'processing' | 'ready' | 'failed';

/** A log as the API lists it (`datalogRowToDatalog`); the report comes with the single log only. */
export interface Datalog {
  id: string;
  jobId: string;
  /** The revision on the car when it was logged; 0 is the calibration the car came with. */
  round: number;
  originalName: string;
  sizeBytes: number;
  sha256: string;
  status: DatalogStatus;
  /** 0–1 while the analysis runs. */
  progress: number;
  error: string | null;
  checks: DatalogReport['checks'];
  uploadedBy: { id: string; name: string } | null;
  createdAt: string;
}

export interface DatalogDetail extends Datalog {
  job: { id: string; number: number; round: number; state: string; vehicle: string };
  report: DatalogReport | null;
}

/** Every datalog query key starts here, so one invalidation refreshes lists and details. */
export const datalogsRootKey = ['datalogs'] as const;

export const getDatalog = (datalogId: string) => api.get<ItemResponse<DatalogDetail>>(`/api/datalogs/${encodeURIComponent(datalogId)}`);

export const getDatalogQueryOptions = (datalogId: string) =>
  queryOptions({
    queryKey: [...datalogsRootKey, 'detail', datalogId],
    queryFn: () => getDatalog(datalogId),
    // Poll while the analysis runs; a ready or failed log no longer changes by itself.
    refetchInterval: (query) => (query.state.data?.data.status === 'processing' ? 700 : false),
  });

export const useDatalog = (datalogId: string) => useQuery(getDatalogQueryOptions(datalogId));

export const datalogExportHref = (datalogId: string, table: 'trims' | 'wot') =>
  `/api/datalogs/${encodeURIComponent(datalogId)}/export/${table}.csv`;

/** How a revision number reads on screen: round 0 is the calibration the car came with. */
export const revisionLabel = (round: number) => (round === 0 ? 'the stock calibration' : `Rev ${round}`);
