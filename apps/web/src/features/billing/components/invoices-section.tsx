import type { Invoice, Quote } from '@splitscope/contract';
import { formatMoney, reportReady } from '@splitscope/contract';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { DocumentTable } from '@/components/ui/document-table';
import { dateTime } from '@/lib/format';
import { useCreateInvoice } from '../api/create-invoice';
import { useSendDocument } from '../api/send-document';
import type { BillingCtx } from '../lib/billing-ctx';
import { formValuesOf } from '../lib/lines-form';
import { InvoiceStatus } from './document-status';
import { LinesEditor } from './lines-editor';
import { SendForm } from './send-form';

function InvoiceCard({ invoice, ctx }: { invoice: Invoice; ctx: BillingCtx }) {
  const send = useSendDocument(ctx.job.id, 'invoices');
  return (
    <article aria-labelledby={`inv-${invoice.id}`} className="space-y-3 rounded-lg border border-stone-300 bg-white p-3">
      <div className="flex flex-wrap items-center gap-2">
        <h3 id={`inv-${invoice.id}`} className="text-lg font-semibold">
          Invoice {invoice.number}
        </h3>
        <InvoiceStatus invoice={invoice} />
      </div>
      <p className="text-sm text-stone-700">
        Issued {dateTime(invoice.issuedAt)}
        {invoice.sentAt && ` · e-mailed ${dateTime(invoice.sentAt)}`}
        {invoice.paidAt && ` · paid ${formatMoney(invoice.paidCents, invoice.currency)} on ${dateTime(invoice.paidAt)}`}
      </p>
      <DocumentTable doc={invoice} caption={`Invoice ${invoice.number}`} />
      {ctx.canEdit && invoice.status === 'issued' && (
        <SendForm
          label={invoice.sentAt ? 'Send again' : 'Send the invoice'}
          defaultTo={ctx.job.customer.email}
          pending={send.isPending}
          error={send.error}
          sent={send.data}
          onSend={(to) => send.mutate({ id: invoice.id, to })}
        />
      )}
    </article>
  );
}

function IssueInvoice({ ctx, approved }: { ctx: BillingCtx; approved: Quote | undefined }) {
  const create = useCreateInvoice(ctx.job.id);
  const [mailNow, setMailNow] = useState(true);
  const [ownLines, setOwnLines] = useState(!approved);
  return (
    <div className="space-y-3 rounded-lg border border-board bg-board-light p-3">
      <h3 className="text-lg font-semibold">Issue the invoice</h3>
      <label className="flex min-h-11 items-center gap-2">
        <input type="checkbox" className="h-5 w-5" checked={mailNow} onChange={(e) => setMailNow(e.target.checked)} />
        E-mail it to the customer at once, with the repair report attached and a link to pay
      </label>
      {approved && !ownLines && (
        <div className="flex flex-wrap gap-2">
          <Button disabled={create.isPending} onClick={() => create.mutate({ quoteId: approved.id, send: mailNow })}>
            {create.isPending ? 'Issuing…' : `Issue from approved quote ${approved.number} (${formatMoney(approved.totalCents, approved.currency)})`}
          </Button>
          <Button variant="secondary" onClick={() => setOwnLines(true)}>
            Type other lines
          </Button>
        </div>
      )}
      {approved && !ownLines && create.error && (
        <p role="alert" className="text-sm text-high">
          {create.error.message}
        </p>
      )}
      {ownLines && (
        <LinesEditor
          title="Invoice lines"
          currency={ctx.currency}
          defaultValues={formValuesOf(approved ?? null, ctx.defaultRate)}
          submitLabel="Issue the invoice"
          withNote={false}
          pending={create.isPending}
          error={create.error}
          onSubmit={(input) => create.mutateAsync({ lines: input.lines, taxRate: input.taxRate, send: mailNow }).catch(() => undefined)}
          onCancel={approved ? () => setOwnLines(false) : undefined}
        />
      )}
    </div>
  );
}

/** Invoices of the job; issuing one waits for verification, as the server requires. */
export function InvoicesSection({ invoices, quotes, ctx }: { invoices: Invoice[]; quotes: Quote[]; ctx: BillingCtx }) {
  const verified = reportReady(ctx.job.status);
  const open = invoices.some((i) => i.status === 'issued');
  const approved = [...quotes].reverse().find((q) => q.status === 'approved');
  return (
    <section aria-labelledby="invoices-h" className="space-y-3">
      <h2 id="invoices-h" className="text-xl font-semibold">
        Invoice
      </h2>
      {!verified && <p className="text-stone-700">The invoice is issued once the board is verified against its expected readings.</p>}
      {verified && ctx.canEdit && !open && !invoices.some((i) => i.status === 'paid') && <IssueInvoice ctx={ctx} approved={approved} />}
      {verified && invoices.length === 0 && !ctx.canEdit && <p className="text-stone-700">No invoice issued yet.</p>}
      {[...invoices].reverse().map((i) => (
        <InvoiceCard key={i.id} invoice={i} ctx={ctx} />
      ))}
    </section>
  );
}
