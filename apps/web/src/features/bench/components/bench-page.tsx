import { acceptsReadings, canPropose, isPhotoOnlyBoard, jobStatusLabels, type JobDetail, type StoredReading } from '@splitscope/contract';
import { useEffect, useMemo, useState } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { BoardMap } from '@/components/board-map/board-map';
import { JobHistoryNote } from '@/components/board-history/board-history';
import { useJobHistory } from '@/lib/api/get-board-history';
import { QueryState } from '@/components/ui/query-state';
import { StatusBadge } from '@/components/ui/status-badge';
import { useMe } from '@/lib/api/me';
import { useDiagnosis } from '@/lib/api/get-diagnosis';
import { useJob } from '@/lib/api/get-job';
import { useReadings } from '@/lib/api/get-readings';
import { ReadingsTable } from '@/components/readings/readings-table';
import { bandText, readingText } from '@/lib/format';
import { useReadingSender } from '@/lib/use-reading-sender';
import {
  currentReadings,
  expectedFor,
  latestFor,
  nextTests,
  pointState,
  priorNotes,
  rankedParts,
  sectionShares,
  rowsForPoint,
  sameTarget,
  stateOf,
  type Target,
} from '../lib/bench-model';
import { useBenchTarget } from '../lib/use-bench-target';
import { boardView } from '@/lib/board/board-view';
import { gateFigures } from '@/lib/board/gate-figures';
import { gateRefusalFor, touchesBus } from '@/lib/board/gate';
import { parseTyped, preloadReadingParser } from '@/lib/parse-reading';
import { GuidedOrder } from './guided-order';
import { GuidedSwitch } from './guided-switch';
import { MeterSwitch } from './meter-switch';
import { LiftedParts } from './lifted-parts';
import { AloneChoices } from './alone-choices';
import { ReadingActions } from './reading-actions';
import { ProbeChoices } from './probe-choices';
import { ProposePanel } from './propose-panel';
import { PointList } from './point-list';
import { RankingPanel } from './ranking-panel';
import { JobPhotos } from '@/components/photos/job-photos';
import { ReadingPanel, type LatestReading } from './reading-panel';
import { BenchMeter } from './bench-meter';
import { SafetyGate } from '@/components/safety-gate';
import { SignalChain } from './signal-chain';
import { chainLinks } from '../lib/chain-links';
import { UnsentList } from './unsent-list';
import { UnmodelledBench } from './unmodelled-bench';

type Tab = 'map' | 'chain' | 'points' | 'readings' | 'photos';
const TABS: { id: Tab; label: string }[] = [
  { id: 'map', label: 'Board map' },
  { id: 'chain', label: 'Signal chain' },
  { id: 'points', label: 'Test points' },
  { id: 'readings', label: 'Readings' },
  { id: 'photos', label: 'Photos' },
];
const linkClass = 'inline-flex min-h-11 items-center rounded-md border border-stone-400 bg-white px-3 text-sm font-semibold';

