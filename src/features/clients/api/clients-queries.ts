import { keepPreviousData, queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { ClientInput } from '@domain/schemas/client';
import { api } from '@/lib/api-client';
import type { ApiClient, ListResponse } from '@/types/api';

export interface ClientFilters {
  page: number;
  pageSize: number;
  sort?: string | undefined;
  q?: string | undefined;
  status?: 'active' | 'cancelled' | undefined;
}

export const clientKeys = {
  all: ['clients'] as const,
  lists: () => [...clientKeys.all, 'list'] as const,
  list: (filters: ClientFilters) => [...clientKeys.lists(), filters] as const,
  details: () => [...clientKeys.all, 'detail'] as const,
  detail: (id: string) => [...clientKeys.details(), id] as const,
};

export const clientListQuery = (filters: ClientFilters) =>
  queryOptions({
    queryKey: clientKeys.list(filters),
    queryFn: ({ signal }) => {
      const params = new URLSearchParams({ page: String(filters.page), pageSize: String(filters.pageSize) });
      if (filters.sort) params.set('sort', filters.sort);
      if (filters.q) params.set('q', filters.q);
      if (filters.status) params.set('status', filters.status);
      return api.get<ListResponse<ApiClient>>(`/api/clients?${params.toString()}`, signal);
    },
    placeholderData: keepPreviousData,
  });

export const clientQuery = (id: string) =>
  queryOptions({
    queryKey: clientKeys.detail(id),
    queryFn: ({ signal }) => api.get<{ data: ApiClient }>(`/api/clients/${id}`, signal).then((r) => r.data),
  });

export function useCreateClient() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ClientInput) => api.post<{ data: ApiClient }>('/api/clients', input).then((r) => r.data),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: clientKeys.lists() }),
  });
}

export function useUpdateClient(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: Partial<ClientInput>) => api.patch<{ data: ApiClient }>(`/api/clients/${id}`, input).then((r) => r.data),
    onSuccess: (client) => {
      queryClient.setQueryData(clientKeys.detail(id), client);
      return Promise.all([queryClient.invalidateQueries({ queryKey: clientKeys.lists() }), queryClient.invalidateQueries({ queryKey: clientKeys.detail(id) })]);
    },
  });
}

export function useDeleteClient(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.delete(`/api/clients/${id}`),
    onSuccess: () => {
      queryClient.removeQueries({ queryKey: clientKeys.detail(id) });
      return queryClient.invalidateQueries({ queryKey: clientKeys.lists() });
    },
  });
}
