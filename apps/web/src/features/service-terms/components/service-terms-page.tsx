import { centsToDecimal, parseMoney, type ServiceTerms } from '@splitscope/contract';
import { useState } from 'react';
import { PageHeader } from '@/components/ui/page-header';
import { QueryState } from '@/components/ui/query-state';
import { useServiceTerms, useUpdateServiceTerms } from '@/lib/api/service-terms';

const field = 'mt-1 block min-h-11 w-full rounded-md border border-stone-500 bg-white px-3';

function TermsForm({ terms }: { terms: ServiceTerms }) {
  const update = useUpdateServiceTerms();
  const [warranty, setWarranty] = useState(String(terms.warrantyDays));
  const [rate, setRate] = useState(centsToDecimal(terms.labourRateCents));
  const [minutes, setMinutes] = useState(String(terms.repairMinutes));
  const [error, setError] = useState<string | null>(null);
  const save = (e: React.FormEvent) => {
    e.preventDefault();
    setError(null);
    let labourRateCents: number;
    try {
      labourRateCents = parseMoney(rate);
    } catch (err) {
      setError(`Labour rate: ${(err as Error).message}`);
      return;
    }
    const warrantyDays = Number(warranty);
    const repairMinutes = Number(minutes);
    if (!Number.isInteger(warrantyDays) || warrantyDays < 0) return setError('Warranty: whole days, 0 or more');
    if (!Number.isInteger(repairMinutes) || repairMinutes < 1) return setError('Bench time: whole minutes, 1 or more');
    update.mutate({ warrantyDays, labourRateCents, repairMinutes });
  };
  return (
    <form onSubmit={save} noValidate className="max-w-2xl space-y-4 rounded-lg border border-stone-300 bg-white p-4">
      <label className="block">
        <span className="font-medium">Warranty on a repair (days)</span>
        <input type="number" min={0} className={field} value={warranty} onChange={(e) => setWarranty(e.target.value)} />
        <span className="text-sm text-stone-700">A board back within this many days of leaving is flagged as a warranty return at intake and on its job.</span>
      </label>
      <label className="block">
        <span className="font-medium">Labour rate per hour</span>
        <input inputMode="decimal" className={field} value={rate} onChange={(e) => setRate(e.target.value)} />
      </label>
      <label className="block">
        <span className="font-medium">Bench time quoted per repair (minutes)</span>
        <input type="number" min={1} className={field} value={minutes} onChange={(e) => setMinutes(e.target.value)} />
        <span className="text-sm text-stone-700">A quote made from the parts used starts with this much labour; change it on the quote.</span>
      </label>
      <div aria-live="polite">
        {(error ?? update.error) && (
          <p role="alert" className="text-sm text-high">
            {error ?? update.error?.message}
          </p>
        )}
        {update.isSuccess && !error && <p className="text-sm">Saved.</p>}
      </div>
      <button type="submit" disabled={update.isPending} className="min-h-11 rounded-md bg-board px-6 font-semibold text-white">
        {update.isPending ? 'Saving…' : 'Save the terms'}
      </button>
    </form>
  );
}

/** Admin: the shop's warranty days and labour rate. */
function ServiceTermsPage() {
  const terms = useServiceTerms();
  return (
    <section>
      <PageHeader title="Warranty and labour" />
      <QueryState query={terms} label="the shop's terms">
        {(t) => <TermsForm terms={t} />}
      </QueryState>
    </section>
  );
}

export default ServiceTermsPage;
