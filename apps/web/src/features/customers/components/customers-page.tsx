import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { PageHeader } from '@/components/ui/page-header';
import { QueryState } from '@/components/ui/query-state';
import { TextField } from '@/components/ui/text-field';
import { useCreateCustomer, useCustomerList } from '../api/customers';
import { CustomerForm, kindLabel } from './customer-form';

/** The shop's customers: search, add one, open one to edit it, see its jobs or merge a duplicate into it. */
export default function CustomersPage() {
  const [q, setQ] = useState('');
  const list = useCustomerList({ q: q.trim() || undefined });
  const create = useCreateCustomer();
  const navigate = useNavigate();
  return (
    <div className="max-w-4xl space-y-6">
      <PageHeader title="Customers" />
      <section aria-labelledby="add-customer" className="space-y-2">
        <h2 id="add-customer" className="text-lg font-semibold">
          Add a customer
        </h2>
        <CustomerForm
          label="Add a customer"
          submitLabel="Add customer"
          pending={create.isPending}
          error={create.error}
          onSubmit={(input) => create.mutate(input, { onSuccess: (c) => void navigate(`/customers/${c.id}`) })}
        />
      </section>
      <section aria-labelledby="all-customers" className="space-y-3 rounded-lg border border-stone-300 bg-white p-4">
        <h2 id="all-customers" className="text-lg font-semibold">
          All customers
        </h2>
        <TextField label="Search by name, firm or e-mail" type="search" value={q} onChange={(e) => setQ(e.target.value)} className="max-w-md" />
        <QueryState query={list} label="the customers">
          {(d) =>
            d.items.length ? (
              <ul>
                {d.items.map((c) => (
                  <li key={c.id} className="border-b border-stone-200 py-2 last:border-0">
                    <Link to={`/customers/${c.id}`} className="flex min-h-11 flex-wrap items-center gap-x-3 font-semibold text-board underline">
                      {c.name}
                      <span className="text-sm font-normal text-stone-700 no-underline">
                        {[c.company, c.email, c.phone, kindLabel[c.kind]].filter(Boolean).join(' · ')}
                      </span>
                    </Link>
                  </li>
                ))}
              </ul>
            ) : (
              <p className="text-stone-700">No customer matches.</p>
            )
          }
        </QueryState>
      </section>
    </div>
  );
}
