import { keepPreviousData, queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { TenantState } from '@domain/tenant-states';
import { api } from '@/lib/api-client';
import type { ApiInvoice, ListResponse, OperatorRevenue, OperatorTenant, OperatorTenantDetail } from '@/types/api';

export interface TenantFilters {
  page: number;
  pageSize: number;
  sort?: string | undefined;
  q?: string | undefined;
  state?: TenantState | undefined;
}

export const operatorKeys = {
  all: ['operator', 'tenants'] as const,
  lists: () => [...operatorKeys.all, 'list'] as const,
  list: (filters: TenantFilters) => [...operatorKeys.lists(), filters] as const,
  details: () => [...operatorKeys.all, 'detail'] as const,
  detail: (id: string) => [...operatorKeys.details(), id] as const,
};

export const tenantListQuery = (filters: TenantFilters) =>
  queryOptions({
    queryKey: operatorKeys.list(filters),
    queryFn: ({ signal }) => {
      const params = new URLSearchParams({ page: String(filters.page), pageSize: String(filters.pageSize) });
      if (filters.sort) params.set('sort', filters.sort);
      if (filters.q) params.set('q', filters.q);
      if (filters.state) params.set('state', filters.state);
      return api.get<ListResponse<OperatorTenant>>(`/api/operator/tenants?${params.toString()}`, signal);
    },
    placeholderData: keepPreviousData,
  });

export const tenantDetailQuery = (id: string) =>
  queryOptions({
    queryKey: operatorKeys.detail(id),
    queryFn: ({ signal }) => api.get<{ data: OperatorTenantDetail }>(`/api/operator/tenants/${id}`, signal).then((r) => r.data),
  });

/** A firm's invoices from Stripe, for the operator's firm page. */
export const tenantInvoicesQuery = (id: string) =>
  queryOptions({
    queryKey: [...operatorKeys.detail(id), 'invoices'] as const,
    queryFn: ({ signal }) => api.get<{ data: ApiInvoice[] }>(`/api/operator/tenants/${id}/invoices`, signal).then((r) => r.data),
  });

/** The service's MRR, firms by state and trials ending soon. */
export const operatorRevenueQuery = () =>
  queryOptions({
    queryKey: ['operator', 'revenue'] as const,
    queryFn: ({ signal }) => api.get<{ data: OperatorRevenue }>('/api/operator/revenue', signal).then((r) => r.data),
  });

export function useSetSuspended(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ suspend, reason }: { suspend: boolean; reason: string }) =>
      api.post<{ data: OperatorTenant }>(`/api/operator/tenants/${id}/${suspend ? 'suspend' : 'restore'}`, { reason }).then((r) => r.data),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: operatorKeys.detail(id) }),
        queryClient.invalidateQueries({ queryKey: operatorKeys.lists() }),
        // a suspension moves the firm to another state in the revenue view
        queryClient.invalidateQueries({ queryKey: operatorRevenueQuery().queryKey }),
      ]),
  });
}
