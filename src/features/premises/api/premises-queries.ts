import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { floorSchema, openingSchema, roomSchema } from '@domain/schemas/premises';
import { api, uploadWithProgress } from '@/lib/api-client';
import type { ApiFloor, ApiOpening, ApiPremises, ApiRoom } from '@/types/api';

export type FloorInput = z.input<typeof floorSchema>;
export type RoomInput = z.input<typeof roomSchema>;
export type OpeningInput = z.input<typeof openingSchema>;

export const premisesKeys = {
  all: ['premises'] as const,
  site: (siteId: string) => [...premisesKeys.all, siteId] as const,
};

/** Coverage reads the premises: every premises change refreshes it (its own feature owns the query). */
const COVERAGE_KEY = ['coverage'] as const;

/** A site's floors, each with its rooms and their openings, in one answer. */
export const premisesQuery = (siteId: string) =>
  queryOptions({
    queryKey: premisesKeys.site(siteId),
    queryFn: ({ signal }) => api.get<{ data: ApiPremises }>(`/api/sites/${siteId}/premises`, signal).then((r) => r.data),
  });

/** After any premises change: the premises and the coverage computed from them. */
export function usePremisesChanged(siteId: string) {
  const queryClient = useQueryClient();
  return () =>
    Promise.all([queryClient.invalidateQueries({ queryKey: premisesKeys.site(siteId) }), queryClient.invalidateQueries({ queryKey: COVERAGE_KEY })]);
}

function useSitePremisesMutation<TVars, TResult>(siteId: string, mutationFn: (vars: TVars) => Promise<TResult>) {
  const changed = usePremisesChanged(siteId);
  return useMutation({ mutationFn, onSuccess: () => changed() });
}

export function useCreateFloor(siteId: string) {
  return useSitePremisesMutation(siteId, (input: FloorInput) =>
    api.post<{ data: ApiFloor }>(`/api/sites/${siteId}/floors`, input).then((r) => r.data),
  );
}

export function useUpdateFloor(siteId: string) {
  return useSitePremisesMutation(siteId, ({ id, input }: { id: string; input: Partial<FloorInput> }) =>
    api.patch<{ data: ApiFloor }>(`/api/floors/${id}`, input).then((r) => r.data),
  );
}

export function useDeleteFloor(siteId: string) {
  return useSitePremisesMutation(siteId, (id: string) => api.delete(`/api/floors/${id}`));
}

export function useCreateRoom(siteId: string) {
  return useSitePremisesMutation(siteId, ({ floorId, input }: { floorId: string; input: RoomInput }) =>
    api.post<{ data: ApiRoom }>(`/api/floors/${floorId}/rooms`, input).then((r) => r.data),
  );
}

export function useUpdateRoom(siteId: string) {
  return useSitePremisesMutation(siteId, ({ id, input }: { id: string; input: Partial<RoomInput> & { floorId?: string } }) =>
    api.patch<{ data: ApiRoom }>(`/api/rooms/${id}`, input).then((r) => r.data),
  );
}

export function useDeleteRoom(siteId: string) {
  return useSitePremisesMutation(siteId, (id: string) => api.delete(`/api/rooms/${id}`));
}

export function useCreateOpening(siteId: string) {
  return useSitePremisesMutation(siteId, ({ roomId, input }: { roomId: string; input: OpeningInput }) =>
    api.post<{ data: ApiOpening }>(`/api/rooms/${roomId}/openings`, input).then((r) => r.data),
  );
}

export function useUpdateOpening(siteId: string) {
  return useSitePremisesMutation(siteId, ({ id, input }: { id: string; input: Partial<OpeningInput> }) =>
    api.patch<{ data: ApiOpening }>(`/api/openings/${id}`, input).then((r) => r.data),
  );
}

export function useDeleteOpening(siteId: string) {
  return useSitePremisesMutation(siteId, (id: string) => api.delete(`/api/openings/${id}`));
}

/** Uploads (or replaces) a floor's plan image, with progress. */
export function useUploadPlan(siteId: string) {
  return useSitePremisesMutation(siteId, ({ floorId, file, onProgress }: { floorId: string; file: File; onProgress: (fraction: number) => void }) => {
    const form = new FormData();
    form.append('file', file);
    return uploadWithProgress<{ data?: ApiFloor } | undefined>(`/api/floors/${floorId}/plan`, form, onProgress).then((r) => r?.data);
  });
}

export function useRemovePlan(siteId: string) {
  return useSitePremisesMutation(siteId, (floorId: string) => api.delete(`/api/floors/${floorId}/plan`));
}
