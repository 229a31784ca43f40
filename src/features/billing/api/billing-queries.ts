import { queryOptions, useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ApiBilling, ApiInvoice } from '@/types/api';

export const billingKeys = {
  all: ['billing'] as const,
  detail: () => [...billingKeys.all, 'detail'] as const,
  invoices: () => [...billingKeys.all, 'invoices'] as const,
};

/** The firm's plan, state, usage against limits and the plan catalogue (owners only). */
export const billingQuery = () =>
  queryOptions({
    queryKey: billingKeys.detail(),
    queryFn: ({ signal }) => api.get<{ data: ApiBilling }>('/api/billing', signal).then((r) => r.data),
  });

/** The firm's invoices as Stripe keeps them, newest first (none before the first checkout). */
export const invoicesQuery = () =>
  queryOptions({
    queryKey: billingKeys.invoices(),
    queryFn: ({ signal }) => api.get<{ data: ApiInvoice[] }>('/api/billing/invoices', signal).then((r) => r.data),
  });

/** Leaves Mullion for a page of the payment service (Checkout or the billing portal). */
function goTo(url: string): void {
  window.location.assign(url);
}

/**
 * Starts Stripe Checkout for a plan and sends the browser there. Stripe brings the owner back
 * to /app/billing?checkout=done (or =cancelled). 409 when the firm already has a subscription,
 * 503 when payments are not set up: the ApiError carries the server's message.
 */
export function useStartCheckout() {
  return useMutation({
    mutationFn: (planKey: string) => api.post<{ data: { url: string } }>('/api/billing/checkout', { planKey }).then((r) => r.data.url),
    onSuccess: goTo,
  });
}

/** Opens Stripe's billing portal (change card or plan, cancel); it returns to /app/billing. */
export function useOpenBillingPortal() {
  return useMutation({
    mutationFn: () => api.post<{ data: { url: string } }>('/api/billing/portal').then((r) => r.data.url),
    onSuccess: goTo,
  });
}
