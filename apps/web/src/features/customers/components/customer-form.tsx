import { useState, type FormEvent } from 'react';
import { createCustomerRequest, customerKinds, type CreateCustomerRequest, type Customer, type CustomerKind } from '@splitscope/contract';
import { Button } from '@/components/ui/button';
import { SelectField } from '@/components/ui/select-field';
import { ErrorNote, TextField } from '@/components/ui/text-field';

export const kindLabel: Record<CustomerKind, string> = { contractor: 'Contractor (firm)', 'field-technician': 'Field technician' };

/** Name, firm, e-mail, phone, kind and notes: one form to add a customer and to edit one. */
export function CustomerForm({
  start,
  label,
  submitLabel,
  pending,
  error,
  onSubmit,
}: {
  start?: Customer;
  label: string;
  submitLabel: string;
  pending: boolean;
  error: Error | null;
  onSubmit: (input: CreateCustomerRequest, reset: () => void) => void;
}) {
  const empty = { name: '', company: '', email: '', phone: '', kind: 'contractor' as CustomerKind, notes: '' };
  const initial = start
    ? { name: start.name, company: start.company ?? '', email: start.email ?? '', phone: start.phone ?? '', kind: start.kind, notes: start.notes ?? '' }
    : empty;
  const [f, setF] = useState(initial);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const bind = (k: 'name' | 'company' | 'email' | 'phone' | 'notes') => ({
    value: f[k],
    onChange: (e: { target: { value: string } }) => setF({ ...f, [k]: e.target.value }),
    error: errors[k],
  });
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const r = createCustomerRequest.safeParse(f);
    if (!r.success) return setErrors(Object.fromEntries(r.error.issues.map((i) => [i.path.join('.'), i.message])));
    setErrors({});
    onSubmit(r.data, () => setF(empty));
  };
  return (
    <form onSubmit={submit} noValidate aria-label={label} className="grid gap-3 rounded-lg border border-stone-300 bg-white p-4 sm:grid-cols-2">
      <TextField label="Name" autoComplete="off" {...bind('name')} />
      <TextField label="Firm (if any)" autoComplete="off" {...bind('company')} />
      <TextField label="E-mail (quotes and invoices go here)" type="email" autoComplete="off" {...bind('email')} />
      <TextField label="Phone" type="tel" autoComplete="off" {...bind('phone')} />
      <SelectField label="Kind" value={f.kind} options={customerKinds} labels={kindLabel} onChange={(kind) => setF({ ...f, kind })} />
      <TextField label="Notes" autoComplete="off" {...bind('notes')} />
      <div className="sm:col-span-2" aria-live="polite">
        <ErrorNote error={error} />
      </div>
      <Button type="submit" disabled={pending} className="sm:col-span-2 sm:justify-self-start">
        {pending ? 'Saving…' : submitLabel}
      </Button>
    </form>
  );
}
