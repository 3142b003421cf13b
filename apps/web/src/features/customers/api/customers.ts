import {
  customerListResponse,
  customerSchema,
  mergeCustomerResponse,
  type CreateCustomerRequest,
  type CustomerListQuery,
  type UpdateCustomerRequest,
} from '@splitscope/contract';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

// One key prefix for every customer query, so a change anywhere refreshes the lists (the intake form's too).
const KEY = 'customers';

export const getCustomersQueryOptions = (query: CustomerListQuery = {}) =>
  queryOptions({
    queryKey: [KEY, 'list', query],
    queryFn: () => {
      const qs = new URLSearchParams(Object.entries(query).filter(([, v]) => v) as [string, string][]);
      return api(`/customers${qs.size ? `?${qs}` : ''}`, { schema: customerListResponse });
    },
  });
export const useCustomerList = (query: CustomerListQuery = {}) => useQuery(getCustomersQueryOptions(query));

export const useCustomer = (id: string) =>
  useQuery(queryOptions({ queryKey: [KEY, 'one', id], queryFn: () => api(`/customers/${encodeURIComponent(id)}`, { schema: customerSchema }) }));

/** Every change to customers invalidates them all; a merge also moves jobs, so the job lists too. */
function useCustomerMutation<I, O>(fn: (input: I) => Promise<O>, alsoJobs = false) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: [KEY] });
      if (alsoJobs) void qc.invalidateQueries({ queryKey: ['jobs'] });
    },
  });
}

export const useCreateCustomer = () =>
  useCustomerMutation((input: CreateCustomerRequest) => api('/customers', { method: 'POST', body: JSON.stringify(input), schema: customerSchema }));

export const useUpdateCustomer = (id: string) =>
  useCustomerMutation((input: UpdateCustomerRequest) =>
    api(`/customers/${encodeURIComponent(id)}`, { method: 'PATCH', body: JSON.stringify(input), schema: customerSchema }),
  );

export const useMergeCustomer = (keepId: string) =>
  useCustomerMutation(
    (duplicateId: string) =>
      api(`/customers/${encodeURIComponent(keepId)}/merge`, { method: 'POST', body: JSON.stringify({ duplicateId }), schema: mergeCustomerResponse }),
    true,
  );
