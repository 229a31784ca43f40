import { keepPreviousData, queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { SiteInput } from '@domain/schemas/site';
import { api, uploadWithProgress } from '@/lib/api-client';
import type { ApiContact, ApiContactChange, ApiDocument, ApiSite, ListResponse } from '@/types/api';

export interface SiteFilters {
  page: number;
  pageSize: number;
  clientId?: string | undefined;
  sort?: string | undefined;
  q?: string | undefined;
}

export const siteKeys = {
  all: ['sites'] as const,
  lists: () => [...siteKeys.all, 'list'] as const,
  list: (filters: SiteFilters) => [...siteKeys.lists(), filters] as const,
  details: () => [...siteKeys.all, 'detail'] as const,
  detail: (id: string) => [...siteKeys.details(), id] as const,
  contacts: (id: string) => [...siteKeys.detail(id), 'contacts'] as const,
  contactChanges: (id: string) => [...siteKeys.detail(id), 'contact-changes'] as const,
  documents: (id: string) => [...siteKeys.detail(id), 'documents'] as const,
};

export const siteListQuery = (filters: SiteFilters) =>
  queryOptions({
    queryKey: siteKeys.list(filters),
    queryFn: ({ signal }) => {
      const params = new URLSearchParams({ page: String(filters.page), pageSize: String(filters.pageSize) });
      if (filters.clientId) params.set('clientId', filters.clientId);
      if (filters.sort) params.set('sort', filters.sort);
      if (filters.q) params.set('q', filters.q);
      return api.get<ListResponse<ApiSite>>(`/api/sites?${params.toString()}`, signal);
    },
    placeholderData: keepPreviousData,
  });

export const siteQuery = (id: string) =>
  queryOptions({
    queryKey: siteKeys.detail(id),
    queryFn: ({ signal }) => api.get<{ data: ApiSite }>(`/api/sites/${id}`, signal).then((r) => r.data),
  });

export const contactsQuery = (siteId: string) =>
  queryOptions({
    queryKey: siteKeys.contacts(siteId),
    queryFn: ({ signal }) => api.get<{ data: ApiContact[] }>(`/api/sites/${siteId}/contacts`, signal).then((r) => r.data),
  });

/** Who changed the site's emergency contacts and what changed, newest first (staff only). */
export const contactChangesQuery = (siteId: string) =>
  queryOptions({
    queryKey: siteKeys.contactChanges(siteId),
    queryFn: ({ signal }) => api.get<{ data: ApiContactChange[] }>(`/api/sites/${siteId}/contacts/changes`, signal).then((r) => r.data),
  });

export const documentsQuery = (siteId: string) =>
  queryOptions({
    queryKey: siteKeys.documents(siteId),
    queryFn: ({ signal }) => api.get<{ data: ApiDocument[] }>(`/api/sites/${siteId}/documents`, signal).then((r) => r.data),
  });

export function useCreateSite() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: SiteInput) => api.post<{ data: ApiSite }>('/api/sites', input).then((r) => r.data),
    onSuccess: () => Promise.all([queryClient.invalidateQueries({ queryKey: siteKeys.lists() }), queryClient.invalidateQueries({ queryKey: ['clients'] })]),
  });
}

export function useUpdateSite(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: Record<string, unknown>) => api.patch<{ data: ApiSite }>(`/api/sites/${id}`, input).then((r) => r.data),
    onSuccess: (site) => {
      queryClient.setQueryData(siteKeys.detail(id), site);
      return queryClient.invalidateQueries({ queryKey: siteKeys.lists() });
    },
  });
}

export function useDeleteSite(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.delete(`/api/sites/${id}`),
    onSuccess: () => {
      queryClient.removeQueries({ queryKey: siteKeys.detail(id) });
      return Promise.all([queryClient.invalidateQueries({ queryKey: siteKeys.lists() }), queryClient.invalidateQueries({ queryKey: ['clients'] })]);
    },
  });
}

export function useRevealPasscode(siteId: string) {
  return useMutation({
    mutationFn: () => api.post<{ data: { passcode: string } }>(`/api/sites/${siteId}/passcode/reveal`).then((r) => r.data.passcode),
  });
}

export function useReplaceContacts(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (contacts: Omit<ApiContact, 'id' | 'siteId' | 'position'>[]) =>
      api.put<{ data: ApiContact[] }>(`/api/sites/${siteId}/contacts`, { contacts }).then((r) => r.data),
    onSuccess: (contacts) => {
      queryClient.setQueryData(siteKeys.contacts(siteId), contacts);
      return queryClient.invalidateQueries({ queryKey: siteKeys.contactChanges(siteId) });
    },
  });
}

export function useUploadDocument(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ form, onProgress }: { form: FormData; onProgress: (f: number) => void }) =>
      uploadWithProgress<{ data: ApiDocument }>(`/api/sites/${siteId}/documents`, form, onProgress).then((r) => r.data),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: siteKeys.documents(siteId) }),
  });
}

export function useUpdateDocument(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, input }: { id: string; input: Partial<Pick<ApiDocument, 'title' | 'kind' | 'sharedWithClient'>> }) =>
      api.patch<{ data: ApiDocument }>(`/api/documents/${id}`, input).then((r) => r.data),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: siteKeys.documents(siteId) }),
  });
}

export function useDeleteDocument(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.delete(`/api/documents/${id}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: siteKeys.documents(siteId) }),
  });
}
