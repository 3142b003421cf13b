import { acceptsReadings, type ExpectedReadingRow, type JobDetail, type StoredReading } from '@splitscope/contract';
import { useEffect, useMemo, useState } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { BoardMap } from '@/components/board-map/board-map';
import { Button } from '@/components/ui/button';
import { QueryState } from '@/components/ui/query-state';
import { StatusBadge } from '@/components/ui/status-badge';
import { useMe } from '@/lib/api/me';
import { useDiagnosis } from '@/lib/api/get-diagnosis';
import { useJob } from '@/lib/api/get-job';
import { useReadings } from '@/lib/api/get-readings';
import { useUpdateJob } from '@/lib/api/update-job';
import { METER_LABEL, meterText } from '@/lib/format';
import { useReadingSender } from '@/lib/use-reading-sender';
import {
  currentReadings,
  expectedFor,
  latestFor,
  nextTests,
  pointState,
  rankedParts,
  rowsForPoint,
  sameTarget,
  stateOf,
  type Target,
} from '../lib/bench-model';
import { boardView, type BoardView } from '@/lib/board/board-view';
import { gateFigures } from '@/lib/board/gate-figures';
import { gateRefusalFor, touchesBus } from '@/lib/board/gate';
import { parseTyped, preloadReadingParser } from '@/lib/parse-reading';
import { GuidedOrder } from './guided-order';
import { GuidedSwitch } from './guided-switch';
import { PointList } from './point-list';
import { RankingPanel } from './ranking-panel';
import { ReadingPanel, type LatestReading } from './reading-panel';
import { SafetyGate } from '@/components/safety-gate';
import { SignalChain, type ChainLink } from './signal-chain';
import { UnsentList } from './unsent-list';

function chainLinks(view: BoardView, rows: ExpectedReadingRow[], readings: StoredReading[]): ChainLink[] {
  // The chain is the powered DC-volt rows in board order (the board model lists them bus first).
  return rows
    .filter((r) => r.mode === 'dcv' && r.power === 'on' && typeof r.expected === 'number' && r.low !== null && r.high !== null && r.lifted.length === 0)
    .map((r) => {
      const latest = latestFor(view, readings, r);
      const p = view.pointOf(r.red);
      return {
        id: r.id,
        label: r.label ?? p?.label ?? r.red,
        section: view.sections.find((s) => s.id === p?.section)?.name ?? p?.section ?? '',
        unit: r.unit,
        nominal: r.expected as number,
        low: r.low ?? 0,
        high: r.high ?? 0,
        measured: latest?.value ?? null,
        state: latest ? stateOf(latest.verdict?.verdict) : 'unmeasured',
      };
    });
}

