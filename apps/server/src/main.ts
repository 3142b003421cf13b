import { ConfigError, loadConfig } from './config';
import { startBillingServices } from './features/billing/services';
import { startServer } from './server';

try {
  const config = loadConfig();
  const running = await startServer(config);
  console.log(`splitscope: server listening on ${running.url}`);
  const { upgrade } = running;
  if (upgrade.upgraded) console.log(`splitscope: ${upgrade.upgraded} stored board model version(s) upgraded to the current schema`);
  for (const f of upgrade.failed)
    console.error(`splitscope: board model version ${f.versionId} could not be upgraded (${f.message}); jobs on it will refuse to load its board`);
  // The status e-mail sweep, and with LOCAL_FAKES the SMTP capture server and the fake payment API.
  const billing = await startBillingServices(running.ctx, running.url);
  const stop = () =>
    void billing
      .stop()
      .then(() => running.close())
      .then(() => process.exit(0));
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
} catch (err) {
  if (err instanceof ConfigError) console.error(`splitscope: ${err.message}`);
  else if ((err as NodeJS.ErrnoException).code === 'EADDRINUSE') console.error(`splitscope: the port is already in use (${(err as Error).message})`);
  else console.error('splitscope: server failed to start:', err);
  process.exit(1);
}
