import { formatMoney, shopStatsResponse, type ShopStats } from '@splitscope/contract';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { useMemo, type ReactNode } from 'react';
import { PageHeader } from '@/components/ui/page-header';
import { QueryState } from '@/components/ui/query-state';
import { api } from '@/lib/api-client';
import { BarChart } from './bar-chart';
import { TableHead } from '@/components/ui/table-head';

const useShopStats = () => useQuery(queryOptions({ queryKey: ['stats'], queryFn: () => api('/stats', { schema: shopStatsResponse }) }));

function Figure({ title, chart, children }: { title: string; chart: ReactNode; children: ReactNode }) {
  return (
    <section aria-label={title} className="min-w-0 space-y-2 rounded-lg border border-stone-300 bg-white p-3">
      <h2 className="text-lg font-semibold">{title}</h2>
      {chart}
      <div className="overflow-x-auto">{children}</div>
    </section>
  );
}

function Table({ head, rows, caption }: { head: string[]; rows: (string | number)[][]; caption: string }) {
  return (
    <table className="w-full text-left text-sm">
      <caption className="sr-only">{caption}</caption>
      <TableHead columns={head} />
      <tbody>
        {rows.length ? (
          rows.map((r) => (
            <tr key={r.join('|')} className="border-b border-stone-200">
              {r.map((c, i) => (
                <td key={i} className={`px-2 py-1 ${typeof c === 'number' ? 'tabular-nums' : ''}`}>
                  {c}
                </td>
              ))}
            </tr>
          ))
        ) : (
          <tr>
            <td colSpan={head.length} className="px-2 py-1 text-stone-700">
              None yet.
            </td>
          </tr>
        )}
      </tbody>
    </table>
  );
}

function Stats({ s }: { s: ShopStats }) {
  const charts = useMemo(() => {
    const top = s.failuresByPart.slice(0, 12);
    return {
      parts: { labels: top.map((f) => `${f.part} · ${f.boardName}`), series: [{ label: 'boards', data: top.map((f) => f.count) }] },
      time: { labels: s.intakeToVerified.map((t) => t.boardName), series: [{ label: 'median hours', data: s.intakeToVerified.map((t) => t.medianHours) }] },
      money: {
        labels: s.money.map((m) => m.month),
        series: [
          { label: 'quoted', data: s.money.map((m) => m.quotedCents / 100) },
          { label: 'invoiced', data: s.money.map((m) => m.invoicedCents / 100) },
          { label: 'paid', data: s.money.map((m) => m.paidCents / 100) },
        ],
      },
    };
  }, [s]);
  const rate = s.firstTimeFix.total ? Math.round((100 * s.firstTimeFix.fixed) / s.firstTimeFix.total) : null;
  const money = (c: number) => formatMoney(c, s.currency);
  return (
    <div className="grid gap-4 xl:grid-cols-2">
      <Figure title="Failures by part and board model" chart={<BarChart horizontal {...charts.parts} />}>
        <Table
          caption="Failures by part"
          head={['Board model', 'Part replaced', 'Boards']}
          rows={s.failuresByPart.map((f) => [f.boardName, f.part, f.count])}
        />
      </Figure>
      <Figure title="Intake to verification readings" chart={<BarChart {...charts.time} />}>
        <Table
          caption="Intake to verification"
          head={['Board model', 'Signed-off jobs', 'Median hours', 'Longest hours']}
          rows={s.intakeToVerified.map((t) => [t.boardName, t.jobs, t.medianHours, t.longestHours])}
        />
      </Figure>
      <Figure
        title="First-time fix and repeat returns"
        chart={
          <p className="text-3xl font-semibold">
            {rate === null ? '—' : `${rate} %`}
            <span className="ml-2 text-base font-normal text-stone-700">
              {s.firstTimeFix.fixed} of {s.firstTimeFix.total} signed-off boards with a serial did not come back within {s.firstTimeFix.warrantyDays} days
            </span>
          </p>
        }
      >
        <Table
          caption="Repeat returns"
          head={['Job', 'Back after job', 'Board serial', 'Board model', 'Days between']}
          rows={s.repeatReturns.map((r) => [`#${r.jobNumber}`, `#${r.earlierJobNumber}`, r.serial, r.boardName, r.daysSince])}
        />
      </Figure>
      <Figure title="Money: quoted, invoiced, paid" chart={<BarChart {...charts.money} />}>
        <Table
          caption="Money by month"
          head={['Month', 'Quoted', 'Invoiced', 'Paid']}
          rows={s.money.map((m) => [m.month, money(m.quotedCents), money(m.invoicedCents), money(m.paidCents)])}
        />
      </Figure>
    </div>
  );
}

/** The lead's statistics: what fails, how long boards take, what comes back, and the money. */
function StatsPage() {
  const stats = useShopStats();
  return (
    <section className="space-y-3">
      <PageHeader title="Shop statistics" />
      <QueryState query={stats} label="the statistics">
        {(s) => <Stats s={s} />}
      </QueryState>
    </section>
  );
}

export default StatsPage;
