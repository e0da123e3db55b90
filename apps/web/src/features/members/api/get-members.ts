import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Member } from '@revloop/contract';
import { api, type ListResponse } from '../../../lib/api-client';

export const getMembers = () => api.get<ListResponse<Member>>('/api/members');

export const getMembersQueryOptions = () => queryOptions({ queryKey: ['members'], queryFn: getMembers });

export const useMembers = () => useQuery(getMembersQueryOptions());
