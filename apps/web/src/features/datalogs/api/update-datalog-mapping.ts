import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Datalog } from '@revloop/contract';
import type { DatalogMappingInput } from '@revloop/domain/datalog';
import { apiRequest, type ItemResponse } from '../../../lib/api-client';
import { datalogsRootKey } from './get-datalog';

/** Channel → header for every channel (an empty header means "not logged"), stated units, AFR scale and trim axis. */
export interface UpdateDatalogMappingInput extends DatalogMappingInput {
  datalogId: string;
}

export const updateDatalogMapping = ({ datalogId, ...input }: UpdateDatalogMappingInput) =>
  apiRequest<ItemResponse<Datalog>>('PUT', `/api/datalogs/${encodeURIComponent(datalogId)}/mapping`, input);

/** Confirms or fixes the mapping: the server re-analyses the log and remembers the choice for the shop. */
export function useUpdateDatalogMapping() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateDatalogMapping,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: datalogsRootKey }),
  });
}
