// What a fuzz run found, and how it is printed.
export interface FuzzReport {
  ok: boolean;
  tried: number;
  routes: number;
  accepted: number;
  refused: number;
  serverErrors: { route: string; status: number; label: string; sample: string }[];
  changes: { route: string; status: number; label: string; tables: string[] }[];
  /** Accepted requests whose effect on the database was not what their answer says (a GET that wrote, a 201 that stored nothing). */
  stateErrors: { route: string; status: number; label: string; problem: string }[];
  /** Set-up steps (fuzz-fresh.ts) that failed: the route then went without its fresh row. */
  setupErrors: string[];
  perRoute: Record<string, { accepted: number; refused: number }>;
  unmapped: string[];
  statuses: Record<number, number>;
  seconds: number;
}

export function printFuzzReport(r: FuzzReport, log: (l: string) => void = console.log): void {
  for (const u of r.unmapped) log(`fuzz: note: no contract schema named in ${u}; fuzzed with reading payloads`);
  for (const e of r.serverErrors) log(`fuzz: FAIL ${e.status || 'no answer'} from ${e.route} (${e.label}): ${e.sample}`);
  for (const c of r.changes) log(`fuzz: FAIL refused ${c.status} from ${c.route} (${c.label}) changed ${c.tables.join(', ')}`);
  for (const e of r.stateErrors) log(`fuzz: FAIL accepted ${e.status} from ${e.route} (${e.label}): ${e.problem}`);
  for (const e of r.setupErrors) log(`fuzz: set-up failed for ${e}`);
  log('fuzz: accepted / refused per route:');
  for (const [route, s] of Object.entries(r.perRoute))
    log(
      `  ${route.padEnd(52)} ${String(s.accepted).padStart(5)} / ${String(s.refused).padStart(5)}  (${Math.round((100 * s.accepted) / Math.max(1, s.accepted + s.refused))} % accepted)`,
    );
  log(
    `fuzz: tried ${r.tried} payloads on ${r.routes} routes (${r.refused} refused, ${r.accepted} accepted) in ${r.seconds.toFixed(1)} s: ${r.serverErrors.length} server errors, ${r.changes.length} refused requests that changed the database, ${r.stateErrors.length} accepted requests with the wrong effect`,
  );
  log(
    `fuzz: answers by status: ${Object.entries(r.statuses)
      .map(([k, v]) => `${k}: ${v}`)
      .join(', ')}`,
  );
  log(r.ok ? 'fuzz: ok' : 'fuzz: FAILED');
}
