import 'reflect-metadata';
import { createApp } from './app';
import { loadEnv } from './config/env';
import { createDataSource } from './db/data-source';
import { Mailer } from './modules/mail/mailer';

const env = loadEnv();
const ds = createDataSource(env.DATABASE_URL);
await ds.initialize();
const pending = await ds.showMigrations();
if (pending) {
  console.error('[placewright] the database has pending migrations: run `npm start` (it migrates) or `node --import tsx server/db/migrate.ts`.');
  process.exit(1);
}
const mailer = new Mailer(ds, { smtpUrl: env.SMTP_URL, capturePort: env.SMTP_CAPTURE_PORT, from: env.MAIL_FROM });
await mailer.start();
const app = createApp({ ds, env, mailer });
const server = app.listen(env.PORT, env.HOST, () => {
  const shown = env.HOST === '0.0.0.0' ? 'localhost' : env.HOST;
  console.log(`Placewright is running at http://${shown}:${env.PORT}/`);
  if (!env.SMTP_URL) console.log(`Mail is captured locally (SMTP 127.0.0.1:${mailer.capturePort}); admins read it on the Outbox page.`);
});
// Start the check workers now, so that the first check does not wait for them.
const warmStart = performance.now();
app.locals.services.checks
  .warm()
  .then(() => console.log(`Check workers ready in ${Math.round(performance.now() - warmStart)} ms.`))
  .catch((err) => console.error('[placewright] the check workers did not start; checks will start them on first use:', err));

async function shutdown() {
  server.close();
  await mailer.stop();
  await ds.destroy();
  process.exit(0);
}
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);
