import { centsToDecimal, parseMoney, type BinPart } from '@splitscope/contract';
import { useState } from 'react';
import { PageHeader } from '@/components/ui/page-header';
import { QueryState } from '@/components/ui/query-state';
import { usePartsBin, useStockBinPart, useUpdateBinPart } from '@/lib/api/parts-bin';
import { FormFooter } from '@/components/ui/form-footer';
import { TableHead } from '@/components/ui/table-head';

const field = 'mt-1 block min-h-11 w-full rounded-md border border-stone-500 bg-white px-3';
const EMPTY = { value: '', package: '', rating: '', marking: '', quantity: '', drawer: '', minimum: '', price: '' };

/** A new drawer: the value is parsed by the server with the reading field's parser ("4k7", "100uF", "1.2 MΩ"). */
function StockForm() {
  const stock = useStockBinPart();
  const [f, setF] = useState(EMPTY);
  const [error, setError] = useState<string | null>(null);
  const set = (k: keyof typeof EMPTY) => (e: React.ChangeEvent<HTMLInputElement>) => setF({ ...f, [k]: e.target.value });
  const submit = (e: React.FormEvent) => {
    e.preventDefault();
    setError(null);
    const quantity = Number(f.quantity);
    const minimum = Number(f.minimum || '0');
    if (!Number.isInteger(quantity) || quantity < 0) return setError('Quantity: a whole number, 0 or more');
    if (!Number.isInteger(minimum) || minimum < 0) return setError('Minimum: a whole number, 0 or more');
    let unitCents: number;
    try {
      unitCents = f.price.trim() ? parseMoney(f.price) : 0;
    } catch (err) {
      return setError(`Price: ${(err as Error).message}`);
    }
    stock.mutate(
      { value: f.value, package: f.package, rating: f.rating, marking: f.marking, quantity, drawer: f.drawer, minimum, unitCents },
      { onSuccess: () => setF(EMPTY) },
    );
  };
  const input = (k: keyof typeof EMPTY, label: string, extra: React.InputHTMLAttributes<HTMLInputElement> = {}) => (
    <label className="block">
      <span className="text-sm font-medium">{label}</span>
      <input className={field} value={f[k]} onChange={set(k)} autoComplete="off" {...extra} />
    </label>
  );
  return (
    <form onSubmit={submit} noValidate aria-labelledby="stock-h" className="grid gap-3 rounded-lg border border-stone-300 bg-white p-3 sm:grid-cols-4">
      <h2 id="stock-h" className="text-lg font-semibold sm:col-span-4">
        Stock a drawer
      </h2>
      {input('value', 'Value', { placeholder: 'e.g. 4k7, 100uF, 1N4148' })}
      {input('package', 'Package', { placeholder: 'e.g. 0805, radial 8×12' })}
      {input('rating', 'Rating (optional)', { placeholder: 'e.g. 50 V, 0.25 W' })}
      {input('marking', 'Marking (optional)')}
      {input('drawer', 'Drawer')}
      {input('quantity', 'Quantity', { inputMode: 'numeric' })}
      {input('minimum', 'Reorder under', { inputMode: 'numeric' })}
      {input('price', 'Price each', { inputMode: 'decimal' })}
      <FormFooter error={error ?? stock.error?.message} pending={stock.isPending} label="Add to the bin" span="sm:col-span-4" />
    </form>
  );
}

function Restock({ part }: { part: BinPart }) {
  const update = useUpdateBinPart();
  const [qty, setQty] = useState(String(part.quantity));
  return (
    <form
      className="flex items-center gap-1"
      onSubmit={(e) => {
        e.preventDefault();
        const quantity = Number(qty);
        if (Number.isInteger(quantity) && quantity >= 0) update.mutate({ id: part.id, quantity });
      }}
    >
      <input
        aria-label={`Quantity in drawer ${part.drawer} (${part.value} ${part.package})`}
        className="min-h-11 w-20 rounded-md border border-stone-500 px-2"
        inputMode="numeric"
        value={qty}
        onChange={(e) => setQty(e.target.value)}
      />
      <button type="submit" className="min-h-11 rounded-md border border-board px-2 text-sm text-board">
        Set
      </button>
      {update.error && <span className="text-sm text-high">{update.error.message}</span>}
    </form>
  );
}

function BinTable({ items, caption, editable }: { items: BinPart[]; caption: string; editable: boolean }) {
  return (
    <div className="overflow-x-auto rounded-lg border border-stone-300 bg-white">
      <table className="w-full text-left text-sm">
        <caption className="p-2 text-left font-semibold">{caption}</caption>
        <TableHead columns={['Drawer', 'Value', 'Package', 'Rating', 'Marking', 'In stock', 'Reorder under', 'Price each']} />
        <tbody>
          {items.map((p) => (
            <tr key={p.id} className={`border-b border-stone-200 ${p.reorder ? 'bg-amber-50' : ''}`}>
              <td className="px-2 py-1 font-mono">{p.drawer}</td>
              <td className="px-2 py-1 font-semibold">{p.value}</td>
              <td className="px-2 py-1">{p.package}</td>
              <td className="px-2 py-1">{p.rating ?? '—'}</td>
              <td className="px-2 py-1">{p.marking ?? '—'}</td>
              <td className="px-2 py-1">
                {editable ? <Restock key={p.quantity} part={p} /> : p.quantity}
                {p.reorder && <span className="block text-xs font-semibold">under the minimum</span>}
              </td>
              <td className="px-2 py-1">{p.minimum}</td>
              <td className="px-2 py-1">{centsToDecimal(p.unitCents)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** The parts bin: drawers of replacement parts, the reorder list first. */
function PartsBinPage() {
  const bin = usePartsBin();
  return (
    <section className="max-w-6xl space-y-4">
      <PageHeader title="Parts bin" />
      <QueryState query={bin} label="the parts bin">
        {(b) => {
          const reorder = b.items.filter((p) => p.reorder);
          return (
            <>
              <section aria-label="Reorder list">
                {reorder.length ? (
                  <BinTable
                    items={reorder}
                    caption={`Reorder list: ${reorder.length} ${reorder.length === 1 ? 'drawer' : 'drawers'} under the minimum`}
                    editable={false}
                  />
                ) : (
                  <p className="rounded-md border border-stone-300 bg-white p-2 text-sm">Reorder list: every drawer is at or above its minimum.</p>
                )}
              </section>
              <StockForm />
              {b.items.length ? <BinTable items={b.items} caption="All drawers" editable /> : <p className="text-sm text-stone-700">The bin is empty.</p>}
            </>
          );
        }}
      </QueryState>
    </section>
  );
}

export default PartsBinPage;
