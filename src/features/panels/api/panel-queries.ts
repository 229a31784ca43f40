import { keepPreviousData, queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { PanelSettings } from '@domain/cp01';
import type { PanelInput } from '@domain/schemas/panel';
import { api } from '@/lib/api-client';
import type { ApiPanel, ApiZoneChange, ListResponse } from '@/types/api';

export const panelKeys = {
  all: ['panels'] as const,
  lists: () => [...panelKeys.all, 'list'] as const,
  list: (siteId: string) => [...panelKeys.lists(), { siteId }] as const,
  details: () => [...panelKeys.all, 'detail'] as const,
  detail: (panelId: string) => [...panelKeys.details(), panelId] as const,
  changes: (panelId: string) => [...panelKeys.all, 'changes', panelId] as const,
  changePage: (panelId: string, page: number) => [...panelKeys.changes(panelId), { page }] as const,
};

/** The panels of one site (a site has one or a few: no paging needed). */
export const sitePanelsQuery = (siteId: string) =>
  queryOptions({
    queryKey: panelKeys.list(siteId),
    queryFn: ({ signal }) => api.get<{ data: ApiPanel[] }>(`/api/sites/${siteId}/panels?pageSize=100`, signal).then((r) => r.data),
  });

export const panelQuery = (panelId: string) =>
  queryOptions({
    queryKey: panelKeys.detail(panelId),
    queryFn: ({ signal }) => api.get<{ data: ApiPanel }>(`/api/panels/${panelId}`, signal).then((r) => r.data),
  });

export const CHANGE_PAGE_SIZE = 20;

export const panelChangesQuery = (panelId: string, page: number) =>
  queryOptions({
    queryKey: panelKeys.changePage(panelId, page),
    queryFn: ({ signal }) =>
      api.get<ListResponse<ApiZoneChange>>(`/api/panels/${panelId}/changes?page=${page}&pageSize=${CHANGE_PAGE_SIZE}`, signal),
    placeholderData: keepPreviousData,
  });

export const panelUrls = {
  zonesCsv: (panelId: string) => `/api/panels/${panelId}/zones.csv`,
  programmingSheet: (panelId: string) => `/api/panels/${panelId}/programming-sheet.pdf`,
};

/** After any change to a panel (or its zones): its detail, the site's panel list and the change log. */
export function usePanelChanged() {
  const queryClient = useQueryClient();
  return (panelId: string, panel?: ApiPanel) => {
    if (panel) queryClient.setQueryData(panelKeys.detail(panelId), panel);
    return Promise.all([
      queryClient.invalidateQueries({ queryKey: panelKeys.detail(panelId) }),
      queryClient.invalidateQueries({ queryKey: panelKeys.lists() }),
      queryClient.invalidateQueries({ queryKey: panelKeys.changes(panelId) }),
    ]);
  };
}

export function useCreatePanel(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: PanelInput) => api.post<{ data: ApiPanel }>(`/api/sites/${siteId}/panels`, input).then((r) => r.data),
    onSuccess: (panel) => {
      queryClient.setQueryData(panelKeys.detail(panel.id), panel);
      return queryClient.invalidateQueries({ queryKey: panelKeys.lists() });
    },
  });
}

export type PanelPatch = Partial<Omit<PanelInput, 'settings'>> & { settings?: Partial<PanelSettings> };

export function useUpdatePanel(panelId: string) {
  const changed = usePanelChanged();
  return useMutation({
    mutationFn: (input: PanelPatch) => api.patch<{ data: ApiPanel }>(`/api/panels/${panelId}`, input).then((r) => r.data),
    onSuccess: (panel) => changed(panelId, panel),
  });
}

export function useMarkProgrammed(panelId: string) {
  const changed = usePanelChanged();
  return useMutation({
    mutationFn: () => api.post<{ data: ApiPanel } | undefined>(`/api/panels/${panelId}/programmed`).then((r) => r?.data),
    onSuccess: (panel) => changed(panelId, panel),
  });
}

export function useDeletePanel(panelId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.delete(`/api/panels/${panelId}`),
    onSuccess: () => {
      queryClient.removeQueries({ queryKey: panelKeys.detail(panelId) });
      return queryClient.invalidateQueries({ queryKey: panelKeys.lists() });
    },
  });
}
