import { queryOptions } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { FirmBusiness } from '@/types/api';

export const businessKeys = {
  all: ['firm', 'business'] as const,
};

/** The firm's own numbers from its monitoring contracts (owner only). */
export const firmBusinessQuery = () =>
  queryOptions({
    queryKey: businessKeys.all,
    queryFn: ({ signal }) => api.get<{ data: FirmBusiness }>('/api/firm/business', signal).then((r) => r.data),
  });
