import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { ServiceRequestInput } from '@domain/schemas/portal';
import { api } from '@/lib/api-client';
import type {
  ApiContact,
  ListResponse,
  PortalCoverage,
  PortalDevice,
  PortalDocument,
  PortalService,
  PortalSite,
  PortalSiteSummary,
  PortalUpcomingVisit,
  PublicFirm,
} from '@/types/api';

export const portalKeys = {
  all: ['portal'] as const,
  sites: () => [...portalKeys.all, 'sites'] as const,
  site: (siteId: string) => [...portalKeys.all, 'site', siteId] as const,
  part: (siteId: string, part: 'summary' | 'coverage' | 'devices' | 'service' | 'contacts' | 'documents') => [...portalKeys.site(siteId), part] as const,
  firm: (shortName: string) => ['public-firm', shortName] as const,
};

const base = (siteId: string) => `/api/portal/sites/${encodeURIComponent(siteId)}`;

/** The signed-in household's own sites. */
export const portalSitesQuery = () =>
  queryOptions({
    queryKey: portalKeys.sites(),
    queryFn: ({ signal }) => api.get<ListResponse<PortalSite>>('/api/portal/sites', signal).then((r) => r.data),
    staleTime: 60_000,
  });

export const portalSummaryQuery = (siteId: string) =>
  queryOptions({
    queryKey: portalKeys.part(siteId, 'summary'),
    queryFn: ({ signal }) => api.get<{ data: PortalSiteSummary }>(base(siteId), signal).then((r) => r.data),
    staleTime: 30_000,
  });

export const portalCoverageQuery = (siteId: string) =>
  queryOptions({
    queryKey: portalKeys.part(siteId, 'coverage'),
    queryFn: ({ signal }) => api.get<{ data: PortalCoverage }>(`${base(siteId)}/coverage`, signal).then((r) => r.data),
    staleTime: 30_000,
  });

export const portalDevicesQuery = (siteId: string) =>
  queryOptions({
    queryKey: portalKeys.part(siteId, 'devices'),
    queryFn: ({ signal }) => api.get<{ data: PortalDevice[] }>(`${base(siteId)}/devices`, signal).then((r) => r.data),
    staleTime: 30_000,
  });

export const portalServiceQuery = (siteId: string) =>
  queryOptions({
    queryKey: portalKeys.part(siteId, 'service'),
    queryFn: ({ signal }) => api.get<{ data: PortalService }>(`${base(siteId)}/service`, signal).then((r) => r.data),
    staleTime: 15_000,
  });

export const portalContactsQuery = (siteId: string) =>
  queryOptions({
    queryKey: portalKeys.part(siteId, 'contacts'),
    queryFn: ({ signal }) => api.get<{ data: ApiContact[] }>(`${base(siteId)}/contacts`, signal).then((r) => r.data),
  });

export const portalDocumentsQuery = (siteId: string) =>
  queryOptions({
    queryKey: portalKeys.part(siteId, 'documents'),
    queryFn: ({ signal }) => api.get<ListResponse<PortalDocument>>(`${base(siteId)}/documents`, signal).then((r) => r.data),
    staleTime: 30_000,
  });

/** A firm's public branding for its portal pages, by short name. */
export const publicFirmQuery = (shortName: string) =>
  queryOptions({
    queryKey: portalKeys.firm(shortName),
    queryFn: ({ signal }) => api.get<{ data: PublicFirm }>(`/api/public/firms/${encodeURIComponent(shortName)}`, signal).then((r) => r.data),
    staleTime: 5 * 60_000,
    retry: false,
  });


export function useRequestService(siteId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: ServiceRequestInput) =>
      api.post<{ data: PortalUpcomingVisit & { clientNotes: string } }>(`${base(siteId)}/service-requests`, input).then((r) => r.data),
    onSuccess: () => qc.invalidateQueries({ queryKey: portalKeys.site(siteId) }),
  });
}

export function useSavePortalContacts(siteId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (contacts: Omit<ApiContact, 'id' | 'siteId' | 'position'>[]) =>
      api.put<{ data: ApiContact[] }>(`${base(siteId)}/contacts`, { contacts }).then((r) => r.data),
    onSuccess: (contacts) => qc.setQueryData(portalKeys.part(siteId, 'contacts'), contacts),
  });
}
