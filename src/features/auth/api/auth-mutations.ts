import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { SignUpInput, AcceptInvitationInput } from '@domain/schemas/auth';
import { api } from '@/lib/api-client';
import { refreshSession } from '@/lib/auth';
import type { InvitationPreview, SignUpPreview } from '@/types/api';

/** Asks for a sign-up; the answer is the same for every address: check your inbox. */
export function useSignUp() {
  return useMutation({
    mutationFn: (input: SignUpInput) => api.post<{ data: { email: string; message: string } }>('/api/signup', input).then((r) => r.data),
  });
}

export const signUpConfirmationQuery = (token: string) =>
  queryOptions({
    queryKey: ['signups', 'detail', token],
    queryFn: () => api.get<{ data: SignUpPreview }>(`/api/signups/${encodeURIComponent(token)}`).then((r) => r.data),
    retry: false,
  });

/** Confirms the address from the e-mailed link: creates the firm and opens the owner's session. */
export function useConfirmSignUp(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => api.post(`/api/signups/${encodeURIComponent(token)}`, {}),
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
