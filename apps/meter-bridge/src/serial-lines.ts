// A serial port as lines of text: SCPI over RS-232 ends each message with a newline (IEEE 488.2, 7.5: the NL
// program message terminator); a carriage return before it is dropped. Shared by the bridge and the simulator.
import { ReadlineParser, SerialPort } from 'serialport';

export interface SerialLines {
  write(line: string): Promise<void>;
  onLine(listener: (line: string) => void): void;
  close(): Promise<void>;
}

export async function openSerialLines(path: string, baudRate = 9600): Promise<SerialLines> {
  const port = new SerialPort({ path, baudRate, autoOpen: false });
  await new Promise<void>((resolve, reject) => port.open((err) => (err ? reject(new Error(`cannot open ${path}: ${err.message}`)) : resolve())));
  const lines = port.pipe(new ReadlineParser({ delimiter: '\n', encoding: 'ascii' }));
  return {
    write: (line) =>
      new Promise((resolve, reject) => {
        port.write(`${line}\n`, 'ascii', (err) => (err ? reject(err) : port.drain((e) => (e ? reject(e) : resolve()))));
      }),
    onLine: (listener) => lines.on('data', (l: string) => listener(l.replace(/\r$/, ''))),
    close: () => new Promise((resolve) => (port.isOpen ? port.close(() => resolve()) : resolve())),
  };
}
