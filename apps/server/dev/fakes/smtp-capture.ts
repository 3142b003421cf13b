// The local stand-in for a mail relay: a real SMTP server (the `smtp-server` package) on loopback that
// accepts every message and keeps it, in memory and as .eml files in a folder, so the development outbox
// page and the tests can read what was "sent". Never started in production with a real relay configured.
import { mkdir, readdir, readFile, writeFile } from 'node:fs/promises';
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import { SMTPServer } from 'smtp-server';
import { parseMail, type ParsedMail } from './mime';

export interface CapturedMessage extends ParsedMail {
  id: string;
  receivedAt: string;
  envelopeFrom: string | null;
  envelopeTo: string[];
  raw: Buffer;
}

export interface SmtpCapture {
  host: string;
  port: number;
  messages: CapturedMessage[];
  /** Resolves with the first message (already received or still to come) that matches. */
  waitFor(match: (m: CapturedMessage) => boolean, timeoutMs?: number): Promise<CapturedMessage>;
  close(): Promise<void>;
}

const MAX_MESSAGE_BYTES = 10 * 1024 * 1024;

/** Starts the capture server; port 0 picks a free one. `dir` (optional) keeps each message as an .eml file. */
export async function startSmtpCapture(opts: { host?: string; port?: number; dir?: string } = {}): Promise<SmtpCapture> {
  const host = opts.host ?? '127.0.0.1';
  const messages: CapturedMessage[] = [];
  const waiters: { match: (m: CapturedMessage) => boolean; resolve: (m: CapturedMessage) => void }[] = [];
  let seq = 0;
  if (opts.dir) await mkdir(opts.dir, { recursive: true });

  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    size: MAX_MESSAGE_BYTES,
    logger: false,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (c: Buffer) => chunks.push(c));
      stream.on('error', callback);
      stream.on('end', () => {
        if (stream.sizeExceeded) return callback(Object.assign(new Error('Message too large'), { responseCode: 552 }));
        const raw = Buffer.concat(chunks);
        const receivedAt = new Date();
        const id = `${receivedAt.getTime()}-${String(++seq).padStart(4, '0')}`;
        const msg: CapturedMessage = {
          ...parseMail(raw),
          id,
          receivedAt: receivedAt.toISOString(),
          envelopeFrom: session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
          envelopeTo: session.envelope.rcptTo.map((r) => r.address),
          raw,
        };
        messages.push(msg);
        for (const w of [...waiters]) {
          if (w.match(msg)) {
            waiters.splice(waiters.indexOf(w), 1);
            w.resolve(msg);
          }
        }
        const saved = opts.dir ? writeFile(join(opts.dir, `${id}.eml`), raw) : Promise.resolve();
        saved.then(
          () => callback(),
          (err: Error) => callback(err),
        );
      });
    },
  });

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port ?? 0, host, () => {
      server.off('error', reject);
      resolve();
    });
  });
  // smtp-server logs socket errors of clients that hang up; a capture server has nothing to do about them
  server.on('error', () => {});
  const port = (server as unknown as { server: { address(): AddressInfo } }).server.address().port;

  return {
    host,
    port,
    messages,
    waitFor(match, timeoutMs = 10_000) {
      const found = messages.find(match);
      if (found) return Promise.resolve(found);
      return new Promise((resolve, reject) => {
        const w = {
          match,
          resolve: (m: CapturedMessage) => {
            clearTimeout(timer);
            resolve(m);
          },
        };
        const timer = setTimeout(() => {
          waiters.splice(waiters.indexOf(w), 1);
          reject(new Error(`no matching message arrived within ${timeoutMs} ms (${messages.length} captured)`));
        }, timeoutMs);
        waiters.push(w);
      });
    },
    close: () => new Promise<void>((r) => server.close(() => r())),
  };
}

/** Reads the messages a capture server kept in `dir`, newest first (the outbox page; another process may own the server). */
export async function readCapturedMail(dir: string, limit = 200): Promise<(ParsedMail & { id: string; receivedAt: string })[]> {
  let names: string[];
  try {
    names = (await readdir(dir)).filter((n) => /^\d+-\d+\.eml$/.test(n));
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return [];
    throw err;
  }
  names.sort((a, b) => b.localeCompare(a, 'en', { numeric: true }));
  return Promise.all(
    names.slice(0, limit).map(async (name) => {
      const id = name.replace(/\.eml$/, '');
      return { ...parseMail(await readFile(join(dir, name))), id, receivedAt: new Date(Number(id.split('-')[0])).toISOString() };
    }),
  );
}
