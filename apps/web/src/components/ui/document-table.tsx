import { formatMoney, type BillingLine } from '@splitscope/contract';

interface Doc {
  currency: string;
  lines: BillingLine[];
  subtotalCents: number;
  taxCents: number;
  taxRate: string;
  totalCents: number;
}

/** The lines and totals of a quote or an invoice, as computed by the server. */
export function DocumentTable({ doc, caption }: { doc: Doc; caption: string }) {
  const m = (c: number) => formatMoney(c, doc.currency);
  return (
    <table className="w-full border-collapse text-left">
      <caption className="sr-only">{caption}</caption>
      <thead>
        <tr className="border-b border-stone-300 text-sm text-stone-700">
          <th scope="col" className="py-1 pr-2 font-semibold">
            Item
          </th>
          <th scope="col" className="py-1 pr-2 text-right font-semibold">
            Qty
          </th>
          <th scope="col" className="py-1 text-right font-semibold">
            Amount
          </th>
        </tr>
      </thead>
      <tbody>
        {doc.lines.map((l) => (
          <tr key={l.id} className="border-b border-stone-200">
            <td className="py-1 pr-2">
              {l.description}
              {!l.taxable && <span className="ml-2 text-sm text-stone-600">(no tax)</span>}
            </td>
            <td className="py-1 pr-2 text-right tabular-nums">{l.quantity}</td>
            <td className="py-1 text-right tabular-nums">{m(l.amountCents)}</td>
          </tr>
        ))}
      </tbody>
      <tfoot className="tabular-nums">
        <tr>
          <th scope="row" colSpan={2} className="pt-2 pr-2 text-right font-normal">
            Subtotal
          </th>
          <td className="pt-2 text-right">{m(doc.subtotalCents)}</td>
        </tr>
        <tr>
          <th scope="row" colSpan={2} className="pr-2 text-right font-normal">
            Tax ({doc.taxRate} %)
          </th>
          <td className="text-right">{m(doc.taxCents)}</td>
        </tr>
        <tr className="text-lg">
          <th scope="row" colSpan={2} className="pr-2 text-right">
            Total
          </th>
          <td className="text-right font-semibold">{m(doc.totalCents)}</td>
        </tr>
      </tfoot>
    </table>
  );
}
