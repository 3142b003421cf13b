// The bridge's side of the server: signed in as the technician (the same session a browser tab has), it waits
// for the bench's requests and sends the meter's answers back. Every rule is the server's; this only carries.
import { benchMeterNextResponse, createReadingResponse, problemSchema, type BenchMeterJob, type CreateReadingResponse } from '@splitscope/contract';

export type SendResult = { ok: true; reading: CreateReadingResponse } | { ok: false; retry: boolean; message: string };

export class ServerLink {
  private cookie = '';
  constructor(private readonly base: string) {}

  private async call(method: string, path: string, body?: unknown, signal?: AbortSignal): Promise<Response> {
    const res = await fetch(new URL(path, this.base), {
      method,
      headers: { ...(body === undefined ? {} : { 'content-type': 'application/json' }), ...(this.cookie ? { cookie: this.cookie } : {}) },
      body: body === undefined ? undefined : JSON.stringify(body),
      signal,
    });
    const set = res.headers.get('set-cookie');
    if (set) this.cookie = set.split(';')[0]!;
    return res;
  }

  private static async problem(res: Response): Promise<string> {
    const text = await res.text();
    try {
      const p = problemSchema.parse(JSON.parse(text));
      return p.detail ?? p.title;
    } catch {
      return `${res.status} ${text.slice(0, 200)}`;
    }
  }

  async signIn(email: string, password: string): Promise<void> {
    const res = await this.call('POST', '/api/auth/sign-in', { email, password });
    if (res.status !== 204) throw new Error(`sign-in as ${email} refused: ${await ServerLink.problem(res)}`);
  }

  /** The request to serve: a new one, the same one still waiting (`after`), or null when none is waiting. */
  async next(after: string | undefined, instrument: string, signal: AbortSignal): Promise<BenchMeterJob | null> {
    const q = new URLSearchParams({ wait: '20', instrument, ...(after ? { after } : {}) });
    const res = await this.call('GET', `/api/bench-meter/next?${q}`, undefined, signal);
    if (!res.ok) throw new Error(await ServerLink.problem(res));
    return benchMeterNextResponse.parse(await res.json()).request;
  }

  async send(requestId: string, answer: string, instrument: string): Promise<SendResult> {
    let res: Response;
    try {
      res = await this.call('POST', `/api/bench-meter/requests/${encodeURIComponent(requestId)}/reading`, { answer, instrument });
    } catch (err) {
      return { ok: false, retry: true, message: `the server cannot be reached (${(err as Error).message})` };
    }
    if (res.status === 201) return { ok: true, reading: createReadingResponse.parse(await res.json()) };
    return { ok: false, retry: res.status >= 500 || res.status === 429, message: await ServerLink.problem(res) };
  }
}