function Bench({ job }: { job: JobDetail }) {
  const me = useMe();
  const [params, setParams] = useSearchParams();
  // Guided order binds a trainee (the server refuses anything else) until a lead lifts it for the job.
  const guided = job.guidedOrderRequired || params.get('mode') === 'guided' || (params.get('mode') === null && me.data?.role === 'trainee');
  const tab = params.get('tab') === 'chain' ? 'chain' : 'map';
  const view = useMemo(() => boardView(job.board.document), [job.board.document]);
  const rows = job.board.expectedReadings;
  const readingsQ = useReadings(job.id);
  const diagnosisQ = useDiagnosis(job.id);
  const sender = useReadingSender(job.id);
  const update = useUpdateJob(job.id);
  const [target, setTarget] = useState<(Target & { pointId?: string }) | null>(null);
  const [selectedPart, setSelectedPart] = useState<string | null>(null);
  const [entryError, setEntryError] = useState<string | null>(null);
  // The bus voltage typed at the safety gate; null until the gate is passed for this unplugged spell.
  const [gateVolts, setGateVolts] = useState<number | null>(null);
  const [gateRefusal, setGateRefusal] = useState<string | null>(null);

  const readings = useMemo(() => currentReadings(readingsQ.data?.items ?? []), [readingsQ.data]);
  const steps = useMemo(() => (diagnosisQ.data ? nextTests(view, diagnosisQ.data) : []), [view, diagnosisQ.data]);
  const ranked = useMemo(() => (diagnosisQ.data ? rankedParts(view, diagnosisQ.data) : []), [view, diagnosisQ.data]);
  const step = steps[0];
  const active: (Target & { pointId?: string }) | null = guided ? (step ? { ...step.target, pointId: step.pointId } : null) : target;
  const canWrite = acceptsReadings(job.status, 'diagnosis');
  const needsGate = !!active && active.power === 'off' && touchesBus(view, active) && gateVolts === null;

  const points = view.points.map((p) => ({ ...p, ...pointState(view, readings, p.net) }));
  const selectPoint = (id: string) => {
    if (guided) return;
    const choices = rowsForPoint(view, rows, id);
    const p = view.pointOf(id)!;
    const row = choices.find((r) => r.power === 'on') ?? choices[0];
    setTarget(row ? { mode: row.mode, red: row.red, black: row.black, power: row.power, lifted: row.lifted, pointId: id } : { mode: 'dcv', red: p.id, black: '0', power: 'on', lifted: [], pointId: id });
    setEntryError(null);
  };

  const save = async (text: string) => {
    if (!active) return false;
    const parsed = await parseTyped(text, active.mode);
    if (!parsed.ok) {
      setEntryError(parsed.error);
      return false;
    }
    setEntryError(null);
    const { pointId: _p, ...probe } = active;
    if (active.power === 'on') setGateVolts(null); // the board was powered again: the next unpowered step gates again
    const safetyCheck = active.power === 'off' && gateVolts !== null ? { safetyCheck: { unplugged: true as const, busVolts: gateVolts } } : {};
    // The contract's gate rule, the one the server applies: refused here, the gate opens again with the reason
    // and the typed value stays in the field.
    const refusal = gateRefusalFor(view, { ...probe, ...safetyCheck });
    if (refusal) {
      setGateVolts(null);
      setGateRefusal(refusal);
      return false;
    }
    await sender.save({ ...probe, value: parsed.value, ...(parsed.beep !== undefined ? { beep: parsed.beep } : {}), raw: text.trim(), phase: 'diagnosis', ...safetyCheck });
    return true;
  };

  const latest: LatestReading | null = (() => {
    if (!active) return null;
    const unsent = [...sender.unsent].reverse().find((u) => sameTarget(view, u.body as Target, active));
    if (unsent) return { text: unsent.body.raw, state: 'unsent' };
    const r = latestFor(view, readings, active);
    if (!r) return null;
    return {
      text: meterText(r.value, r.unit),
      state: stateOf(r.verdict?.verdict),
      detail: r.verdict ? `expected ${meterText(r.verdict.low, r.verdict.unit)} – ${meterText(r.verdict.high, r.verdict.unit)}` : 'no expected value for this test',
    };
  })();

  const expectedRow = active ? expectedFor(view, rows, active) : undefined;
  const panelTarget = active && {
    pointId: `${active.red}|${active.black}|${active.mode}|${active.power}`,
    pointLabel: view.netLabel(active.red),
    meter: active.mode,
    power: active.power,
    red: { label: view.netLabel(active.red) },
    black: { label: view.netLabel(active.black) },
    expected: expectedRow
      ? {
          text: meterText(expectedRow.expected, expectedRow.unit),
          band: `${meterText(expectedRow.low, expectedRow.unit)} – ${meterText(expectedRow.high, expectedRow.unit)}`,
          note: expectedRow.note,
          source: expectedRow.source,
        }
      : null,
  };
  const choices = !guided && target?.pointId ? rowsForPoint(view, rows, target.pointId) : [];
  const top = ranked[0];
  const propose = async (part: string) => {
    if (job.status === 'received') await update.mutateAsync({ status: 'diagnosing' });
    await update.mutateAsync({ status: 'awaiting-review', proposedPart: part });
  };

  const checkBus = async (t: string): Promise<{ ok: true; volts: number } | { ok: false; message: string }> => {
    const r = await parseTyped(t, 'dcv');
    if (!r.ok) return { ok: false, message: r.error };
    if (r.value === 'OL') return { ok: false, message: 'OL is not a bus voltage: set the meter to DC volts and measure again.' };
    return { ok: true, volts: r.value };
  };
  const passGate = (v: number) => {
    setGateRefusal(null);
    setGateVolts(v);
  };
  const safetyGate = <SafetyGate figures={gateFigures(view, rows)} check={checkBus} onPass={passGate} refusal={gateRefusal} />;

  const probeNets = active ? { red: view.pointOf(active.red)?.net ?? active.red, black: view.pointOf(active.black)?.net ?? active.black } : undefined;

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <div>
          <h1 className="text-2xl font-semibold">
            Job #{job.number} · {job.boardName}
          </h1>
          <p className="text-sm text-stone-700">
            {job.customerName} · {job.unitDescription} · {job.faultCode ? `code ${job.faultCode} · ` : ''}
            {job.symptom} · <StatusBadge status={job.status} sentBack={job.sentBack} />
          </p>
        </div>
        <div className="flex flex-wrap gap-2">
          <GuidedSwitch job={job} guided={guided} onToggle={() => setParams((p) => (p.set('mode', guided ? 'free' : 'guided'), p))} />
          <Button variant="secondary" onClick={() => setParams((p) => (p.set('tab', tab === 'map' ? 'chain' : 'map'), p))}>
            {tab === 'map' ? 'Signal chain' : 'Board map'}
          </Button>
          {['approved', 'repaired', 'verified', 'returned'].includes(job.status) && (
            <Link className="inline-flex min-h-11 items-center rounded-md border border-stone-400 bg-white px-4 font-semibold" to={`/jobs/${job.id}/repair`}>
              Repair and verification
            </Link>
          )}
          <Link className="inline-flex min-h-11 items-center rounded-md border border-stone-400 bg-white px-4 font-semibold" to={`/jobs/${job.id}/report`}>
            Report
          </Link>
          <Link className="inline-flex min-h-11 items-center rounded-md border border-stone-400 bg-white px-4 font-semibold" to={`/jobs/${job.id}/billing`}>
            Quote and invoice
          </Link>
        </div>
      </div>
      {job.sentBack && job.reviews.at(-1)?.decision === 'send-back' && (
        <p role="note" className="rounded-md border border-amber-600 bg-amber-50 p-2 text-sm">
          Sent back by {job.reviews.at(-1)!.reviewerName}: “{job.reviews.at(-1)!.comment}”
        </p>
      )}
      <UnsentBlock sender={sender} />
      <div className="grid gap-3 lg:grid-cols-[minmax(0,1fr)_24rem]">
        <div className="space-y-3">
          {tab === 'map' ? (
            <div className="h-[52vh] min-h-80">
              <BoardMap
                pictureUrl={view.pictureUrl}
                size={view.size}
                points={points}
                parts={view.parts}
                connectors={view.connectors}
                selectedId={active?.pointId ?? null}
                probes={probeNets}
                highlightPart={selectedPart}
                onSelect={selectPoint}
              />
            </div>
          ) : (
            <SignalChain links={chainLinks(view, rows, readings)} />
          )}
          {!guided && (
            <PointList
              items={points.map((p) => ({ id: p.id, label: p.label, section: view.sections.find((s) => s.id === p.section)?.name ?? p.section, state: p.state, reading: p.reading ? meterText(p.reading.value, p.reading.unit) : undefined }))}
              selectedId={target?.pointId}
              onSelect={selectPoint}
            />
          )}
        </div>
        <div className="space-y-3">
          {readingsQ.isError && <p role="alert" className="text-high">Readings could not be loaded: {readingsQ.error.message}</p>}
          {guided ? (
            <GuidedOrder view={view} step={step} done={readings}>
              {diagnosisQ.isPending && <p role="status">Asking the engine for the next step…</p>}
              {needsGate && safetyGate}
              {!needsGate && panelTarget && canWrite && (
                <ReadingPanel target={panelTarget} latest={latest} onSave={save} error={entryError} />
              )}
            </GuidedOrder>
          ) : (
            <>
              {panelTarget ? (
                <>
                  {choices.length > 1 && (
                    <fieldset className="flex flex-wrap gap-1">
                      <legend className="text-sm font-medium">Test at this point</legend>
                      {choices.map((r) => (
                        <button
                          key={r.id}
                          type="button"
                          aria-pressed={!!target && sameTarget(view, r, target)}
                          onClick={() => setTarget({ mode: r.mode, red: r.red, black: r.black, power: r.power, lifted: r.lifted, pointId: target?.pointId })}
                          className="min-h-11 rounded-md border border-stone-400 bg-white px-2 text-sm aria-pressed:border-copper aria-pressed:bg-amber-50 aria-pressed:font-semibold"
                        >
                          {/* The point is already chosen: what tells these apart is the meter function and the power state. */}
                          {METER_LABEL[r.mode]} · {r.power === 'on' ? 'powered' : 'unplugged'}
                          {r.lifted.length > 0 ? ` · ${r.lifted.join(', ')} lifted` : ''}
                        </button>
                      ))}
                    </fieldset>
                  )}
                  {needsGate && safetyGate}
                  {canWrite && !needsGate && <ReadingPanel target={panelTarget} latest={latest} onSave={save} error={entryError} />}
                  {!canWrite && <p className="rounded-md bg-board-light p-2 text-sm">This job is {job.status}: diagnosis readings are closed.</p>}
                </>
              ) : (
                <p className="rounded-md bg-board-light p-3 text-sm">Pick a test point on the map or in the list, or a next test below.</p>
              )}
              <QueryState query={diagnosisQ} label="the ranking">
                {() => (
                  <RankingPanel
                    parts={ranked}
                    nextTests={steps}
                    selectedPart={selectedPart}
                    onPickPart={(p) => setSelectedPart((s) => (s === p ? null : p))}
                    onPickTest={(t) => setTarget({ ...(t as (typeof steps)[number]).target, pointId: t.pointId })}
                  />
                )}
              </QueryState>
              {top && (job.allowedTransitions.includes('awaiting-review') || (job.status === 'received' && job.allowedTransitions.includes('diagnosing'))) && (
                <div className="rounded-lg border border-stone-300 bg-white p-3">
                  <Button onClick={() => void propose(selectedPart ?? top.part)} disabled={update.isPending}>
                    Propose {selectedPart ?? top.part} for review
                  </Button>
                  {update.error && <p role="alert" className="mt-1 text-sm text-high">{update.error.message}</p>}
                </div>
              )}
              {job.status === 'awaiting-review' && <p className="rounded-md bg-amber-50 p-2 text-sm">Proposed {job.proposedPart}: waiting for a lead’s review.</p>}
            </>
          )}
        </div>
      </div>
    </div>
  );
}

function UnsentBlock({ sender }: { sender: ReturnType<typeof useReadingSender> }) {
  return <UnsentList unsent={sender.unsent} rejected={sender.rejected} onRetry={() => void sender.flush()} onDismiss={sender.dismissRejected} />;
}

function BenchPage() {
  const { id = '' } = useParams();
  const job = useJob(id);
  useEffect(() => void preloadReadingParser(), []);
  return (
    <QueryState query={job} label="the job">
      {(j) => <Bench job={j} />}
    </QueryState>
  );
}

export default BenchPage;
