import { checkoutResponse } from '@splitscope/contract';
import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const startCheckout = (token: string, invoiceId: string) =>
  api(`/public/links/${encodeURIComponent(token)}/invoices/${encodeURIComponent(invoiceId)}/checkout`, {
    method: 'POST',
    body: '{}',
    schema: checkoutResponse,
  });

/** Opens the hosted checkout: the browser leaves for the payment service and comes back to this page. */
export const useStartCheckout = (token: string) =>
  useMutation({
    mutationFn: (invoiceId: string) => startCheckout(token, invoiceId),
    onSuccess: ({ url }) => window.location.assign(url),
  });