function Bench({ job }: { job: JobDetail }) {
  const me = useMe();
  const [params, setParams] = useSearchParams();
  // Guided order binds a trainee (the server refuses anything else) until a lead lifts it for the job.
  const guided = job.guidedOrderRequired || params.get('mode') === 'guided' || (params.get('mode') === null && me.data?.role === 'trainee');
  const tab = (TABS.find((t) => t.id === params.get('tab'))?.id ?? 'map') as Tab;
  const view = useMemo(() => boardView(job.board.document, job.board.pictureUrl), [job.board.document, job.board.pictureUrl]);
  const rows = job.board.expectedReadings;
  const readingsQ = useReadings(job.id);
  const diagnosisQ = useDiagnosis(job.id);
  const sender = useReadingSender(job.id);
  const history = useJobHistory(job.id);
  const [entryError, setEntryError] = useState<string | null>(null);
  // The bus voltage typed at the safety gate; null until the gate is passed for this unplugged spell.
  const [gateVolts, setGateVolts] = useState<number | null>(null);
  const [gateRefusal, setGateRefusal] = useState<string | null>(null);

  const all = readingsQ.data?.items ?? [];
  const readings = useMemo(() => currentReadings(readingsQ.data?.items ?? []).filter((r) => !r.struck), [readingsQ.data]);
  const steps = useMemo(() => (diagnosisQ.data ? nextTests(view, diagnosisQ.data) : []), [view, diagnosisQ.data]);
  const ranked = useMemo(() => (diagnosisQ.data ? rankedParts(view, diagnosisQ.data) : []), [view, diagnosisQ.data]);
  const step = steps[0];
  const bench = useBenchTarget({ view, rows, guided, step });
  const { target, active, lifted, liftable, selectedPart } = bench;
  // A new test clears the last one's refusal.
  useEffect(() => setEntryError(null), [active?.pointId, active?.mode, active?.red, active?.black, active?.alone]);
  const canWrite = acceptsReadings(job.status, 'diagnosis');
  const needsGate = !!active && active.power === 'off' && touchesBus(view, active) && gateVolts === null;

  const points = view.points.map((p) => ({ ...p, ...pointState(view, readings, p.net, guided ? [] : lifted) }));

  /** Sends a reading (or a correction) through the gate rule the server applies. */
  const send = async (probe: Target, text: string, extra: { supersedes?: string; gate?: number | null } = {}): Promise<string | null> => {
    const parsed = await parseTyped(text, probe.mode);
    if (!parsed.ok) return parsed.error;
    const volts = extra.gate ?? gateVolts;
    if (probe.power === 'on') setGateVolts(null); // the board was powered again: the next unpowered step gates again
    const safetyCheck = probe.power === 'off' && volts !== null ? { safetyCheck: { unplugged: true as const, busVolts: volts } } : {};
    const refusal = gateRefusalFor(view, { ...probe, ...safetyCheck });
    if (refusal) {
      setGateVolts(null);
      setGateRefusal(refusal);
      return 'Pass the discharge gate first: this reading is unpowered on the DC bus.';
    }
    const { mode, red, black, power } = probe;
    await sender.save({
      mode,
      red,
      black,
      power,
      lifted: probe.lifted,
      ...(probe.alone ? { alone: probe.alone } : {}),
      value: parsed.value,
      ...(parsed.beep !== undefined ? { beep: parsed.beep } : {}),
      raw: text.trim(),
      phase: 'diagnosis',
      ...safetyCheck,
      ...(extra.supersedes ? { supersedes: extra.supersedes } : {}),
    });
    return null;
  };
  const save = async (text: string) => {
    if (!active) return false;
    const err = await send(active, text);
    setEntryError(err);
    return err === null;
  };
  // A correction re-enters the value of a measurement already taken, under the gate that reading passed.
  const correct = (r: StoredReading, text: string) =>
    send({ mode: r.mode, red: r.red, black: r.black, power: r.power, lifted: r.lifted, alone: r.alone }, text, { supersedes: r.id, gate: r.safetyBusVolts });

  const latest: LatestReading | null = (() => {
    if (!active) return null;
    const unsent = [...sender.unsent].reverse().find((u) => sameTarget(view, u.body as Target, active));
    if (unsent) return { text: unsent.body.raw, state: 'unsent' };
    const r = latestFor(view, readings, active);
    if (!r) return null;
    return {
      text: readingText(r),
      state: stateOf(r.verdict?.verdict),
      detail: r.verdict ? `expected ${bandText(r.verdict, r.mode)}` : 'no expected value for this test',
    };
  })();

  const expectedRow = active ? expectedFor(view, rows, active) : undefined;
  const alonePart = active?.alone ? liftable.find((x) => x.id === active.alone) : undefined;
  const pinLabel = (net: string) => (alonePart ? `${alonePart.designator} ${alonePart.pins.find((x) => x.net === net)?.word ?? 'pin'}` : view.netLabel(net));
  const panelTarget = active && {
    pointId: `${active.red}|${active.black}|${active.mode}|${active.power}|${active.lifted.join()}|${active.alone ?? ''}`,
    pointLabel: alonePart ? `${alonePart.designator} alone` : view.netLabel(active.red),
    meter: active.mode,
    power: active.power,
    lifted: active.lifted.map((p) => liftable.find((x) => x.id === p)?.designator ?? p),
    red: { label: pinLabel(active.red) },
    black: { label: pinLabel(active.black) },
    expected: expectedRow
      ? {
          text: bandText({ ...expectedRow, low: null, high: null }, expectedRow.mode),
          band: bandText(expectedRow, expectedRow.mode),
          note: expectedRow.note,
          source: expectedRow.source,
          assumes: job.meter.label,
        }
      : null,
  };
  const choices = !guided && target?.pointId && lifted.length === 0 ? rowsForPoint(view, rows, target.pointId) : [];
  const proposed = ranked.find((p) => p.part === selectedPart) ?? ranked[0];
  const checkBus = async (t: string): Promise<{ ok: true; volts: number } | { ok: false; message: string }> => {
    const r = await parseTyped(t, 'dcv');
    if (!r.ok) return { ok: false, message: r.error };
    if (r.value === 'OL') return { ok: false, message: 'OL is not a bus voltage: set the meter to DC V and measure again.' };
    return { ok: true, volts: r.value };
  };
  const passGate = (v: number) => {
    setGateRefusal(null);
    setGateVolts(v);
  };
  const gateShown = (needsGate || gateRefusal !== null) && gateVolts === null;
  const safetyGate = <SafetyGate key={gateRefusal ?? 'gate'} figures={gateFigures(view, rows)} check={checkBus} onPass={passGate} refusal={gateRefusal} />;
  const probeNets = active ? { red: view.pointOf(active.red)?.net ?? active.red, black: view.pointOf(active.black)?.net ?? active.black } : undefined;
  const faultCode = job.faultCode ? job.board.faultCodes.find((f) => f.code.toLowerCase() === job.faultCode!.toLowerCase()) : undefined;
  const before =
    readings.length === 0
      ? {
          code: job.faultCode,
          meaning: faultCode?.title ?? null,
          sections: (faultCode?.sections ?? []).map((id) => view.sections.find((x) => x.id === id)?.name ?? id),
          firstTest: step?.label ?? null,
        }
      : null;
  const meter = active && <BenchMeter jobId={job.id} role={me.data?.role} target={active} label={view.netLabel} busVolts={gateVolts} />;
  const entry = panelTarget && canWrite && !gateShown && <ReadingPanel target={panelTarget} latest={latest} onSave={save} error={entryError} meter={meter} />;

  return (
    <div className="flex flex-col gap-2 lg:h-[calc(100dvh_-_5.25rem_-_var(--banner-h,0px))]">
      <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
        <h1 className="text-xl font-semibold">
          Job #{job.number} · {job.boardName}
        </h1>
        <StatusBadge status={job.status} sentBack={job.sentBack} />
        <p className="min-w-0 flex-1 truncate text-sm text-stone-700" title={`${job.customerName} · ${job.unitDescription} · ${job.symptom}`}>
          {job.faultCode ? `code ${job.faultCode} · ` : ''}
          {job.symptom} · {job.customerName}
        </p>
        <div className="flex min-w-0 max-w-full flex-wrap gap-1">
          <GuidedSwitch job={job} guided={guided} onToggle={() => setParams((p) => (p.set('mode', guided ? 'free' : 'guided'), p))} />
          <MeterSwitch job={job} />
          {['approved', 'repaired', 'verified', 'returned'].includes(job.status) && (
            <Link className={linkClass} to={`/jobs/${job.id}/repair`}>
              Repair and verification
            </Link>
          )}
          {!['verified', 'returned'].includes(job.status) && (
            <Link className={linkClass} to={`/jobs/${job.id}/import`}>
              Import meter log
            </Link>
          )}
          <Link className={linkClass} to={`/jobs/${job.id}/report`}>
            Report
          </Link>
          <Link className={linkClass} to={`/jobs/${job.id}/billing`}>
            Quote
          </Link>
        </div>
      </div>
      {job.sentBack && job.reviews.at(-1)?.decision === 'send-back' && (
        <p role="note" className="rounded-md border border-amber-600 bg-amber-50 p-2 text-sm">
          Sent back by {job.reviews.at(-1)!.reviewerName}: “{job.reviews.at(-1)!.comment}”
        </p>
      )}
      <JobHistoryNote history={history.data} jobId={job.id} />
      <UnsentBlock sender={sender} />
      <div className="grid gap-3 lg:min-h-0 lg:flex-1 lg:grid-cols-[minmax(0,1fr)_26rem]">
        <div className="order-2 flex min-h-0 flex-col gap-2 lg:order-1">
          <div role="tablist" aria-label="Bench views" className="flex flex-wrap gap-1">
            {TABS.map((t) => (
              <button
                key={t.id}
                type="button"
                role="tab"
                aria-selected={tab === t.id}
                onClick={() => setParams((p) => (p.set('tab', t.id), p))}
                className="min-h-11 rounded-md border border-stone-400 bg-white px-3 text-sm aria-selected:border-board aria-selected:bg-board aria-selected:font-semibold aria-selected:text-white"
              >
                {t.label}
                {t.id === 'readings' ? ` (${all.length})` : ''}
              </button>
            ))}
          </div>
          {/* Focusable so a keyboard user can scroll the chosen view when it is taller than the screen. */}
          <div className="min-h-0 flex-1 overflow-auto" tabIndex={0} role="region" aria-label="Chosen view">
            {tab === 'map' && (
              <div className="h-[55vh] min-h-72 lg:h-full lg:min-h-0">
                <BoardMap
                  pictureUrl={view.pictureUrl}
                  size={view.size}
                  points={points}
                  parts={view.parts}
                  connectors={view.connectors}
                  selectedId={active?.pointId ?? null}
                  probes={probeNets}
                  highlightPart={selectedPart}
                  onSelect={bench.selectPoint}
                />
              </div>
            )}
            {tab === 'photos' && <JobPhotos jobId={job.id} canAdd={canWrite} />}
            {tab === 'chain' && <SignalChain links={chainLinks(view, rows, readings)} />}
            {tab === 'points' && (
              <PointList
                items={points.map((p) => ({
                  id: p.id,
                  label: p.label,
                  section: view.sections.find((s) => s.id === p.section)?.name ?? p.section,
                  state: p.state,
                  reading: p.reading ? readingText(p.reading) : undefined,
                }))}
                selectedId={target?.pointId}
                onSelect={bench.selectPoint}
              />
            )}
            {tab === 'readings' && (
              <QueryState query={readingsQ} label="the readings">
                {(d) => (
                  <ReadingsTable
                    readings={d.items.filter((r) => r.phase === 'diagnosis')}
                    model={view.model}
                    caption="Readings with the board state each was taken in"
                    actions={canWrite ? (r) => <ReadingActions reading={r} jobId={job.id} onCorrect={correct} /> : undefined}
                  />
                )}
              </QueryState>
            )}
          </div>
          {/* Under the map from 1024 px: the engine's next tests and ranking, each scrolling on its own. */}
          <div className="min-h-0 lg:h-[40%] lg:overflow-y-auto" data-testid="ranking-area">
            <QueryState query={diagnosisQ} label="the ranking">
              {() => (
                <RankingPanel
                  parts={ranked}
                  nextTests={guided ? [] : steps.slice(0, 3)}
                  selectedPart={selectedPart}
                  before={before}
                  suspectSections={before && diagnosisQ.data ? sectionShares(view, diagnosisQ.data) : []}
                  reasons={diagnosisQ.data ? priorNotes(diagnosisQ.data) : []}
                  guided={guided}
                  preparing={diagnosisQ.data?.preparing}
                  checkingPairs={diagnosisQ.data?.checking?.candidates}
                  readingsKey={diagnosisQ.data ? `${diagnosisQ.data.readings.length}:${diagnosisQ.data.readings.at(-1)?.readingId ?? ''}` : undefined}
                  onPickPart={bench.pickPart}
                  onPickTest={guided ? undefined : (t) => bench.chooseTest(t as (typeof steps)[number])}
                />
              )}
            </QueryState>
          </div>
        </div>
        <div className="order-1 min-h-0 space-y-3 lg:order-2 lg:overflow-y-auto lg:pr-1" data-testid="bench-side">
          {readingsQ.isError && (
            <p role="alert" className="text-high">
              Readings could not be loaded: {readingsQ.error.message}
            </p>
          )}
          {guided ? (
            <GuidedOrder view={view} step={step} done={readings} pending={diagnosisQ.isPending}>
              {diagnosisQ.isPending && <p role="status">Asking the engine for the next step…</p>}
              {gateShown && active && safetyGate}
              {entry}
            </GuidedOrder>
          ) : (
            <>
              {canWrite && (
                <LiftedParts
                  parts={liftable}
                  lifted={lifted}
                  onChange={bench.changeLifted}
                  onMeasurePads={bench.measurePads}
                  onMeasureAlone={(p) => bench.measureAlone(p)}
                />
              )}
              {alonePart && target ? (
                <AloneChoices part={alonePart} mode={target.mode} red={target.red} black={target.black} onChange={(c) => bench.measureAlone(alonePart.id, c)} />
              ) : (
                <ProbeChoices rows={choices} isChosen={(r) => !!target && sameTarget(view, r, target)} onChoose={bench.chooseRow} />
              )}
              {gateShown && active && safetyGate}
              {entry}
              {!active && <p className="rounded-md bg-board-light p-3 text-sm">Pick a test point on the map, or a next test below.</p>}
              {!canWrite && (
                <p className="rounded-md bg-board-light p-2 text-sm">This job is {jobStatusLabels[job.status].toLowerCase()}: diagnosis readings are closed.</p>
              )}
            </>
          )}
          {proposed && readings.length > 0 && canPropose(job.status, me.data?.role) && <ProposePanel job={job} proposed={proposed} picked={!!selectedPart} />}
          {job.status === 'awaiting-review' && <p className="rounded-md bg-amber-50 p-2 text-sm">Proposed {job.proposedPart}: waiting for a lead’s review.</p>}
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
      {(j) => (isPhotoOnlyBoard(j.board.document) ? <UnmodelledBench job={j} /> : <Bench job={j} />)}
    </QueryState>
  );
}

export default BenchPage;
