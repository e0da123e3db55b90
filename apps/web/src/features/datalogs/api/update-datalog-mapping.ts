import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest, type ItemResponse } from '../../../lib/api-client';
import { datalogsRootKey, type Datalog } from './get-datalog';

export interface UpdateDatalogMappingInput {
  datalogId: string;
  /** Channel → header for every channel; an empty header means "not logged". */
  channels: Record<string, string>;
}

export const updateDatalogMapping = ({ datalogId, channels }: UpdateDatalogMappingInput) =>
  apiRequest<ItemResponse<Datalog>>('PUT', `/api/datalogs/${encodeURIComponent(datalogId)}/mapping`, { channels });

/** Confirms or fixes the mapping: the server re-analyses the log and remembers the choice for the shop. */
export function useUpdateDatalogMapping() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateDatalogMapping,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: datalogsRootKey }),
  });
}
