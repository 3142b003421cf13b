import { MARKER, type MarkerState } from '@/lib/map-geometry';

export interface ChainLink {
  id: string;
  label: string;
  section: string;
  unit: string;
  /** The engine's expected value and band for a healthy board. */
  nominal: number;
  low: number;
  high: number;
  measured?: number | 'OL' | null;
  state: MarkerState;
}

const W = 640;
const H = 220;
const TOP = 20;
const BOTTOM = 170;
/** The value axis and its title sit left of the first link, never over its band. */
const LEFT = 58;
const MAX_RATIO = 1.5;
/** About the width of one character of the axis font (px per px of font size), to cut names to their slot. */
const CHAR = 0.6;

/** Text cut to what fits `px` at `size`, with an ellipsis; the full text is in the table below and the tooltip. */
const fit = (text: string, px: number, size: number) => {
  const max = Math.max(2, Math.floor(px / (size * CHAR)));
  return text.length <= max ? text : `${text.slice(0, max - 1)}…`;
};

const y = (ratio: number) => BOTTOM - (Math.min(MAX_RATIO, Math.max(0, ratio)) / MAX_RATIO) * (BOTTOM - TOP);
const fmt = (v: number, unit: string) => `${Math.abs(v) >= 100 ? v.toFixed(0) : v.toPrecision(3)} ${unit}`;

/**
 * The section chain from the bus to the speed feedback. Each link is drawn against its own expected value (100 %),
 * so a 300 V bus and a 5 V feedback share one axis and the link where the voltage stops stands out.
 */
export function SignalChain({ links }: { links: ChainLink[] }) {
  if (links.length === 0) return <p className="text-sm text-stone-700">This board has no signal chain defined.</p>;
  const step = (W - LEFT) / links.length;
  const xOf = (i: number) => LEFT + step * i + step / 2;
  const measuredPts = links
    .map((l, i) => (typeof l.measured === 'number' && l.nominal !== 0 ? `${xOf(i)},${y(l.measured / l.nominal)}` : null))
    .filter(Boolean)
    .join(' ');
  return (
    <figure className="space-y-2">
      <svg viewBox={`0 0 ${W} ${H}`} className="w-full rounded-md border border-stone-300 bg-white" role="img" aria-labelledby="chain-cap">
        <text transform={`translate(12,${(TOP + BOTTOM) / 2}) rotate(-90)`} fontSize={10} textAnchor="middle" fill="#374151">
          of the healthy value
        </text>
        {[0, 0.5, 1, 1.5].map((r) => (
          <g key={r}>
            <line x1={LEFT} x2={W} y1={y(r)} y2={y(r)} stroke={r === 1 ? '#6b7280' : '#e5e7eb'} strokeDasharray={r === 1 ? '4 3' : undefined} />
            <text x={LEFT - 4} y={y(r) + 3} fontSize={10} textAnchor="end" fill="#374151">
              {r * 100} %
            </text>
          </g>
        ))}
        {links.map((l, i) => {
          const cx = xOf(i);
          // The point's id ("TP5") on the axis, its section under it, each cut to the link's slot.
          const [id = l.label, ...name] = l.label.split(' ');
          const lo = l.nominal ? l.low / l.nominal : 0;
          const hi = l.nominal ? l.high / l.nominal : 0;
          const m = MARKER[l.state];
          const my = typeof l.measured === 'number' && l.nominal ? y(l.measured / l.nominal) : null;
          return (
            <g key={l.id}>
              <rect
                x={cx - step * 0.3}
                width={step * 0.6}
                y={y(Math.max(lo, hi))}
                height={Math.max(2, y(Math.min(lo, hi)) - y(Math.max(lo, hi)))}
                fill="#cfe6dc"
                stroke="#1d6b3a"
              />
              {my !== null && (
                <g transform={`translate(${cx},${my})`}>
                  <circle r={8} fill="#fff" stroke={m.colour} strokeWidth={2.5} />
                  {m.shape === 'down' && <path d="M-5 -3.5 5 -3.5 0 5z" fill={m.colour} />}
                  {m.shape === 'up' && <path d="M-5 3.5 5 3.5 0 -5z" fill={m.colour} />}
                  {m.shape === 'check' && <path d="M-4 0-.7 3.5 4.5-3.5" fill="none" stroke={m.colour} strokeWidth={2} />}
                </g>
              )}
              <text x={cx} y={BOTTOM + 18} fontSize={11} textAnchor="middle" fill="#14201f" fontWeight={600}>
                <title>{l.label}</title>
                {fit(id, step - 4, 11)}
              </text>
              <text x={cx} y={BOTTOM + 32} fontSize={10} textAnchor="middle" fill="#374151">
                <title>{[name.join(' '), l.section].filter(Boolean).join(' · ')}</title>
                {fit(name.join(' ') || l.section, step - 4, 10)}
              </text>
            </g>
          );
        })}
        {measuredPts && <polyline points={measuredPts} fill="none" stroke="#b8742a" strokeWidth={2} strokeDasharray="5 3" />}
      </svg>
      <figcaption id="chain-cap" className="text-sm text-stone-700">
        Signal chain, bus first: each test point against its own healthy value (100 %). The green band is what the engine expects on a healthy board; markers
        are your readings.
      </figcaption>
      <table className="w-full text-sm">
        <caption className="sr-only">Signal chain readings</caption>
        <thead>
          <tr className="text-left">
            <th className="py-1">Point</th>
            <th>Section</th>
            <th>Expected band</th>
            <th>Measured</th>
            <th>Verdict</th>
          </tr>
        </thead>
        <tbody>
          {links.map((l) => (
            <tr key={l.id} className="border-t border-stone-200">
              <td className="py-1 font-semibold">{l.label}</td>
              <td>{l.section}</td>
              <td className="tabular-nums">
                {fmt(l.low, l.unit)} – {fmt(l.high, l.unit)}
              </td>
              <td className="font-mono">{l.measured === undefined || l.measured === null ? '—' : l.measured === 'OL' ? 'OL' : fmt(l.measured, l.unit)}</td>
              <td>{MARKER[l.state].label}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </figure>
  );
}
