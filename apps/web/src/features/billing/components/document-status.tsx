import type { Invoice, Quote } from '@splitscope/contract';

// Words carry the state; the colour only repeats it (AA contrast on each pair).
const quoteTone: Record<Quote['status'], [string, string]> = {
  draft: ['Draft, not sent', 'bg-stone-200 text-stone-900'],
  sent: ['Sent, awaiting the customer', 'bg-amber-100 text-amber-950'],
  approved: ['Approved by the customer', 'bg-emerald-100 text-emerald-950'],
  declined: ['Declined by the customer', 'bg-red-100 text-red-950'],
};

/** `replaced`: a newer quote went out, so the customer can no longer answer this one. */
export function QuoteStatus({ quote, replaced = false }: { quote: Quote; replaced?: boolean }) {
  const [label, tone] = replaced && quote.status === 'sent' ? ['Replaced by a newer quote', 'bg-stone-200 text-stone-900'] : quoteTone[quote.status];
  return <span className={`inline-block rounded px-2 py-0.5 text-sm font-medium ${tone}`}>{label}</span>;
}

export function InvoiceStatus({ invoice }: { invoice: Invoice }) {
  const [label, tone] =
    invoice.status === 'paid'
      ? ['Paid', 'bg-emerald-100 text-emerald-950']
      : invoice.status === 'void'
        ? ['Void', 'bg-stone-300 text-stone-900']
        : invoice.sentAt
          ? ['Sent, awaiting payment', 'bg-amber-100 text-amber-950']
          : ['Issued, not sent', 'bg-stone-200 text-stone-900'];
  return <span className={`inline-block rounded px-2 py-0.5 text-sm font-medium ${tone}`}>{label}</span>;
}
