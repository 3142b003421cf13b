// The bench meter over SCPI in the open bench: the technician asks for TP1 from the meter, presses the meter's
// trigger (here, the SCPI simulator's), and the reading shows on the bench in its words within a second. The
// bridge runs as the README starts it; the meter is the simulator on a socat terminal pair.
import { spawn, type ChildProcess } from 'node:child_process';
import { hasSocat, openPtyPair, type PtyPair } from '../../apps/meter-bridge/sim/pty-pair';
import { ScpiMeterSim } from '../../apps/meter-bridge/sim/scpi-meter-sim';
import { DEMO_PASSWORD, signIn } from './fixtures';
import { expect, test } from './support/own-shop';
import { benchSetup, send } from './support/divider-job';

const socat = hasSocat();

test.describe('bench meter', () => {
  test.skip(!socat, 'socat is not installed (apt-get install socat; `npm test` installs it)');
  let pair: PtyPair | undefined;
  let sim: ScpiMeterSim | undefined;
  let bridge: ChildProcess | undefined;
  test.afterEach(async () => {
    if (bridge && bridge.exitCode === null) {
      const gone = new Promise((r) => bridge!.once('exit', r));
      bridge.kill('SIGTERM');
      await gone;
    }
    await sim?.close();
    await pair?.close();
  });

  test('a reading triggered on the meter lands in the open bench within 1 s', async ({ page, shop }) => {
    const setup = await benchSetup(shop);
    const job = await send<{ id: string }>(setup.tech, 'post', '/jobs', {
      customerId: setup.customerId,
      boardId: setup.boardId,
      unitDescription: 'Outdoor unit',
      symptom: 'Fan never starts',
    });
    pair = await openPtyPair();
    sim = await ScpiMeterSim.open(pair.simPort);
    sim.noise = 0;
    sim.set('VOLT:DC', 15.02);

    // The README's command, signed in as the technician at this bench.
    const base = process.env.BASE_URL ?? 'http://127.0.0.1:5180';
    bridge = spawn('node_modules/.bin/tsx', ['apps/meter-bridge/src/cli.ts', '--port', pair.meterPort, '--server', base, '--email', shop.users.tech.email], {
      env: { ...process.env, SPLITSCOPE_PASSWORD: DEMO_PASSWORD },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let out = '';
    bridge.stdout!.on('data', (d: Buffer) => (out += d.toString()));
    bridge.stderr!.on('data', (d: Buffer) => (out += d.toString()));

    // The bench opens while the bridge starts (on a busy machine tsx takes seconds to start it).
    await signIn(page, shop.users.tech.email);
    await page.goto(`/jobs/${job.id}?mode=free&tab=points`);
    await page.getByRole('navigation', { name: 'Test points' }).getByRole('button', { name: /TP1/ }).click();
    await expect.poll(() => out, { timeout: 30_000 }).toContain('meter: Invented Instruments,BM-2300');
    const meter = page.getByRole('group', { name: 'Bench meter' });
    await meter.getByRole('button', { name: /^Take TP1.* from the bench meter$/ }).click();
    await expect(meter.getByRole('status')).toContainText('Waiting for the bench meter: press its trigger for TP1');
    await expect(meter.getByTestId('bridge-line')).toHaveText('Bench meter: Invented Instruments BM-2300, connected.');
    await expect.poll(() => sim!.armed).toBe(true);

    const pressed = Date.now();
    expect(await sim.press()).toBe(true);
    await expect(meter.getByTestId('meter-reading')).toHaveText(/^TP1.* DC V 15 V from the bench meter$/, { timeout: 1000 });
    console.log(`bench meter: trigger to reading on the bench ${Date.now() - pressed} ms`);

    // Stored as the bench's own reading: the verdict beside the value field, the meter named in the history.
    await expect(page.getByTestId('verdict')).toContainText('15 V');
    const stored = await send<{ items: { red: string; value: number; raw: string; instrument: string }[] }>(setup.tech, 'get', `/jobs/${job.id}/readings`);
    expect(stored.items).toEqual([expect.objectContaining({ red: 'TP1', value: 15.02, raw: '+1.5020E+01', instrument: 'Invented Instruments BM-2300' })]);
    expect(out).toContain('stored on the bench');
  });
});
