import { benchMeterModes, type BenchMeterArm, type BenchMeterMode, type Role, mayUseBenchMeter } from '@splitscope/contract';
import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useRef } from 'react';
import { afterReadingWritten } from '@/lib/after-reading-written';
import { METER_LABEL, readingText } from '@/lib/format';
import { useArmBenchMeter, useBenchMeter, useCancelBenchMeter } from '../api/bench-meter';

export interface MeterTarget {
  mode: string;
  red: string;
  black: string;
  power: 'on' | 'off';
  lifted: string[];
}

const isMeterMode = (m: string): m is BenchMeterMode => (benchMeterModes as readonly string[]).includes(m);
const sameTest = (a: BenchMeterArm, t: MeterTarget) =>
  a.mode === t.mode && a.red === t.red && a.black === t.black && a.power === t.power && a.lifted.join() === t.lifted.join();
const button = 'min-h-11 rounded-md border-2 border-board bg-white px-3 text-sm font-semibold disabled:opacity-60';

/**
 * The bench meter beside the value field: ask the meter for this test's reading, then press the meter's trigger
 * (or read at once). The reading is stored by the server through the same write as a typed one; this shows it in
 * the bench's words once it lands, or the server's refusal. Continuity stays on the keyboard: its beep is heard.
 */
export function BenchMeter({
  jobId,
  role,
  target,
  label,
  busVolts,
}: {
  jobId: string;
  role?: Role;
  target: MeterTarget;
  label: (netOrPoint: string) => string;
  busVolts: number | null;
}) {
  const usable = mayUseBenchMeter(role) && isMeterMode(target.mode);
  const status = useBenchMeter(jobId, usable);
  const armMeter = useArmBenchMeter(jobId);
  const cancel = useCancelBenchMeter(jobId);
  const qc = useQueryClient();
  const arm = status.data?.arm ?? null;
  const bridge = status.data?.bridge ?? null;

  // A reading the meter sent is on the job now: the readings and the ranking follow.
  const seen = useRef<string | null>(null);
  useEffect(() => {
    if (arm?.state !== 'taken' || seen.current === arm.id) return;
    seen.current = arm.id;
    void afterReadingWritten(qc, jobId);
  }, [arm?.id, arm?.state, jobId, qc]);

  if (!usable || !isMeterMode(target.mode)) return null;
  const mode = target.mode;
  const point = label(target.red);
  const waiting = arm?.state === 'waiting';
  const ask = (trigger: 'meter' | 'now') =>
    armMeter.mutate({
      mode,
      red: target.red,
      black: target.black,
      power: target.power,
      lifted: target.lifted,
      trigger,
      ...(target.power === 'off' && busVolts !== null ? { safetyCheck: { unplugged: true, busVolts } } : {}),
    });
  const words = (a: BenchMeterArm) => `${label(a.red)} ${METER_LABEL[a.mode] ?? a.mode}`;

  return (
    <div className="space-y-2 rounded-md border border-stone-300 bg-stone-50 p-2" aria-label="Bench meter" role="group">
      <p className="text-xs text-stone-700" data-testid="bridge-line">
        {bridge?.connected
          ? `Bench meter: ${bridge.instrument ?? 'connected'}, connected.`
          : 'No bench meter connected: start the meter bridge beside it (see the README, “Bench meter”).'}
      </p>
      {waiting ? (
        <div className="flex flex-wrap items-center gap-2">
          <p role="status" className="flex-1 text-sm font-semibold">
            {!arm.ready
              ? `Getting ready for ${words(arm)}: place the probes…`
              : arm.trigger === 'meter'
                ? `Waiting for the bench meter: press its trigger for ${words(arm)}.`
                : `Reading ${words(arm)} from the bench meter…`}
          </p>
          <button type="button" className={button} onClick={() => cancel.mutate()}>
            Cancel
          </button>
        </div>
      ) : (
        <div className="flex flex-wrap gap-2">
          <button type="button" className={button} disabled={armMeter.isPending} onClick={() => ask('meter')}>
            Take {point} from the bench meter
          </button>
          <button type="button" className={button} disabled={armMeter.isPending} onClick={() => ask('now')}>
            Read now
          </button>
        </div>
      )}
      {arm?.state === 'taken' && arm.reading && (
        <p role="status" className="text-base font-semibold" data-testid="meter-reading">
          {words(arm)} {readingText(arm.reading)} from the bench meter
          {!sameTest(arm, target) && <span className="font-normal text-stone-700"> (an earlier test)</span>}
        </p>
      )}
      {arm?.state === 'refused' && (
        <p role="alert" className="rounded-md bg-red-50 p-2 text-sm text-high">
          {words(arm)} from the bench meter was not stored: {arm.refusal}
        </p>
      )}
      {(armMeter.error || cancel.error) && (
        <p role="alert" className="rounded-md bg-red-50 p-2 text-sm text-high">
          {(armMeter.error ?? cancel.error)!.message}
        </p>
      )}
    </div>
  );
}
