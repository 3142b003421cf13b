// `pnpm meter:bridge --port /dev/ttyUSB0 --server http://127.0.0.1:5180 --email tech@demo.test`
// The password comes from SPLITSCOPE_PASSWORD, or is asked for on the terminal.
import { createInterface } from 'node:readline/promises';
import { parseArgs } from 'node:util';
import { runBridge } from './bridge';
import { ScpiMeter } from './scpi-meter';
import { openSerialLines } from './serial-lines';
import { ServerLink } from './server-link';

const USAGE = `usage: pnpm meter:bridge --port <serial device> --server <Splitscope address> --email <your sign-in> [--baud 9600]
  password: SPLITSCOPE_PASSWORD, or typed when asked`;

async function password(): Promise<string> {
  if (process.env.SPLITSCOPE_PASSWORD) return process.env.SPLITSCOPE_PASSWORD;
  if (!process.stdin.isTTY) throw new Error('set SPLITSCOPE_PASSWORD (no terminal to ask on)');
  const rl = createInterface({ input: process.stdin, output: process.stdout });
  try {
    return await rl.question('Splitscope password: ');
  } finally {
    rl.close();
  }
}

async function main(): Promise<number> {
  const { values } = parseArgs({
    options: {
      port: { type: 'string' },
      server: { type: 'string' },
      email: { type: 'string' },
      baud: { type: 'string', default: '9600' },
      help: { type: 'boolean' },
    },
  });
  if (values.help || !values.port || !values.server || !values.email) {
    console.log(USAGE);
    return values.help ? 0 : 2;
  }
  const baud = Number(values.baud);
  if (!Number.isInteger(baud) || baud <= 0) throw new Error(`--baud ${values.baud} is not a baud rate`);
  const log = (line: string) => console.log(`${new Date().toISOString().slice(11, 19)} ${line}`);
  const link = new ServerLink(values.server);
  await link.signIn(values.email, await password());
  log(`signed in to ${values.server} as ${values.email}`);
  const meter = new ScpiMeter(await openSerialLines(values.port, baud));
  const stop = new AbortController();
  process.once('SIGINT', () => stop.abort());
  process.once('SIGTERM', () => stop.abort());
  try {
    await runBridge({ meter, link, log, signal: stop.signal });
  } finally {
    await meter.close();
  }
  log('bridge stopped');
  return 0;
}

main().then(
  (code) => process.exit(code),
  (err: unknown) => {
    console.error(`meter bridge: ${(err as Error).message}`);
    process.exit(1);
  },
);
