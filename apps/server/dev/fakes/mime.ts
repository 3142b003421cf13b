// A small reader for the MIME messages the server sends (nodemailer output): headers, multipart bodies,
// base64 / quoted-printable parts and encoded-word headers. Enough for the development mail outbox and the
// tests; not a general-purpose mail parser.

export interface MimePart {
  headers: Map<string, string>;
  contentType: string;
  params: Record<string, string>;
  body: Buffer;
  parts: MimePart[];
}

export interface ParsedMail {
  messageId: string | null;
  from: string;
  to: string[];
  subject: string;
  date: string | null;
  text: string | null;
  html: string | null;
  attachments: { filename: string; contentType: string; content: Buffer }[];
}

function splitHead(raw: Buffer): { head: string; body: Buffer } {
  const s = raw.toString('latin1');
  const m = /\r?\n\r?\n/.exec(s);
  if (!m) return { head: s, body: Buffer.alloc(0) };
  return { head: s.slice(0, m.index), body: raw.subarray(m.index + m[0].length) };
}

function parseHeaders(head: string): Map<string, string> {
  const headers = new Map<string, string>();
  for (const line of head.replace(/\r?\n[ \t]+/g, ' ').split(/\r?\n/)) {
    const i = line.indexOf(':');
    if (i <= 0) continue;
    const name = line.slice(0, i).trim().toLowerCase();
    if (!headers.has(name)) headers.set(name, line.slice(i + 1).trim());
  }
  return headers;
}

function parseParams(value: string): { value: string; params: Record<string, string> } {
  const [first, ...rest] = value.split(';');
  const params: Record<string, string> = {};
  for (const p of rest) {
    const i = p.indexOf('=');
    if (i < 0) continue;
    params[p.slice(0, i).trim().toLowerCase()] = p
      .slice(i + 1)
      .trim()
      .replace(/^"(.*)"$/, '$1');
  }
  return { value: (first ?? '').trim().toLowerCase(), params };
}

function decodeQuotedPrintable(s: string): Buffer {
  const soft = s.replace(/=\r?\n/g, '');
  const bytes: number[] = [];
  for (let i = 0; i < soft.length; i++) {
    const c = soft[i]!;
    if (c === '=' && /^[0-9A-Fa-f]{2}$/.test(soft.slice(i + 1, i + 3))) {
      bytes.push(parseInt(soft.slice(i + 1, i + 3), 16));
      i += 2;
    } else bytes.push(c.charCodeAt(0) & 0xff);
  }
  return Buffer.from(bytes);
}

function decodeBody(body: Buffer, encoding: string | undefined): Buffer {
  switch ((encoding ?? '7bit').toLowerCase()) {
    case 'base64':
      return Buffer.from(body.toString('latin1').replace(/\s+/g, ''), 'base64');
    case 'quoted-printable':
      return decodeQuotedPrintable(body.toString('latin1'));
    default:
      return body;
  }
}

/** RFC 2047 encoded words (=?UTF-8?Q?...?= / =?UTF-8?B?...?=) to text. */
export function decodeWords(value: string): string {
  return value
    .replace(/\?=\s+=\?/g, '?==?')
    .replace(/=\?([^?]+)\?([QqBb])\?([^?]*)\?=/g, (_m, _charset: string, enc: string, text: string) =>
      enc.toUpperCase() === 'B' ? Buffer.from(text, 'base64').toString('utf8') : decodeQuotedPrintable(text.replace(/_/g, ' ')).toString('utf8'),
    );
}

export function parsePart(raw: Buffer): MimePart {
  const { head, body } = splitHead(raw);
  const headers = parseHeaders(head);
  const { value: contentType, params } = parseParams(headers.get('content-type') ?? 'text/plain');
  const part: MimePart = { headers, contentType, params, body: Buffer.alloc(0), parts: [] };
  if (contentType.startsWith('multipart/') && params.boundary) {
    const text = body.toString('latin1');
    const delimiter = `--${params.boundary}`;
    const chunks = text.split(delimiter).slice(1);
    for (const chunk of chunks) {
      if (chunk.startsWith('--')) break; // the closing delimiter
      const content = chunk.replace(/^\r?\n/, '').replace(/\r?\n$/, '');
      part.parts.push(parsePart(Buffer.from(content, 'latin1')));
    }
  } else {
    part.body = decodeBody(body, headers.get('content-transfer-encoding'));
  }
  return part;
}

function addresses(value: string | undefined): string[] {
  if (!value) return [];
  return decodeWords(value)
    .split(',')
    .map((a) => a.trim())
    .filter(Boolean);
}

/** Reads a whole message: the first text and HTML bodies, and every attachment. */
export function parseMail(raw: Buffer): ParsedMail {
  const root = parsePart(raw);
  const mail: ParsedMail = {
    messageId: root.headers.get('message-id') ?? null,
    from: decodeWords(root.headers.get('from') ?? ''),
    to: addresses(root.headers.get('to')),
    subject: decodeWords(root.headers.get('subject') ?? ''),
    date: root.headers.get('date') ?? null,
    text: null,
    html: null,
    attachments: [],
  };
  const visit = (p: MimePart) => {
    if (p.parts.length) return p.parts.forEach(visit);
    const disposition = parseParams(p.headers.get('content-disposition') ?? '');
    const filename = disposition.params.filename ?? p.params.name;
    if (disposition.value === 'attachment' || filename) {
      mail.attachments.push({ filename: decodeWords(filename ?? 'attachment'), contentType: p.contentType, content: p.body });
    } else if (p.contentType === 'text/plain' && mail.text === null) mail.text = p.body.toString('utf8');
    else if (p.contentType === 'text/html' && mail.html === null) mail.html = p.body.toString('utf8');
  };
  visit(root);
  return mail;
}
