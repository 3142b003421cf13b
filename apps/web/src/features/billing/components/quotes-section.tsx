import { centsToDecimal, type Quote } from '@splitscope/contract';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { DocumentTable } from '@/components/ui/document-table';
import { dateTime } from '@/lib/format';
import { useQuoteDraft } from '@/lib/api/parts-bin';
import { useSaveQuote } from '../api/save-quote';
import { useSendDocument } from '../api/send-document';
import type { BillingCtx } from '../lib/billing-ctx';
import { formValuesOf } from '../lib/lines-form';
import { QuoteStatus } from './document-status';
import { LinesEditor } from './lines-editor';
import { SendForm } from './send-form';

function QuoteCard({ quote, ctx, onEdit, current, replaced }: { quote: Quote; ctx: BillingCtx; onEdit: () => void; current: boolean; replaced: boolean }) {
  const send = useSendDocument(ctx.job.id, 'quotes');
  const open = quote.status === 'draft' || (quote.status === 'sent' && !replaced);
  return (
    <article aria-labelledby={`quote-${quote.id}`} className="space-y-3 rounded-lg border border-stone-300 bg-white p-3">
      <div className="flex flex-wrap items-center gap-2">
        <h3 id={`quote-${quote.id}`} className="text-lg font-semibold">
          Quote {quote.number}
        </h3>
        <QuoteStatus quote={quote} replaced={replaced} />
      </div>
      <p className="text-sm text-stone-700">
        Made {dateTime(quote.createdAt)}
        {quote.sentAt && ` · sent to ${quote.sentTo} ${dateTime(quote.sentAt)}`}
        {quote.decidedAt && ` · answered ${dateTime(quote.decidedAt)}`}
      </p>
      {quote.declineReason && <p className="rounded bg-red-50 p-2 text-sm">Customer’s reason: “{quote.declineReason}”</p>}
      {quote.note && <p className="text-sm">Note: {quote.note}</p>}
      <DocumentTable doc={quote} caption={`Quote ${quote.number}`} />
      {ctx.canEdit && quote.status === 'draft' && (
        <Button variant="secondary" onClick={onEdit}>
          Edit the draft
        </Button>
      )}
      {ctx.canEdit && open && current && (
        <SendForm
          label={quote.status === 'draft' ? 'Send the quote' : 'Send again'}
          defaultTo={quote.sentTo ?? ctx.job.customer.email}
          pending={send.isPending}
          error={send.error}
          sent={send.data}
          onSend={(to) => send.mutate({ id: quote.id, to })}
        />
      )}
    </article>
  );
}

/** The job's quotes, newest first, and the editor for a new one or a draft. */
export function QuotesSection({ quotes, ctx }: { quotes: Quote[]; ctx: BillingCtx }) {
  const save = useSaveQuote(ctx.job.id);
  // null: no editor; 'new': a new quote; otherwise the id of the draft being edited
  // A job with no quote opens on the editor, unless it is already past verification (then the invoice is next).
  const quoting = !['verified', 'returned'].includes(ctx.job.status);
  const [editing, setEditing] = useState<string | null>(quotes.length === 0 && ctx.canEdit && quoting ? 'new' : null);
  const draft = editing && editing !== 'new' ? (quotes.find((q) => q.id === editing) ?? null) : null;
  // A new quote starts from the parts the repairs took from the bin and the shop's labour rate.
  const prefill = useQuoteDraft(ctx.job.id, editing === 'new' && ctx.canEdit);
  const prefilled = prefill.data?.lines.length
    ? { lines: prefill.data.lines.map(({ unitCents, ...l }) => ({ ...l, unitPrice: centsToDecimal(unitCents) })), taxRate: ctx.defaultRate, note: '' }
    : null;
  const [latest, ...earlier] = [...quotes].reverse();
  // the server's rule: once a newer quote went out, the customer answers only that one
  const replaced = (q: Quote) => quotes.some((o) => o.status !== 'draft' && o.createdAt > q.createdAt);
  return (
    <section aria-labelledby="quotes-h" className="space-y-3">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="quotes-h" className="text-xl font-semibold">
          Quotes
        </h2>
        {ctx.canEdit && editing === null && ctx.job.status !== 'returned' && <Button onClick={() => setEditing('new')}>New quote</Button>}
      </div>
      {editing && (
        <LinesEditor
          key={`${editing}-${prefilled ? 'prefilled' : 'blank'}`}
          title={draft ? `Edit draft ${draft.number}` : prefilled ? 'New quote (from the parts used and the labour rate)' : 'New quote'}
          currency={ctx.currency}
          defaultValues={draft ? formValuesOf(draft, ctx.defaultRate) : (prefilled ?? formValuesOf(null, ctx.defaultRate))}
          submitLabel={draft ? 'Save the draft' : 'Save as draft'}
          pending={save.isPending}
          error={save.error}
          // the error shows from the mutation state; swallowing the rejection keeps it out of the console
          onSubmit={(input) =>
            save.mutateAsync({ quoteId: draft?.id ?? null, input }).then(
              () => setEditing(null),
              () => undefined,
            )
          }
          onCancel={quotes.length ? () => setEditing(null) : undefined}
        />
      )}
      {quotes.length === 0 && !editing && <p className="text-stone-700">No quote for this job.</p>}
      {latest && <QuoteCard key={latest.id} quote={latest} ctx={ctx} current replaced={false} onEdit={() => setEditing(latest.id)} />}
      {earlier.length > 0 && (
        // Older quotes are kept as the record of what the customer saw; only the newest is sent on from here.
        <details className="rounded-lg border border-stone-300 bg-stone-50 p-2">
          <summary className="flex min-h-11 cursor-pointer items-center font-semibold">Earlier quotes ({earlier.length})</summary>
          <div className="mt-2 space-y-3">
            {earlier.map((q) => (
              <QuoteCard key={q.id} quote={q} ctx={ctx} current={false} replaced={replaced(q)} onEdit={() => setEditing(q.id)} />
            ))}
          </div>
        </details>
      )}
    </section>
  );
}
