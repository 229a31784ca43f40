import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { StaffInvitationInput, StaffUpdateInput } from '@domain/schemas/staff';
import { api } from '@/lib/api-client';
import type { ApiInvitation, ApiUser } from '@/types/api';
import { staffKeys } from './staff-queries';

export function useInviteStaff() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: StaffInvitationInput) => api.post<{ data: ApiInvitation }>('/api/staff/invitations', input).then((r) => r.data),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: staffKeys.invitations() }),
  });
}

export function useResendInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.post<{ data: ApiInvitation }>(`/api/staff/invitations/${id}/resend`).then((r) => r.data),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: staffKeys.invitations() }),
  });
}

export function useRevokeInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.delete(`/api/staff/invitations/${id}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: staffKeys.invitations() }),
  });
}

export function useUpdateStaff() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, input }: { userId: string; input: StaffUpdateInput }) =>
      api.patch<{ data: ApiUser }>(`/api/staff/${userId}`, input).then((r) => r.data),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: staffKeys.lists() }),
  });
}
