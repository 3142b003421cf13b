// A bench multimeter of our own that speaks SCPI on a serial port, for the tests and for trying the bridge without
// a meter. Its maker and model are invented. It takes the short and long forms of each command, in any case
// (SCPI-99, Volume 1, 6.2: "CONF:VOLT:DC" is "CONFigure:VOLTage:DC"; from memory).
import { openSerialLines, type SerialLines } from '../src/serial-lines';

export const SIM_IDN = 'Invented Instruments,BM-2300,SIM0001,1.0';

type Fn = 'VOLT:DC' | 'RES' | 'DIOD';
type Value = number | 'OL';

// Each command as a pattern of its short form with the optional long-form letters; matched on the upper-cased line.
const COMMANDS: { re: RegExp; fn?: Fn; source?: 'IMM' | 'EXT' | 'BUS'; name?: string }[] = [
  { re: /^CONF(IGURE)?:VOLT(AGE)?(:DC)?$/, fn: 'VOLT:DC' },
  { re: /^CONF(IGURE)?:RES(ISTANCE)?$/, fn: 'RES' },
  { re: /^CONF(IGURE)?:DIOD(E)?$/, fn: 'DIOD' },
  { re: /^TRIG(GER)?:SOUR(CE)? IMM(EDIATE)?$/, source: 'IMM' },
  { re: /^TRIG(GER)?:SOUR(CE)? EXT(ERNAL)?$/, source: 'EXT' },
  { re: /^TRIG(GER)?:SOUR(CE)? BUS$/, source: 'BUS' },
];

/** SCPI's NR3 form as meters print it: sign, five significant digits, two-digit exponent ("+3.1102E+02"). */
export function nr3(v: Value): string {
  if (v === 'OL') return '+9.90000000E+37';
  const [mantissa, exp] = Math.abs(v).toExponential(4).split('e') as [string, string];
  const e = Number(exp);
  return `${v < 0 ? '-' : '+'}${mantissa}E${e < 0 ? '-' : '+'}${String(Math.abs(e)).padStart(2, '0')}`;
}

export class ScpiMeterSim {
  /** Every line received, in order: what the tests check the bridge sent. */
  readonly received: string[] = [];
  fn: Fn = 'VOLT:DC';
  source: 'IMM' | 'EXT' | 'BUS' = 'IMM';
  /** What each function reads before noise; OL is overload. */
  readonly values: Record<Fn, Value> = { 'VOLT:DC': 311, RES: 4700, DIOD: 0.62 };
  /** Relative noise of a reading (uniform, ±), as the last digits of a real meter wander. */
  noise = 0.001;
  private readPending = false;
  private errors: string[] = [];

  private constructor(private readonly lines: SerialLines) {
    lines.onLine((line) => void this.handle(line.trim()));
  }

  static async open(path: string): Promise<ScpiMeterSim> {
    return new ScpiMeterSim(await openSerialLines(path));
  }

  set(fn: Fn, value: Value): void {
    this.values[fn] = value;
  }

  /** Whether a READ? is waiting for the trigger. */
  get armed(): boolean {
    return this.readPending;
  }

  /** Presses the meter's trigger: answers the READ? that waits for it. False when none waits (nothing sent). */
  async press(): Promise<boolean> {
    if (!this.readPending || this.source === 'IMM') return false;
    this.readPending = false;
    await this.lines.write(this.reading());
    return true;
  }

  private reading(): string {
    const v = this.values[this.fn];
    if (v === 'OL') return nr3('OL');
    return nr3(v * (1 + (Math.random() * 2 - 1) * this.noise));
  }

  private async handle(line: string): Promise<void> {
    if (!line) return;
    this.received.push(line);
    const cmd = line.toUpperCase().replace(/\s+/g, ' ');
    if (cmd === '*IDN?') return this.lines.write(SIM_IDN);
    if (cmd === '*RST' || cmd === '*CLS') {
      this.readPending = false;
      this.errors = [];
      return;
    }
    if (cmd === 'ABOR' || cmd === 'ABORT') {
      this.readPending = false;
      return;
    }
    if (cmd === 'READ?') {
      if (this.source === 'IMM') return this.lines.write(this.reading());
      this.readPending = true;
      return;
    }
    if (cmd === 'CONF?' || cmd === 'CONFIGURE?') return this.lines.write(`"${this.fn}"`);
    if (cmd === 'SYST:ERR?' || cmd === 'SYSTEM:ERROR?') return this.lines.write(this.errors.shift() ?? '+0,"No error"');
    const known = COMMANDS.find((c) => c.re.test(cmd));
    if (!known) {
      // SCPI-99, Volume 2, 21.8.9: -113 is "Undefined header" (from memory).
      this.errors.push('-113,"Undefined header"');
      return;
    }
    if (known.fn) this.fn = known.fn;
    if (known.source) this.source = known.source;
  }

  close(): Promise<void> {
    return this.lines.close();
  }
}
