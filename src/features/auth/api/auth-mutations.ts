import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { SignUpInput, AcceptInvitationInput } from '@domain/schemas/auth';
import { api } from '@/lib/api-client';
import { refreshSession } from '@/lib/auth';
import type { InvitationPreview } from '@/types/api';

export function useSignUp() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: SignUpInput) => api.post('/api/signup', input),
    onSuccess: () => refreshSession(queryClient),
  });
}

export function useRequestPasswordReset() {
  return useMutation({
    mutationFn: (input: { email: string }) => api.post<{ data: { message: string } }>('/api/password-resets', input),
  });
}

export function useResetPassword(token: string) {
  return useMutation({
    mutationFn: (input: { password: string }) => api.post<{ data: { message: string } }>(`/api/password-resets/${encodeURIComponent(token)}`, input),
  });
}

export const invitationQuery = (token: string) =>
  queryOptions({
    queryKey: ['invitations', 'detail', token],
    queryFn: () => api.get<{ data: InvitationPreview }>(`/api/invitations/${encodeURIComponent(token)}`).then((r) => r.data),
    retry: false,
  });

export function useAcceptInvitation(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: AcceptInvitationInput) => api.post(`/api/invitations/${encodeURIComponent(token)}/accept`, input),
    onSuccess: () => refreshSession(queryClient),
  });
}
