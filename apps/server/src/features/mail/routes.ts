import { Router } from 'express';
import { and, eq, isNotNull } from 'drizzle-orm';
import { capturedMailListResponse, capturedMailSchema } from '@splitscope/contract';
import { z } from 'zod';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { mailLog } from '../../db/schema';
import { AppError, parse } from '../../http/errors';
import { localFakesOn } from './local';

const idParams = z.object({ id: z.string().regex(/^\d+-\d+$/) });

/**
 * What the capture server kept that this shop sent. Each message is tagged with its shop when it is sent: the
 * mail_log row written then holds the shop and the Message-ID, and only messages whose Message-ID is one of
 * the shop's are listed, so one shop's admin never reads another shop's customer links.
 */
async function shopMail(ctx: AppContext, shopId: string) {
  // Development code, loaded only with the local fakes (the routes answer 404 without them).
  const { readCapturedMail } = await import('../../../dev/fakes/smtp-capture');
  const rows = await ctx.db
    .select({ messageId: mailLog.messageId })
    .from(mailLog)
    .where(and(eq(mailLog.shopId, shopId), isNotNull(mailLog.messageId)));
  const ours = new Set(rows.map((r) => r.messageId));
  return (await readCapturedMail(ctx.config.MAIL_CAPTURE_DIR)).filter((m) => m.messageId !== null && ours.has(m.messageId));
}

/** The development outbox: what the local SMTP capture server received. Absent when a real relay is used. */
export function mailOutboxRoutes(ctx: AppContext): Router {
  const r = Router();
  r.use('/dev/mail', (_req, _res, next) => {
    if (!localFakesOn(ctx.config)) return next(new AppError('not_found', 'The mail outbox exists only with the local mail capture server'));
    next();
  });
  r.get('/dev/mail', requireRole(...ROLES.admins), async (req, res) => {
    const all = await shopMail(ctx, actorOf(req).shopId);
    res.json(
      capturedMailListResponse.parse({
        items: all.map((m) => ({
          id: m.id,
          receivedAt: m.receivedAt,
          from: m.from,
          to: m.to,
          subject: m.subject,
          attachments: m.attachments.map((a) => ({ filename: a.filename, contentType: a.contentType, size: a.content.length })),
        })),
      }),
    );
  });
  r.get('/dev/mail/:id', requireRole(...ROLES.admins), async (req, res) => {
    const { id } = parse(idParams, req.params);
    const m = (await shopMail(ctx, actorOf(req).shopId)).find((x) => x.id === id);
    if (!m) throw new AppError('not_found', `No captured message ${id}`);
    res.json(
      capturedMailSchema.parse({
        id: m.id,
        receivedAt: m.receivedAt,
        from: m.from,
        to: m.to,
        subject: m.subject,
        text: m.text,
        html: m.html,
        attachments: m.attachments.map((a) => ({ filename: a.filename, contentType: a.contentType, size: a.content.length })),
      }),
    );
  });
  return r;
}
