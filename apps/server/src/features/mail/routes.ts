import { Router } from 'express';
import { capturedMailListResponse, capturedMailSchema } from '@splitscope/contract';
import { z } from 'zod';
import { requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { AppError, parse } from '../../http/errors';
import { readCapturedMail } from '../../fakes/smtp-capture';
import { localFakesOn } from './local';

const idParams = z.object({ id: z.string().regex(/^\d+-\d+$/) });

/** The development outbox: what the local SMTP capture server received. Absent when a real relay is used. */
export function mailOutboxRoutes(ctx: AppContext): Router {
  const r = Router();
  r.use('/dev/mail', (_req, _res, next) => {
    if (!localFakesOn(ctx.config)) return next(new AppError('not_found', 'The mail outbox exists only with the local mail capture server'));
    next();
  });
  r.get('/dev/mail', requireRole(...ROLES.admins), async (_req, res) => {
    const all = await readCapturedMail(ctx.config.MAIL_CAPTURE_DIR);
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
    const m = (await readCapturedMail(ctx.config.MAIL_CAPTURE_DIR)).find((x) => x.id === id);
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
