import { useMutation, useQueries, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ApiPremises, ApiPremisesZone, ApiZone, ApiZonePin } from '@/types/api';
import { sitePanelsQuery } from '@/features/panels/api/panel-queries';
import { panelZonesQuery, zoneKeys } from '@/features/zones/api/zone-queries';
import { premisesKeys } from './premises-queries';

function fromZone(zone: ApiZone, panelLabel: string): ApiPremisesZone {
  return {
    id: zone.id,
    panelId: zone.panelId,
    panelLabel,
    number: zone.number,
    description: zone.description,
    deviceType: zone.deviceType,
    status: zone.status,
    roomId: zone.roomId,
    openingId: zone.openingId,
    pin: zone.pin ?? null,
  };
}

export function sortZones(zones: readonly ApiPremisesZone[]): ApiPremisesZone[] {
  return [...zones].sort((a, b) => a.panelLabel.localeCompare(b.panelLabel) || a.number - b.number);
}

/**
 * The site's zones with their links and pins: from the premises answer when the server sends
 * them there, else from the site's panels and their zone lists.
 */
export function useSiteZones(siteId: string, premises: ApiPremises | undefined): { zones: ApiPremisesZone[] | undefined; error: Error | null } {
  const fromPremises = premises?.zones;
  const needLists = premises !== undefined && fromPremises === undefined;
  const panels = useQuery({ ...sitePanelsQuery(siteId), enabled: needLists });
  const lists = useQueries({
    queries: (needLists ? (panels.data ?? []) : []).map((panel) => panelZonesQuery(panel.id)),
  });
  if (fromPremises) return { zones: sortZones(fromPremises), error: null };
  if (!needLists) return { zones: undefined, error: null };
  const error = panels.error ?? lists.find((l) => l.error)?.error ?? null;
  if (!panels.data || lists.some((l) => !l.data)) return { zones: undefined, error };
  const zones = panels.data.flatMap((panel, i) => (lists[i]?.data ?? []).map((z) => fromZone(z, panel.label)));
  return { zones: sortZones(zones), error };
}

/** Writes the new pin into the cached premises at once, so the pin does not jump back while saving. */
function usePinCache(siteId: string) {
  const queryClient = useQueryClient();
  const key = premisesKeys.site(siteId);
  return {
    async set(zoneId: string, pin: ApiZonePin | null) {
      await queryClient.cancelQueries({ queryKey: key });
      const before = queryClient.getQueryData<ApiPremises>(key);
      if (before?.zones)
        queryClient.setQueryData<ApiPremises>(key, { ...before, zones: before.zones.map((z) => (z.id === zoneId ? { ...z, pin } : z)) });
      return before;
    },
    restore(before: ApiPremises | undefined) {
      if (before) queryClient.setQueryData(key, before);
    },
    settle() {
      return Promise.all([queryClient.invalidateQueries({ queryKey: key }), queryClient.invalidateQueries({ queryKey: zoneKeys.lists() })]);
    },
  };
}

/** PUT /api/zones/:zoneId/pin: a zone's place on a floor plan, as fractions of the image. */
export function useSetPin(siteId: string) {
  const cache = usePinCache(siteId);
  return useMutation({
    mutationFn: ({ zoneId, pin }: { zoneId: string; pin: ApiZonePin }) => api.put<unknown>(`/api/zones/${zoneId}/pin`, pin),
    onMutate: ({ zoneId, pin }) => cache.set(zoneId, pin),
    onError: (_err, _vars, before) => cache.restore(before),
    onSettled: () => cache.settle(),
  });
}

export function useClearPin(siteId: string) {
  const cache = usePinCache(siteId);
  return useMutation({
    mutationFn: (zoneId: string) => api.delete(`/api/zones/${zoneId}/pin`),
    onMutate: (zoneId) => cache.set(zoneId, null),
    onError: (_err, _vars, before) => cache.restore(before),
    onSettled: () => cache.settle(),
  });
}
