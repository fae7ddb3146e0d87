/**
 * Server start-up (called from instrumentation.ts in the Node.js runtime, never at build):
 * open the database and apply migrations (a second process on the same data folder stops
 * here with a clear message), and in demo mode seed an empty database, start the fake SMTP
 * server and print the demo sign-ins.
 */
import { getDbHandle } from '@/db/client';
import { demoMails } from '@/db/schema';
import { demoSignInBanner, seedDemo } from '@/lib/demo/seed';
import { DataDirLockedError } from './data-dir';
import { startFakeSmtp, type FakeSmtp } from './fake-smtp';
import { demoSmtpPort } from './mail';
import { getAuthSecret, isDemoMode } from './secret';

type G = typeof globalThis & { __edgefieldStarted?: Promise<void>; __edgefieldSmtp?: FakeSmtp };
const g = globalThis as G;

export function startServer(): Promise<void> {
  return (g.__edgefieldStarted ??= run());
}

async function run() {
  const port = process.env.PORT || '3000';
  process.env.NEXTAUTH_URL ||= `http://localhost:${port}`;
  let handle;
  try {
    handle = await getDbHandle();
  } catch (e) {
    if (e instanceof DataDirLockedError) {
      console.error(`\n${e.message}\n`);
      process.exit(1);
    }
    throw e;
  }
  console.log(`Edgefield: database ready (${handle.kind}: ${handle.location})`);
  if (!isDemoMode()) {
    getAuthSecret(); // fail early with a clear message when NEXTAUTH_SECRET is missing in production
    return;
  }
  getAuthSecret();
  if (await seedDemo(handle.db)) console.log('Edgefield: demo data seeded');
  if (!g.__edgefieldSmtp) {
    const smtpPort = demoSmtpPort();
    try {
      g.__edgefieldSmtp = await startFakeSmtp({
        port: smtpPort,
        onMail: async (m) => {
          await handle.db.insert(demoMails).values({
            from: m.from,
            to: m.to,
            subject: m.subject,
            text: m.text,
            html: m.html,
            raw: m.raw.slice(0, 200_000),
          });
        },
      });
      console.log(`Edgefield: demo mail catcher on 127.0.0.1:${g.__edgefieldSmtp.port}`);
    } catch (e) {
      console.error(
        `Edgefield: could not start the demo mail catcher on port ${smtpPort} (${(e as Error).message}). ` +
          'Sign-in links will not arrive; set EDGEFIELD_SMTP_PORT to a free port.',
      );
    }
  }
  // Issue 7: the bundled fake payment service (checkout, portal, signed webhooks).
  try {
    const { ensureFakePayments } = await import('./payments');
    if (!process.env.STRIPE_SECRET_KEY) {
      const fake = await ensureFakePayments();
      console.log(`Edgefield: test payment service on ${fake.publicUrl} (no money moves)`);
    }
  } catch (e) {
    console.error(`Edgefield: could not start the test payment service (${(e as Error).message}); set EDGEFIELD_PAYMENTS_PORT to a free port.`);
  }
  console.log(demoSignInBanner(process.env.NEXTAUTH_URL));
}
