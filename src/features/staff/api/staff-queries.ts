import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ApiInvitation, ApiUser, ListResponse } from '@/types/api';

export interface StaffFilters {
  page: number;
  pageSize: number;
  sort?: string | undefined;
  q?: string | undefined;
}

export const staffKeys = {
  all: ['staff'] as const,
  lists: () => [...staffKeys.all, 'list'] as const,
  list: (filters: StaffFilters) => [...staffKeys.lists(), filters] as const,
  invitations: () => [...staffKeys.all, 'invitations'] as const,
};

function toQuery(filters: StaffFilters): string {
  const params = new URLSearchParams({ page: String(filters.page), pageSize: String(filters.pageSize) });
  if (filters.sort) params.set('sort', filters.sort);
  if (filters.q) params.set('q', filters.q);
  return params.toString();
}

export const staffListQuery = (filters: StaffFilters) =>
  queryOptions({
    queryKey: staffKeys.list(filters),
    queryFn: ({ signal }) => api.get<ListResponse<ApiUser>>(`/api/staff?${toQuery(filters)}`, signal),
    placeholderData: keepPreviousData,
  });

export const staffInvitationsQuery = () =>
  queryOptions({
    queryKey: staffKeys.invitations(),
    queryFn: ({ signal }) => api.get<ListResponse<ApiInvitation>>('/api/staff/invitations', signal).then((r) => r.data),
  });
