import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { ROLES, hasRole, type Customer } from '@splitscope/contract';
import { Button } from '@/components/ui/button';
import { SelectField } from '@/components/ui/select-field';
import { PageHeader } from '@/components/ui/page-header';
import { QueryState } from '@/components/ui/query-state';
import { StatusBadge } from '@/components/ui/status-badge';
import { ErrorNote } from '@/components/ui/text-field';
import { useJobs } from '@/lib/api/get-jobs';
import { useMe } from '@/lib/api/me';
import { useCustomer, useCustomerList, useMergeCustomer, useUpdateCustomer } from '../api/customers';
import { CustomerForm, kindLabel } from './customer-form';

function CustomerJobs({ id }: { id: string }) {
  const jobs = useJobs({ customerId: id });
  return (
    <section aria-labelledby="customer-jobs" className="rounded-lg border border-stone-300 bg-white p-4">
      <h2 id="customer-jobs" className="text-lg font-semibold">
        Jobs
      </h2>
      <QueryState query={jobs} label="the jobs">
        {(d) =>
          d.items.length ? (
            <ul>
              {d.items.map((j) => (
                <li key={j.id} className="flex flex-wrap items-center gap-3 border-b border-stone-200 py-2 last:border-0">
                  <Link to={`/jobs/${j.id}`} className="min-h-11 content-center font-semibold text-board underline">
                    Job {j.number}: {j.boardName}
                  </Link>
                  <span className="text-sm text-stone-700">
                    {j.unitDescription} · received {j.receivedAt.slice(0, 10)}
                  </span>
                  <StatusBadge status={j.status} sentBack={j.sentBack} />
                </li>
              ))}
            </ul>
          ) : (
            <p className="text-stone-700">No jobs yet.</p>
          )
        }
      </QueryState>
    </section>
  );
}

/** Moves a duplicate's jobs, quotes and invoices onto this customer and removes the duplicate. */
function MergeDuplicate({ keep }: { keep: Customer }) {
  const others = useCustomerList();
  const merge = useMergeCustomer(keep.id);
  const [duplicateId, setDuplicateId] = useState('');
  const candidates = (others.data?.items ?? []).filter((c) => c.id !== keep.id);
  const chosen = candidates.find((c) => c.id === duplicateId);
  return (
    <section aria-labelledby="merge" className="space-y-2 rounded-lg border border-stone-300 bg-white p-4">
      <h2 id="merge" className="text-lg font-semibold">
        Merge a duplicate into {keep.name}
      </h2>
      <p className="text-sm text-stone-700">The duplicate's jobs, quotes and invoices move here; then the duplicate is removed. This cannot be undone.</p>
      <div className="flex flex-wrap items-end gap-3">
        <SelectField
          label="Duplicate customer"
          value={duplicateId}
          options={['', ...candidates.map((c) => c.id)]}
          labels={Object.fromEntries([
            ['', 'Choose the duplicate'],
            ...candidates.map((c) => [c.id, [c.name, c.company, c.email].filter(Boolean).join(' · ')]),
          ])}
          onChange={setDuplicateId}
          className="min-w-64 flex-1"
        />
        <Button variant="secondary" disabled={!chosen || merge.isPending} onClick={() => merge.mutate(duplicateId, { onSuccess: () => setDuplicateId('') })}>
          {merge.isPending ? 'Merging…' : chosen ? `Merge ${chosen.name} into ${keep.name}` : 'Merge'}
        </Button>
      </div>
      <div aria-live="polite">
        <ErrorNote error={merge.error} />
        {merge.data && (
          <p className="text-sm font-semibold text-ok">
            Merged: {merge.data.moved.jobs} jobs, {merge.data.moved.quotes} quotes and {merge.data.moved.invoices} invoices moved.
          </p>
        )}
      </div>
    </section>
  );
}

function CustomerDetail({ c }: { c: Customer }) {
  const me = useMe();
  const update = useUpdateCustomer(c.id);
  const mayEdit = !!me.data && hasRole(me.data.role, ROLES.reviewers);
  return (
    <div className="space-y-6">
      <p className="text-stone-700">{[c.company, c.email, c.phone, kindLabel[c.kind]].filter(Boolean).join(' · ')}</p>
      <CustomerJobs id={c.id} />
      {mayEdit && (
        <section aria-labelledby="edit-customer" className="space-y-2">
          <h2 id="edit-customer" className="text-lg font-semibold">
            Edit
          </h2>
          <CustomerForm
            key={`${c.id}-${c.name}-${c.email ?? ''}`}
            start={c}
            label="Edit the customer"
            submitLabel="Save changes"
            pending={update.isPending}
            error={update.error}
            onSubmit={(input) => update.mutate(input)}
          />
          {update.isSuccess && (
            <p className="text-sm font-semibold text-ok" aria-live="polite">
              Saved.
            </p>
          )}
        </section>
      )}
      {mayEdit && <MergeDuplicate keep={c} />}
    </div>
  );
}

/** One customer: their details, their jobs, and (for leads and admins) edit and merge. */
export default function CustomerDetailPage() {
  const { id = '' } = useParams();
  const customer = useCustomer(id);
  return (
    <div className="max-w-4xl space-y-4">
      <p>
        <Link to="/customers" className="text-board underline">
          All customers
        </Link>
      </p>
      <PageHeader title={customer.data?.name ?? 'Customer'} />
      <QueryState query={customer} label="the customer">
        {(c) => <CustomerDetail c={c} />}
      </QueryState>
    </div>
  );
}
