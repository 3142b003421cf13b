// The customer e-mails, each in plain text and HTML from one description, so the two never say different
// things. HTML is escaped here and nowhere else.
import { formatMoney, jobStatusLabels, shopCardLines, type JobStatus, type ShopCard } from '@splitscope/contract';

export interface MailContent {
  subject: string;
  text: string;
  html: string;
}

interface Row {
  label: string;
  amount: string;
}

interface Layout {
  shopName: string;
  /** The shop's address, phone, e-mail and tax number under its name, in mail to customers. */
  shopLines?: string[];
  subject: string;
  greeting: string;
  paragraphs: string[];
  rows?: Row[];
  total?: Row;
  action?: { label: string; url: string };
  closing?: string;
}

export const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

function render(l: Layout): MailContent {
  const text: string[] = [l.greeting, ''];
  for (const p of l.paragraphs) text.push(p, '');
  if (l.rows?.length) {
    const width = Math.max(...l.rows.map((r) => r.label.length), l.total?.label.length ?? 0);
    for (const r of l.rows) text.push(`  ${r.label.padEnd(width)}  ${r.amount}`);
    if (l.total) text.push(`  ${''.padEnd(width, '-')}`, `  ${l.total.label.padEnd(width)}  ${l.total.amount}`);
    text.push('');
  }
  if (l.action) text.push(`${l.action.label}: ${l.action.url}`, '');
  text.push(l.closing ?? `${l.shopName}`);
  if (!l.closing) text.push(...(l.shopLines ?? []));

  const e = escapeHtml;
  const rows = l.rows?.length
    ? `<table role="presentation" style="border-collapse:collapse;margin:12px 0">${l.rows
        .map((r) => `<tr><td style="padding:2px 16px 2px 0">${e(r.label)}</td><td style="text-align:right">${e(r.amount)}</td></tr>`)
        .join('')}${
        l.total
          ? `<tr><td style="padding:4px 16px 2px 0;border-top:1px solid #999"><strong>${e(l.total.label)}</strong></td><td style="text-align:right;border-top:1px solid #999"><strong>${e(l.total.amount)}</strong></td></tr>`
          : ''
      }</table>`
    : '';
  const action = l.action
    ? `<p><a href="${e(l.action.url)}" style="display:inline-block;background:#1f4e5f;color:#fff;padding:10px 18px;border-radius:6px;text-decoration:none">${e(l.action.label)}</a></p><p style="font-size:12px;color:#555">Or open this address: ${e(l.action.url)}</p>`
    : '';
  const html = `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${e(l.subject)}</title></head>
<body style="font-family:Arial,Helvetica,sans-serif;color:#1b1b1b;max-width:560px;margin:0 auto;padding:16px">
<p>${e(l.greeting)}</p>
${l.paragraphs.map((p) => `<p>${e(p)}</p>`).join('\n')}
${rows}
${action}
<p>${e(l.closing ?? l.shopName)}${l.closing ? '' : (l.shopLines ?? []).map((s) => `<br><span style="font-size:12px;color:#555">${e(s)}</span>`).join('')}</p>
</body></html>`;
  return { subject: l.subject, text: text.join('\n'), html };
}

export interface DocumentSummary {
  number: string;
  currency: string;
  lines: { description: string; quantity: string; amountCents: number }[];
  subtotalCents: number;
  taxCents: number;
  taxRate: string;
  totalCents: number;
}

export interface JobSummary {
  shop: ShopCard;
  customerName: string;
  jobNumber: number;
  unitDescription: string;
  boardName: string | null;
}

const board = (j: JobSummary) => (j.boardName ? `${j.boardName} from ${j.unitDescription}` : j.unitDescription);

function documentRows(d: DocumentSummary): { rows: Row[]; total: Row } {
  const m = (c: number) => formatMoney(c, d.currency);
  return {
    rows: [
      ...d.lines.map((l) => ({ label: l.quantity === '1' ? l.description : `${l.description} × ${l.quantity}`, amount: m(l.amountCents) })),
      { label: 'Subtotal', amount: m(d.subtotalCents) },
      { label: `Tax (${d.taxRate} %)`, amount: m(d.taxCents) },
    ],
    total: { label: 'Total', amount: m(d.totalCents) },
  };
}

export function quoteMail(job: JobSummary, quote: DocumentSummary & { note: string | null }, link: { url: string; expiresAt: Date }): MailContent {
  return render({
    shopName: job.shop.name,
    shopLines: shopCardLines(job.shop),
    subject: `Quote ${quote.number} for job ${job.jobNumber}: ${job.boardName ?? job.unitDescription}`,
    greeting: `Hello ${job.customerName},`,
    paragraphs: [
      `Here is our quote for repairing the board (${board(job)}), job ${job.jobNumber}.`,
      ...(quote.note ? [quote.note] : []),
      `Please approve or decline it on the job page. The link works until ${link.expiresAt.toISOString().slice(0, 10)} and shows only this job.`,
    ],
    ...documentRows(quote),
    action: { label: 'Review the quote', url: link.url },
  });
}

