import nodemailer, { type Transporter } from 'nodemailer';
import type { Config } from '../../config';
import type { Db } from '../../db/client';
import { eq } from 'drizzle-orm';
import { mailLog, shops } from '../../db/schema';
import { AppError } from '../../http/errors';
import { newId } from '../../lib/ids';
import { localFakesOn } from './local';

const transports = new WeakMap<Config, Transporter>();

/** One SMTP transport per configuration (pooled connections to the relay). */
export function mailerFor(config: Config): Transporter {
  let t = transports.get(config);
  if (!t) {
    const local = localFakesOn(config);
    t = nodemailer.createTransport({
      host: config.SMTP_HOST,
      port: config.SMTP_PORT,
      secure: config.SMTP_SECURE,
      // the loopback capture server offers no TLS; a real relay gets STARTTLS whenever it offers it
      ignoreTLS: local,
      requireTLS: !local && !config.SMTP_SECURE,
      auth: config.SMTP_USER ? { user: config.SMTP_USER, pass: config.SMTP_PASS ?? '' } : undefined,
      connectionTimeout: 10_000,
      greetingTimeout: 10_000,
      socketTimeout: 20_000,
    });
    transports.set(config, t);
  }
  return t;
}

export interface OutgoingMail {
  shopId: string;
  jobId: string | null;
  /** quote, invoice, paid, quote-decision, status:<milestone> */
  kind: string;
  to: string;
  replyTo?: string | null;
  subject: string;
  text: string;
  html: string;
  attachments?: { filename: string; content: Buffer; contentType: string }[];
}

/** MAIL_FROM's address under the shop's own name, so every message comes from the shop that sends it. */
export function fromForShop(mailFrom: string, shopName: string | undefined): string | { name: string; address: string } {
  const address = /<([^>]+)>/.exec(mailFrom)?.[1] ?? mailFrom.trim();
  return shopName ? { name: shopName, address } : mailFrom;
}

/** Sends one message and logs it (sent or failed) in mail_log; a refusal by the relay becomes a 503. */
export async function sendMail({ config, db, mail }: { config: Config; db: Db; mail: OutgoingMail }): Promise<{ mailId: string; sentAt: Date }> {
  const mailId = newId();
  const [shop] = await db.select({ name: shops.name }).from(shops).where(eq(shops.id, mail.shopId));
  const base = { id: mailId, shopId: mail.shopId, jobId: mail.jobId, kind: mail.kind, to: mail.to, subject: mail.subject };
  try {
    const info = await mailerFor(config).sendMail({
      from: fromForShop(config.MAIL_FROM, shop?.name),
      to: mail.to,
      replyTo: mail.replyTo ?? undefined,
      subject: mail.subject,
      text: mail.text,
      html: mail.html,
      attachments: mail.attachments,
    });
    const sentAt = new Date();
    await db.insert(mailLog).values({ ...base, messageId: info.messageId, status: 'sent', createdAt: sentAt });
    return { mailId, sentAt };
  } catch (err) {
    await db.insert(mailLog).values({ ...base, status: 'failed', error: (err as Error).message.slice(0, 500) });
    throw new AppError('unavailable', 'The mail server did not take the message; nothing was sent. Try again shortly.');
  }
}
