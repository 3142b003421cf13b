import { zodResolver } from '@hookform/resolvers/zod';
import type { BillingSettings } from '@splitscope/contract';
import { useForm } from 'react-hook-form';
import { Button } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { QueryState } from '@/components/ui/query-state';
import { useMe } from '@/lib/api/me';
import { useBillingSettings } from '../api/get-billing-settings';
import { useUpdateBillingSettings } from '../api/update-billing-settings';
import { milestoneOptions, settingsFormSchema, settingsFormValues, type SettingsFormValues } from '../lib/settings-form';
import { formSubmit } from '@/lib/form-submit';

const field = 'block min-h-11 w-full rounded-md border border-stone-500 bg-white px-3';

function SettingsForm({ settings }: { settings: BillingSettings }) {
  const update = useUpdateBillingSettings();
  const form = useForm<SettingsFormValues, unknown, SettingsFormValues>({
    resolver: zodResolver(settingsFormSchema),
    defaultValues: settingsFormValues(settings),
  });
  const errs = form.formState.errors;
  const submit = form.handleSubmit((v) =>
    update.mutateAsync(v).then(
      (s) => form.reset(settingsFormValues(s)),
      () => undefined,
    ),
  );
  return (
    <form onSubmit={formSubmit(submit)} noValidate className="max-w-3xl space-y-4 rounded-lg border border-stone-300 bg-white p-4">
      <div className="grid gap-4 sm:grid-cols-2">
        <label>
          <span className="font-medium">Currency</span>
          <input className={`${field} uppercase`} maxLength={3} autoComplete="off" {...form.register('currency')} aria-invalid={!!errs.currency} />
          <span className="text-sm text-stone-700">New quotes and invoices use it; documents already made keep theirs.</span>
          {errs.currency && <span className="block text-sm text-high">{errs.currency.message}</span>}
        </label>
        <label>
          <span className="font-medium">Default tax rate (%)</span>
          <input className={field} inputMode="decimal" autoComplete="off" {...form.register('taxRate')} aria-invalid={!!errs.taxRate} />
          <span className="text-sm text-stone-700">Each quote can change it. Check the rate that applies where you trade.</span>
          {errs.taxRate && <span className="block text-sm text-high">{errs.taxRate.message}</span>}
        </label>
        <label>
          <span className="font-medium">Customer links stay valid for (days)</span>
          <input
            type="number"
            min={1}
            max={365}
            className={field}
            {...form.register('linkValidDays', { valueAsNumber: true })}
            aria-invalid={!!errs.linkValidDays}
          />
          {errs.linkValidDays && <span className="block text-sm text-high">{errs.linkValidDays.message}</span>}
        </label>
        <label>
          <span className="font-medium">Replies go to (optional)</span>
          <input
            type="email"
            className={field}
            autoComplete="off"
            placeholder="office@example.com"
            {...form.register('replyTo')}
            aria-invalid={!!errs.replyTo}
          />
          {errs.replyTo && <span className="block text-sm text-high">{errs.replyTo.message}</span>}
        </label>
      </div>
      <fieldset className="space-y-1">
        <legend className="font-medium">Send the customer a status e-mail when the job reaches</legend>
        <p className="text-sm text-stone-700">A milestone switched on now mails only jobs that reach it from now on.</p>
        <div className="grid gap-1 sm:grid-cols-3">
          {milestoneOptions.map((m) => (
            <label key={m.value} className="flex min-h-11 items-center gap-2">
              <input type="checkbox" className="h-5 w-5" value={m.value} {...form.register('notifyOn')} />
              {m.label}
            </label>
          ))}
        </div>
      </fieldset>
      <div aria-live="polite">
        {update.error && (
          <p role="alert" className="text-sm text-high">
            {update.error.message}
          </p>
        )}
        {update.isSuccess && !form.formState.isDirty && <p className="text-sm font-semibold text-ok">Saved.</p>}
      </div>
      <Button type="submit" disabled={update.isPending}>
        {update.isPending ? 'Saving…' : 'Save the settings'}
      </Button>
    </form>
  );
}

function ReadOnly({ s }: { s: BillingSettings }) {
  return (
    <dl className="grid max-w-xl grid-cols-[auto_1fr] gap-x-4 gap-y-1 rounded-lg border border-stone-300 bg-white p-4">
      <dt className="font-medium">Currency</dt>
      <dd>{s.currency.toUpperCase()}</dd>
      <dt className="font-medium">Default tax rate</dt>
      <dd>{s.taxRate} %</dd>
      <dt className="font-medium">Link validity</dt>
      <dd>{s.linkValidDays} days</dd>
      <dt className="font-medium">Status e-mails</dt>
      <dd>
        {s.notifyOn.length
          ? milestoneOptions
              .filter((m) => s.notifyOn.includes(m.value))
              .map((m) => m.label)
              .join(', ')
          : 'none'}
      </dd>
    </dl>
  );
}

/** The shop's billing settings; only a shop admin changes them (the server refuses anyone else). */
export default function BillingSettingsPage() {
  const me = useMe();
  const settings = useBillingSettings();
  return (
    <div>
      <PageHeader title="Billing settings" />
      <QueryState query={settings} label="the billing settings">
        {(s) =>
          me.data?.role === 'admin' ? (
            <SettingsForm settings={s} />
          ) : (
            <>
              <p className="mb-3">Only a shop admin changes the billing settings.</p>
              <ReadOnly s={s} />
            </>
          )
        }
      </QueryState>
    </div>
  );
}
