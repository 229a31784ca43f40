import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { FirmSettingsInput } from '@domain/schemas/firm';
import type { UpkeepSettings } from '@domain/device-life';
import type { UpkeepSettingsInput } from '@domain/schemas/upkeep';
import { api, uploadWithProgress } from '@/lib/api-client';
import type { ApiFirm } from '@/types/api';

export const firmKeys = {
  all: ['firm'] as const,
  details: () => [...firmKeys.all, 'detail'] as const,
  detail: () => [...firmKeys.details(), 'own'] as const,
  upkeep: () => [...firmKeys.all, 'upkeep'] as const,
};

export const firmQuery = () =>
  queryOptions({
    queryKey: firmKeys.detail(),
    queryFn: ({ signal }) => api.get<{ data: ApiFirm }>('/api/firm', signal).then((r) => r.data),
  });

function useFirmChanged() {
  const queryClient = useQueryClient();
  return async (firm?: ApiFirm) => {
    if (firm) queryClient.setQueryData(firmKeys.detail(), firm);
    await Promise.all([queryClient.invalidateQueries({ queryKey: firmKeys.all }), queryClient.invalidateQueries({ queryKey: ['session'] })]);
  };
}

export function useUpdateFirm() {
  const changed = useFirmChanged();
  return useMutation({
    mutationFn: (input: Partial<FirmSettingsInput>) => api.patch<{ data: ApiFirm }>('/api/firm', input).then((r) => r.data),
    onSuccess: (firm) => changed(firm),
  });
}

export function useUploadLogo() {
  const changed = useFirmChanged();
  return useMutation({
    mutationFn: ({ file, onProgress }: { file: File; onProgress: (f: number) => void }) => {
      const form = new FormData();
      form.append('file', file);
      return uploadWithProgress<{ data: ApiFirm }>('/api/firm/logo', form, onProgress).then((r) => r.data);
    },
    onSuccess: (firm) => changed(firm),
  });
}

export function useRemoveLogo() {
  const changed = useFirmChanged();
  return useMutation({
    mutationFn: () => api.delete('/api/firm/logo'),
    onSuccess: () => changed(),
  });
}

export interface UpkeepSettingsResponse {
  settings: UpkeepSettings;
  defaults: UpkeepSettings;
}

export const upkeepSettingsQuery = () =>
  queryOptions({
    queryKey: firmKeys.upkeep(),
    queryFn: ({ signal }) => api.get<{ data: UpkeepSettingsResponse }>('/api/firm/upkeep-settings', signal).then((r) => r.data),
  });

export function useSaveUpkeepSettings() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: UpkeepSettingsInput) => api.put<{ data: UpkeepSettingsResponse }>('/api/firm/upkeep-settings', input).then((r) => r.data),
    onSuccess: (data) => {
      queryClient.setQueryData(firmKeys.upkeep(), data);
      // zone lists carry computed device life
      return queryClient.invalidateQueries({ queryKey: ['zones'] });
    },
  });
}
