// `pnpm meter:sim`: the SCPI meter simulator on a new socat terminal pair, driven from the keyboard.
import { createInterface } from 'node:readline';
import { openPtyPair } from './pty-pair';
import { ScpiMeterSim } from './scpi-meter-sim';

const HELP = `Enter: press the meter's trigger · v 311.2: DC V reads 311.2 · r 4700 (or r OL): Ω · d 0.62: diode · q: quit`;
const FNS = { v: 'VOLT:DC', r: 'RES', d: 'DIOD' } as const;

const pair = await openPtyPair();
const sim = await ScpiMeterSim.open(pair.simPort);
console.log(`Meter simulator ready. Start the bridge with: pnpm meter:bridge --port ${pair.meterPort} --server <address> --email <sign-in>`);
console.log(HELP);
const rl = createInterface({ input: process.stdin });
const quit = async () => {
  rl.close();
  await sim.close();
  await pair.close();
  process.exit(0);
};
rl.on('line', (line) => {
  const [key, arg] = line.trim().split(/\s+/);
  if (!key) {
    void sim.press().then((sent) => console.log(sent ? `trigger: sent a ${sim.fn} reading` : 'trigger: no READ? waiting (ask from the bench first)'));
    return;
  }
  if (key === 'q') return void quit();
  const fn = FNS[key as keyof typeof FNS];
  const value = arg?.toUpperCase() === 'OL' ? 'OL' : Number(arg);
  if (!fn || (value !== 'OL' && !Number.isFinite(value))) return console.log(HELP);
  sim.set(fn, value);
  console.log(`${fn} now reads ${value}`);
});
process.once('SIGINT', () => void quit());
