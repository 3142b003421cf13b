import { useState } from 'react';
import { useParams, useSearchParams } from 'react-router-dom';
import { formatMoney, shopCardLines, type PublicJob } from '@splitscope/contract';
import { Button } from '@/components/ui/button';
import { ApiError } from '@/lib/api-client';
import { useDecideQuote } from '../api/decide-quote';
import { usePublicJob } from '../api/get-public-job';
import { useStartCheckout } from '../api/start-checkout';
import { DocumentTable } from '@/components/ui/document-table';

/** A plain page for a dead link: it says nothing about whether the link ever existed. */
function LinkNoLongerValid() {
  return (
    <main className="mx-auto max-w-xl p-6">
      <h1 className="mb-3 text-2xl font-semibold">Link no longer valid</h1>
      <p>This link is no longer valid. Ask the repair shop to send you a new one.</p>
    </main>
  );
}

/** `replacedBy`: a newer quote's number; only the newest quote can be answered (the server holds the same rule). */
function QuoteCard({ token, quote, replacedBy }: { token: string; quote: PublicJob['quotes'][number]; replacedBy: string | null }) {
  const decide = useDecideQuote(token);
  const [declining, setDeclining] = useState(false);
  const [reason, setReason] = useState('');
  return (
    <section aria-labelledby={`q-${quote.id}`} className="rounded-lg border border-stone-300 bg-white p-4">
      <h2 id={`q-${quote.id}`} className="mb-2 text-xl font-semibold">
        Quote {quote.number}
      </h2>
      {quote.note && <p className="mb-3">{quote.note}</p>}
      <DocumentTable doc={quote} caption={`Quote ${quote.number}`} />
      <div className="mt-4" aria-live="polite">
        {quote.customerApproval === 'approved' && <p className="font-semibold text-ok">You approved this quote. Thank you, the repair goes ahead.</p>}
        {quote.customerApproval === 'declined' && (
          <p className="font-semibold">You declined this quote{quote.declineReason ? `: “${quote.declineReason}”` : ''}. The shop has been told.</p>
        )}
        {quote.status === 'sent' && replacedBy && <p className="font-semibold">Replaced by quote {replacedBy}; nothing to answer here.</p>}
        {quote.status === 'sent' && !replacedBy && !declining && (
          <div className="flex flex-wrap gap-2">
            <Button disabled={decide.isPending} onClick={() => decide.mutate({ quoteId: quote.id, decision: 'approve' })}>
              Approve the quote
            </Button>
            <Button variant="secondary" disabled={decide.isPending} onClick={() => setDeclining(true)}>
              Decline
            </Button>
          </div>
        )}
        {quote.status === 'sent' && !replacedBy && declining && (
          <form
            className="flex flex-col gap-2"
            onSubmit={(e) => {
              e.preventDefault();
              decide.mutate({ quoteId: quote.id, decision: 'decline', reason });
            }}
          >
            <label htmlFor={`reason-${quote.id}`}>Reason (optional)</label>
            <textarea
              id={`reason-${quote.id}`}
              className="rounded-md border border-stone-400 p-2"
              maxLength={2000}
              value={reason}
              onChange={(e) => setReason(e.target.value)}
            />
            <div className="flex gap-2">
              <Button type="submit" variant="danger" disabled={decide.isPending}>
                Decline the quote
              </Button>
              <Button variant="ghost" onClick={() => setDeclining(false)}>
                Back
              </Button>
            </div>
          </form>
        )}
        {decide.isError && (
          <p role="alert" className="mt-2 text-high">
            {decide.error.message}
          </p>
        )}
      </div>
    </section>
  );
}

function InvoiceCard({ token, invoice, returning }: { token: string; invoice: PublicJob['invoices'][number]; returning: boolean }) {
  const checkout = useStartCheckout(token);
  return (
    <section aria-labelledby={`i-${invoice.id}`} className="rounded-lg border border-stone-300 bg-white p-4">
      <h2 id={`i-${invoice.id}`} className="mb-2 text-xl font-semibold">
        Invoice {invoice.number}
      </h2>
      <DocumentTable doc={invoice} caption={`Invoice ${invoice.number}`} />
      <div className="mt-4" aria-live="polite">
        {invoice.status === 'paid' && (
          <p className="font-semibold text-ok">
            Paid {formatMoney(invoice.paidCents, invoice.currency)}
            {invoice.paidAt ? ` on ${new Date(invoice.paidAt).toLocaleDateString()}` : ''}. Thank you.
          </p>
        )}
        {invoice.status === 'issued' && returning && <p role="status">Confirming your payment with the payment service…</p>}
        {invoice.status === 'issued' && !returning && (
          <Button disabled={checkout.isPending} onClick={() => checkout.mutate(invoice.id)}>
            Pay {formatMoney(invoice.totalCents, invoice.currency)}
          </Button>
        )}
        {checkout.isError && (
          <p role="alert" className="mt-2 text-high">
            {checkout.error.message}
          </p>
        )}
      </div>
    </section>
  );
}

/** The customer's page for one job, reached from an e-mailed link; no sign-in. */
export default function CustomerPage() {
  const { token = '' } = useParams();
  const [search] = useSearchParams();
  const returning = search.has('paid');
  const job = usePublicJob(token, returning);

  if (job.isPending) return <p className="p-6">Loading…</p>;
  if (job.isError) {
    if (job.error instanceof ApiError && job.error.status === 404) return <LinkNoLongerValid />;
    return (
      <p role="alert" className="p-6 text-high">
        The page could not be loaded: {job.error.message}
      </p>
    );
  }
  const d = job.data;
  return (
    <div className="min-h-full bg-stone-100">
      <header className="flex flex-wrap items-center gap-x-4 gap-y-2 bg-board px-4 py-3 text-white">
        {/* the logo on a white ground: it is drawn for paper, as on the report PDF */}
        {d.shop.hasLogo && (
          <img
            src={`/api/public/links/${encodeURIComponent(token)}/logo`}
            alt={`${d.shop.name} logo`}
            className="h-14 max-w-48 rounded bg-white object-contain p-1"
          />
        )}
        <div>
          <p className="text-lg font-semibold">{d.shop.name}</p>
          {shopCardLines(d.shop).length > 0 && <p className="text-sm text-white/85">{shopCardLines(d.shop).join(' · ')}</p>}
        </div>
      </header>
      <main className="mx-auto flex max-w-2xl flex-col gap-4 p-4">
        <div>
          <h1 className="text-2xl font-semibold">
            {d.reference}: {d.board}
          </h1>
          <p>
            For {d.customerName}. Status: <strong>{d.statusLabel}</strong>
          </p>
        </div>
        {d.reportAvailable && (
          <p>
            <a className="font-semibold text-board underline" href={`/api/public/links/${encodeURIComponent(token)}/report.pdf`}>
              Download the repair report (PDF)
            </a>
          </p>
        )}
        {d.invoices.map((i) => (
          <InvoiceCard key={i.id} token={token} invoice={i} returning={returning} />
        ))}
        {[...d.quotes].reverse().map((q, i, newestFirst) => (
          <QuoteCard key={q.id} token={token} quote={q} replacedBy={i > 0 ? newestFirst[0]!.number : null} />
        ))}
        {!d.quotes.length && !d.invoices.length && <p>Nothing to approve or pay yet; we will e-mail you when there is.</p>}
        <p className="text-sm text-stone-700">This page shows only this job. The link works until {new Date(d.expiresAt).toLocaleDateString()}.</p>
      </main>
    </div>
  );
}
