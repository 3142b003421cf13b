import { zodResolver } from '@hookform/resolvers/zod';
import { lineKinds, type CreateQuoteRequest } from '@splitscope/contract';
import { useId } from 'react';
import { useFieldArray, useForm } from 'react-hook-form';
import { Button } from '@/components/ui/button';
import { blankLine, linesFormSchema, type LinesFormValues } from '../lib/lines-form';
import { formSubmit } from '@/lib/form-submit';

const field = 'block min-h-11 w-full rounded-md border border-stone-500 bg-white px-3';
const kindLabel = { part: 'Part', labour: 'Labour', other: 'Other' } as const;

interface Props {
  title: string;
  currency: string;
  defaultValues: LinesFormValues;
  submitLabel: string;
  pending: boolean;
  error: Error | null;
  onSubmit: (input: CreateQuoteRequest) => Promise<unknown>;
  onCancel?: () => void;
  /** an invoice has no note field on the server, so its editor does not ask for one */
  withNote?: boolean;
}

/** Parts and labour lines, tax rate and note for a quote or an invoice; the server prices what is saved. */
export function LinesEditor({ title, currency, defaultValues, submitLabel, pending, error, onSubmit, onCancel, withNote = true }: Props) {
  const id = useId();
  const form = useForm<LinesFormValues, unknown, CreateQuoteRequest>({ resolver: zodResolver(linesFormSchema), defaultValues });
  const lines = useFieldArray({ control: form.control, name: 'lines' });
  const errs = form.formState.errors;
  const cur = currency.toUpperCase();
  return (
    <form
      onSubmit={formSubmit(form.handleSubmit(onSubmit))}
      noValidate
      aria-labelledby={`${id}-h`}
      className="space-y-3 rounded-lg border border-stone-300 bg-white p-3"
    >
      <h3 id={`${id}-h`} className="text-lg font-semibold">
        {title}
      </h3>
      <p className="text-sm text-stone-700">
        Prices in {cur}, typed like 12.50. Quantities like 1 or 1.5 (hours of labour). The totals and the tax are worked out by the server when you save,
        rounded half away from zero once per document.
      </p>
      <ol className="space-y-3">
        {lines.fields.map((f, i) => {
          const e = errs.lines?.[i];
          return (
            <li key={f.id} className="grid gap-2 rounded-md border border-stone-200 p-2 sm:grid-cols-[8rem_minmax(0,1fr)_6rem_8rem_auto_auto] sm:items-start">
              <label>
                <span className="text-sm font-medium">Kind</span>
                <select className={field} {...form.register(`lines.${i}.kind`)}>
                  {lineKinds.map((k) => (
                    <option key={k} value={k}>
                      {kindLabel[k]}
                    </option>
                  ))}
                </select>
              </label>
              <label>
                <span className="text-sm font-medium">Description (line {i + 1})</span>
                <input className={field} autoComplete="off" {...form.register(`lines.${i}.description`)} aria-invalid={!!e?.description} />
                {e?.description && <span className="text-sm text-high">{e.description.message}</span>}
              </label>
              <label>
                <span className="text-sm font-medium">Quantity</span>
                <input
                  className={`${field} text-right tabular-nums`}
                  inputMode="decimal"
                  autoComplete="off"
                  {...form.register(`lines.${i}.quantity`)}
                  aria-invalid={!!e?.quantity}
                />
                {e?.quantity && <span className="text-sm text-high">{e.quantity.message}</span>}
              </label>
              <label>
                <span className="text-sm font-medium">Unit price ({cur})</span>
                <input
                  className={`${field} text-right tabular-nums`}
                  inputMode="decimal"
                  autoComplete="off"
                  placeholder="0.00"
                  {...form.register(`lines.${i}.unitPrice`)}
                  aria-invalid={!!e?.unitPrice}
                />
                {e?.unitPrice && <span className="text-sm text-high">{e.unitPrice.message}</span>}
              </label>
              <label className="flex min-h-11 items-center gap-2 sm:mt-5">
                <input type="checkbox" className="h-5 w-5" {...form.register(`lines.${i}.taxable`)} />
                <span className="text-sm">Taxed</span>
              </label>
              <Button
                variant="ghost"
                className="sm:mt-5"
                aria-label={`Remove line ${i + 1}`}
                disabled={lines.fields.length === 1}
                onClick={() => lines.remove(i)}
              >
                Remove
              </Button>
            </li>
          );
        })}
      </ol>
      {errs.lines?.root?.message && <p className="text-sm text-high">{errs.lines.root.message}</p>}
      <div className="flex flex-wrap gap-2">
        <Button variant="secondary" onClick={() => lines.append(blankLine('part'))}>
          Add a part
        </Button>
        <Button variant="secondary" onClick={() => lines.append({ ...blankLine('labour'), description: 'Bench labour (hours)' })}>
          Add labour
        </Button>
      </div>
      <div className="grid gap-3 sm:grid-cols-[10rem_minmax(0,1fr)]">
        <label>
          <span className="text-sm font-medium">Tax rate (%)</span>
          <input
            className={`${field} text-right tabular-nums`}
            inputMode="decimal"
            autoComplete="off"
            {...form.register('taxRate')}
            aria-invalid={!!errs.taxRate}
          />
          {errs.taxRate && <span className="text-sm text-high">{errs.taxRate.message}</span>}
        </label>
        {withNote && (
          <label>
            <span className="text-sm font-medium">Note to the customer (optional)</span>
            <textarea rows={2} className={`${field} py-2`} {...form.register('note')} />
            {errs.note && <span className="text-sm text-high">{errs.note.message}</span>}
          </label>
        )}
      </div>
      {error && (
        <p role="alert" className="text-sm text-high">
          {error.message}
        </p>
      )}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" disabled={pending}>
          {pending ? 'Saving…' : submitLabel}
        </Button>
        {onCancel && (
          <Button variant="secondary" onClick={onCancel}>
            Cancel
          </Button>
        )}
      </div>
    </form>
  );
}