export function invoiceMail(job: JobSummary, invoice: DocumentSummary, link: { url: string }, reportAttached: boolean): MailContent {
  return render({
    shopName: job.shop.name,
    shopLines: shopCardLines(job.shop),
    subject: `Invoice ${invoice.number} for job ${job.jobNumber}: your board is repaired`,
    greeting: `Hello ${job.customerName},`,
    paragraphs: [
      `The board (${board(job)}), job ${job.jobNumber}, is repaired and passed its verification readings.`,
      reportAttached ? 'The repair report is attached as a PDF and is also on the job page.' : 'The repair report is on the job page.',
      'You can pay the invoice online from the job page.',
    ],
    ...documentRows(invoice),
    action: { label: 'View and pay the invoice', url: link.url },
  });
}

export function paidMail(job: JobSummary, invoice: { number: string; currency: string; paidCents: number }, link: { url: string }): MailContent {
  return render({
    shopName: job.shop.name,
    shopLines: shopCardLines(job.shop),
    subject: `Payment received for invoice ${invoice.number}`,
    greeting: `Hello ${job.customerName},`,
    paragraphs: [`Thank you: we received ${formatMoney(invoice.paidCents, invoice.currency)} for invoice ${invoice.number} (job ${job.jobNumber}).`],
    action: { label: 'Open the job page', url: link.url },
  });
}

const milestoneText: Record<string, string> = {
  received: 'We have received the board and logged it in.',
  diagnosing: 'A technician has started tracing the fault.',
  approved: 'The diagnosis has been reviewed and the repair is going ahead.',
  repaired: 'The faulty part has been replaced; the board is being verified.',
  verified: 'The repaired board passed its verification readings.',
  returned: 'The board has been sent back to you.',
};

export function statusMail(job: JobSummary, status: JobStatus, link: { url: string }): MailContent {
  return render({
    shopName: job.shop.name,
    shopLines: shopCardLines(job.shop),
    subject: `Job ${job.jobNumber}: ${jobStatusLabels[status]}`,
    greeting: `Hello ${job.customerName},`,
    paragraphs: [`An update on the board (${board(job)}), job ${job.jobNumber}.`, milestoneText[status] ?? `Its status is now: ${jobStatusLabels[status]}.`],
    action: { label: 'Open the job page', url: link.url },
  });
}

/** To the shop: the customer's answer on a quote. */
export function quoteDecisionMail(job: JobSummary, quote: { number: string }, decision: 'approved' | 'declined', reason: string | null): MailContent {
  return render({
    shopName: job.shop.name,
    shopLines: shopCardLines(job.shop),
    subject: `Quote ${quote.number} ${decision} by ${job.customerName} (job ${job.jobNumber})`,
    greeting: 'Hello,',
    paragraphs: [
      `${job.customerName} ${decision} quote ${quote.number} for job ${job.jobNumber} (${board(job)}) on the customer page.`,
      ...(decision === 'declined' ? [reason ? `Their reason: ${reason}` : 'They gave no reason.'] : []),
    ],
    closing: 'Splitscope',
  });
}

/** To a person the admin invited: the link to choose a password. */
export function invitationMail(shopName: string, invited: { name: string; role: string }, link: { url: string; expiresAt: Date }): MailContent {
  return render({
    shopName,
    subject: `You are invited to ${shopName} on Splitscope`,
    greeting: `Hello ${invited.name},`,
    paragraphs: [
      `${shopName} has invited you to its Splitscope bench as ${invited.role}.`,
      `Choose your password with the link below. It works once, until ${link.expiresAt.toISOString().slice(0, 16).replace('T', ' ')} UTC.`,
    ],
    action: { label: 'Choose a password', url: link.url },
  });
}

/** To a person who asked to reset their password. */
export function passwordResetMail(shopName: string, name: string, link: { url: string; minutes: number }): MailContent {
  return render({
    shopName,
    subject: `Reset your Splitscope password (${shopName})`,
    greeting: `Hello ${name},`,
    paragraphs: [
      `Someone asked to reset the password of your account at ${shopName}. If it was you, choose a new password with the link below; it works once, for ${link.minutes} minutes.`,
      'If it was not you, ignore this message: your password stays as it is.',
    ],
    action: { label: 'Choose a new password', url: link.url },
  });
}
