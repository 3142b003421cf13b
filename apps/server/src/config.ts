import { randomBytes } from 'node:crypto';
import { z } from 'zod';
import { localFakesOn } from './features/mail/local';

// Every variable the server reads, parsed once at start-up. `.env.example` documents each one.
const schema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  /** `demo`: the invented demo shop (seeded by `npm start`); `shop`: a real shop, set up on the first-run page. */
  SPLITSCOPE_MODE: z.enum(['demo', 'shop']).default('demo'),
  HOST: z.string().default('127.0.0.1'),
  PORT: z.coerce.number().int().min(0).max(65535).default(5180), // 0: any free port (tests)
  DATABASE_URL: z.string().url({ message: 'must be a postgres:// URL' }),
  /** Connections the server keeps to PostgreSQL; more than the cores, since most of a request waits on the database. */
  DB_POOL_SIZE: z.coerce.number().int().min(1).max(200).default(20),
  /** Threads that run the diagnosis engine beside the request thread; one leaves a core for requests on two. */
  DIAGNOSIS_WORKERS: z.coerce.number().int().min(1).max(16).default(1),
  /**
   * `0`: build no fault dictionaries (diagnoses simulate as before). The browser-test run sets it, since a build
   * takes a core for a minute per board version and the specs publish board copies by the dozen.
   */
  FAULT_DICTIONARIES: z
    .enum(['0', '1'])
    .default('1')
    .transform((v) => v === '1'),
  /** Where the built web app lives; served on the same port in production. */
  WEB_DIST: z.string().optional(),
  UPLOAD_DIR: z.string().default('.data/uploads'),
  UPLOAD_MAX_BYTES: z.coerce
    .number()
    .int()
    .positive()
    .default(20 * 1024 * 1024),
  /** The address people reach the app at; used for links in e-mail and the Origin check. */
  PUBLIC_URL: z.string().url().optional(),
  LOGIN_RATE_LIMIT: z.coerce.number().int().positive().default(10),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().min(1).max(65535).default(2525),
  /** A real relay: `SMTP_SECURE=1` for implicit TLS (port 465); otherwise STARTTLS is used when offered. */
  SMTP_SECURE: z
    .enum(['0', '1'])
    .default('0')
    .transform((v) => v === '1'),
  SMTP_USER: z.string().optional(),
  SMTP_PASS: z.string().optional(),
  MAIL_FROM: z.string().default('Splitscope Demo Repair <bench@demo.test>'),
  /** Where the local SMTP capture server keeps what it receives (the development outbox reads it). */
  MAIL_CAPTURE_DIR: z.string().default('.data/mail'),
  /**
   * `1`: run the local SMTP capture server and fake payment API in-process on SMTP_PORT / PAYMENTS_PORT.
   * Default on, except in production with a payment key that is not the local fake's.
   */
  LOCAL_FAKES: z.enum(['0', '1']).optional(),
  PAYMENTS_HOST: z.string().default('127.0.0.1'),
  PAYMENTS_PORT: z.coerce.number().int().min(1).max(65535).default(12111),
  PAYMENTS_PROTOCOL: z.enum(['http', 'https']).default('http'),
  PAYMENTS_SECRET_KEY: z.string().default('sk_test_local_fake'),
  /**
   * The payment service's webhook signing secret. Required outside the local fakes; with them, a random one is
   * made for each run and shared with the fake payment service in the same process.
   */
  PAYMENTS_WEBHOOK_SECRET: z.string().trim().min(1).optional(),
  LOG_REQUESTS: z
    .enum(['0', '1'])
    .default('0')
    .transform((v) => v === '1'),
});

export type Config = Omit<z.infer<typeof schema>, 'PAYMENTS_WEBHOOK_SECRET'> & { PAYMENTS_WEBHOOK_SECRET: string };

// Values printed in the repository and its history: anyone can sign or call with them, so they count as none.
const PUBLISHED = new Set(['whsec_local_fake', 'sk_test_local_fake']);

export class ConfigError extends Error {}

/** Parses the environment; a bad value stops start-up with a list of what is wrong. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = schema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new ConfigError(`invalid configuration:\n${lines.join('\n')}`);
  }
  const c = parsed.data;
  if (localFakesOn(c)) return { ...c, PAYMENTS_WEBHOOK_SECRET: c.PAYMENTS_WEBHOOK_SECRET ?? `whsec_${randomBytes(32).toString('base64url')}` };
  // Against the hosted payment service a forged `checkout.session.completed` would mark invoices paid: the
  // server does not start on a secret anyone could know.
  const missing: string[] = [];
  if (!c.PAYMENTS_WEBHOOK_SECRET || PUBLISHED.has(c.PAYMENTS_WEBHOOK_SECRET))
    missing.push('  PAYMENTS_WEBHOOK_SECRET: the signing secret of the payment webhook (required without LOCAL_FAKES=1)');
  if (PUBLISHED.has(c.PAYMENTS_SECRET_KEY)) missing.push('  PAYMENTS_SECRET_KEY: the payment service key (required without LOCAL_FAKES=1)');
  if (missing.length) throw new ConfigError(`invalid configuration:\n${missing.join('\n')}`);
  return { ...c, PAYMENTS_WEBHOOK_SECRET: c.PAYMENTS_WEBHOOK_SECRET! };
}
