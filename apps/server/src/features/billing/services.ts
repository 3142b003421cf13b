import type { AppContext } from '../../context';
// Types only: the fakes are development code (apps/server/dev), loaded below only when LOCAL_FAKES is on.
import type { FakePayments } from '../../../dev/fakes/payments';
import type { SmtpCapture } from '../../../dev/fakes/smtp-capture';
import { localFakesOn } from '../mail';
import { startStatusMailer } from './milestones';

export interface BillingServices {
  smtp: SmtpCapture | null;
  payments: FakePayments | null;
  stop(): Promise<void>;
}

/**
 * What runs beside the HTTP server: the status e-mail sweep, and with LOCAL_FAKES the SMTP capture server
 * and the fake payment API on the ports the server's own clients are configured for. A fake whose port is
 * taken (another copy of the app running) is reported and skipped rather than stopping the server.
 */
export async function startBillingServices(ctx: AppContext, serverUrl: string): Promise<BillingServices> {
  const { config } = ctx;
  let smtp: SmtpCapture | null = null;
  let payments: FakePayments | null = null;
  if (localFakesOn(config)) {
    const { startSmtpCapture } = await import('../../../dev/fakes/smtp-capture');
    const { startFakePayments } = await import('../../../dev/fakes/payments');
    try {
      smtp = await startSmtpCapture({ host: config.SMTP_HOST, port: config.SMTP_PORT, dir: config.MAIL_CAPTURE_DIR });
      console.log(`splitscope: local mail capture on smtp://${smtp.host}:${smtp.port} (messages in ${config.MAIL_CAPTURE_DIR})`);
    } catch (err) {
      console.error(`splitscope: local mail capture not started on port ${config.SMTP_PORT}: ${(err as Error).message} (set SMTP_PORT)`);
    }
    try {
      payments = await startFakePayments({
        host: config.PAYMENTS_HOST,
        port: config.PAYMENTS_PORT,
        secretKey: config.PAYMENTS_SECRET_KEY,
        webhookSecret: config.PAYMENTS_WEBHOOK_SECRET,
        webhookUrl: `${serverUrl}/api/webhooks/payments`,
      });
      console.log(`splitscope: local test payment service on ${payments.url}`);
    } catch (err) {
      console.error(`splitscope: local test payment service not started on port ${config.PAYMENTS_PORT}: ${(err as Error).message} (set PAYMENTS_PORT)`);
    }
  }
  const stopMailer = startStatusMailer({ db: ctx.db, config });
  return {
    smtp,
    payments,
    stop: async () => {
      stopMailer();
      await Promise.all([smtp?.close(), payments?.close()]);
    },
  };
}
