import { billingSettingsSchema } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** The shop's currency, default tax rate, status e-mail milestones and customer-link expiry. */
export const getBillingSettings = () => api('/billing/settings', { schema: billingSettingsSchema });

export const getBillingSettingsQueryOptions = () => queryOptions({ queryKey: ['billing-settings'], queryFn: getBillingSettings, staleTime: 60_000 });

export const useBillingSettings = () => useQuery(getBillingSettingsQueryOptions());
