import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { ZoneCreateInput } from '@domain/schemas/zone';
import { api, uploadWithProgress } from '@/lib/api-client';
import type { ApiZone, ApiZoneImportResult, ListResponse } from '@/types/api';
import { usePanelChanged } from '@/features/panels/api/panel-queries';

export const zoneKeys = {
  all: ['zones'] as const,
  lists: () => [...zoneKeys.all, 'list'] as const,
  list: (panelId: string) => [...zoneKeys.lists(), { panelId }] as const,
  details: () => [...zoneKeys.all, 'detail'] as const,
  detail: (zoneId: string) => [...zoneKeys.details(), zoneId] as const,
};

/** The API's largest zone page: a panel holds at most 999 zones, so one request normally brings them all. */
const FETCH_PAGE_SIZE = 1000;

/**
 * Every zone of a panel: the list is sorted and paged on the client, so should the API ever
 * answer in several pages, they are read one after another until all are in.
 */
async function fetchAllZones(panelId: string, signal: AbortSignal): Promise<ApiZone[]> {
  const zones: ApiZone[] = [];
  for (let page = 1; ; page++) {
    const res = await api.get<ListResponse<ApiZone> | { data: ApiZone[]; page?: undefined }>(
      `/api/panels/${panelId}/zones?page=${page}&pageSize=${FETCH_PAGE_SIZE}`,
      signal,
    );
    zones.push(...res.data);
    const total = res.page?.total;
    if (total === undefined || zones.length >= total || res.data.length === 0) return zones;
  }
}

export const panelZonesQuery = (panelId: string) =>
  queryOptions({
    queryKey: zoneKeys.list(panelId),
    queryFn: ({ signal }) => fetchAllZones(panelId, signal),
  });

/** A zone changed: the panel's zone list, and the panel itself (next number, "changed since programmed", audit, change log). */
function useZonesChanged() {
  const queryClient = useQueryClient();
  const panelChanged = usePanelChanged();
  return (panelId: string) =>
    Promise.all([queryClient.invalidateQueries({ queryKey: zoneKeys.list(panelId) }), queryClient.invalidateQueries({ queryKey: zoneKeys.details() }), panelChanged(panelId)]);
}

export function useCreateZone(panelId: string) {
  const changed = useZonesChanged();
  return useMutation({
    mutationFn: (input: ZoneCreateInput) => api.post<{ data: ApiZone }>(`/api/panels/${panelId}/zones`, input).then((r) => r.data),
    onSuccess: () => changed(panelId),
  });
}

export function useUpdateZone(panelId: string) {
  const changed = useZonesChanged();
  return useMutation({
    mutationFn: ({ zoneId, input }: { zoneId: string; input: Partial<ZoneCreateInput> }) =>
      api.patch<{ data: ApiZone }>(`/api/zones/${zoneId}`, input).then((r) => r.data),
    onSuccess: () => changed(panelId),
  });
}

export function useDeleteZone(panelId: string) {
  const changed = useZonesChanged();
  return useMutation({
    mutationFn: (zoneId: string) => api.delete(`/api/zones/${zoneId}`),
    onSuccess: () => changed(panelId),
  });
}

/** Uploads a zone list CSV: a dry run previews it, a real run saves it (all rows or none). */
export function useImportZones(panelId: string) {
  const changed = useZonesChanged();
  return useMutation({
    mutationFn: ({ file, dryRun, onProgress }: { file: File; dryRun: boolean; onProgress: (fraction: number) => void }) => {
      const form = new FormData();
      form.append('file', file);
      return uploadWithProgress<{ data: ApiZoneImportResult }>(`/api/panels/${panelId}/zones/import?dryRun=${dryRun}`, form, onProgress).then((r) => r.data);
    },
    onSuccess: (_result, { dryRun }) => (dryRun ? undefined : changed(panelId)),
  });
}
