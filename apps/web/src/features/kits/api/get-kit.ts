import { queryOptions, useQuery } from '@tanstack/react-query';
import type { KitDetail } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { kitsRootKey } from './get-kits';

export const getKit = (kitId: string) => api.get<ItemResponse<KitDetail>>(`/api/kits/${encodeURIComponent(kitId)}`);

export const getKitQueryOptions = (kitId: string) => queryOptions({ queryKey: [...kitsRootKey, 'detail', kitId], queryFn: () => getKit(kitId) });

export const useKit = (kitId: string) => useQuery(getKitQueryOptions(kitId));
