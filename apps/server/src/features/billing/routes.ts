import { Router } from 'express';
import { billingSettingsSchema, jobBillingResponse, sendRequest, sentResponse, updateBillingSettingsRequest } from '@splitscope/contract';
import { z } from 'zod';
import { actorOf, requireRole, ROLES } from '../../auth/guards';
import type { AppContext } from '../../context';
import { parse } from '../../http/errors';
import { findJobInvoices, findJobQuotes } from './documents';
import { getBillingJob } from './jobs';
import { sendStatusMail } from './milestones';
import { getBillingSettings, getSettingsRow, updateBillingSettings } from './settings';

const jobParams = z.object({ jobId: z.string().trim().min(1).max(100) });

export function billingRoutes(ctx: AppContext): Router {
  const r = Router();
  r.get('/billing/settings', requireRole(...ROLES.everyone), async (req, res) => {
    res.json(billingSettingsSchema.parse(await getBillingSettings({ db: ctx.db, shopId: actorOf(req).shopId })));
  });
  r.patch('/billing/settings', requireRole(...ROLES.admins), async (req, res) => {
    const input = parse(updateBillingSettingsRequest, req.body);
    res.json(billingSettingsSchema.parse(await updateBillingSettings({ db: ctx.db, shopId: actorOf(req).shopId, input })));
  });
  r.get('/jobs/:jobId/billing', requireRole(...ROLES.everyone), async (req, res) => {
    const { jobId } = parse(jobParams, req.params);
    const job = await getBillingJob(ctx.db, actorOf(req).shopId, jobId);
    res.json(jobBillingResponse.parse({ jobId: job.id, quotes: await findJobQuotes(ctx.db, job.id), invoices: await findJobInvoices(ctx.db, job.id) }));
  });
  // A status e-mail on demand (the automatic ones follow the shop's milestone settings).
  r.post('/jobs/:jobId/notify', requireRole(...ROLES.bench), async (req, res) => {
    const { jobId } = parse(jobParams, req.params);
    const { to } = parse(sendRequest, req.body);
    const actor = actorOf(req);
    const job = await getBillingJob(ctx.db, actor.shopId, jobId);
    const settings = await getSettingsRow(ctx.db, actor.shopId);
    const sent = await sendStatusMail({
      db: ctx.db,
      config: ctx.config,
      shopId: actor.shopId,
      jobId,
      status: job.status,
      validDays: settings.linkValidDays,
      replyTo: settings.replyTo,
      to,
      createdBy: actor.id,
    });
    res.json(sentResponse.parse({ mailId: sent.mailId, to: to ?? job.customer.email, sentAt: sent.sentAt.toISOString() }));
  });
  return r;
}
