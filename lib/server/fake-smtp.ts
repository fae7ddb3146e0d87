/**
 * The demo's fake SMTP server (smtp-server): listens on 127.0.0.1 only, accepts every mail
 * without authentication, never relays, and hands each message to `onMail` (the demo stores
 * them in demo_mails, shown at /demo/mailbox). Started by lib/server/startup.ts in demo mode.
 */
import { SMTPServer } from 'smtp-server';
import { parseMail, type ParsedMail } from './mime';

/** Largest accepted message, bytes. */
const MAX_MESSAGE_BYTES = 2 * 1024 * 1024;

export interface FakeSmtp {
  port: number;
  close(): Promise<void>;
}

export async function startFakeSmtp(opts: {
  port: number;
  host?: string;
  onMail: (mail: ParsedMail & { raw: string; envelopeTo: string[] }) => Promise<void>;
}): Promise<FakeSmtp> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    banner: 'Edgefield demo mail catcher',
    size: MAX_MESSAGE_BYTES,
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      let size = 0;
      stream.on('data', (c: Buffer) => {
        size += c.length;
        if (size <= MAX_MESSAGE_BYTES) chunks.push(c);
      });
      stream.on('end', () => {
        if (size > MAX_MESSAGE_BYTES) return callback(new Error('Message too large'));
        const raw = Buffer.concat(chunks).toString('utf8');
        const parsed = parseMail(raw);
        const envelopeTo = session.envelope.rcptTo.map((r) => r.address);
        opts
          .onMail({ ...parsed, to: parsed.to || envelopeTo.join(', '), raw, envelopeTo })
          .then(() => callback())
          .catch((e: unknown) => callback(e instanceof Error ? e : new Error(String(e))));
      });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port, opts.host ?? '127.0.0.1', () => {
      server.off('error', reject);
      resolve();
    });
  });
  server.on('error', (e) => console.error('Edgefield demo SMTP:', e));
  const addr = server.server.address();
  return {
    port: typeof addr === 'object' && addr ? addr.port : opts.port,
    close: () => new Promise<void>((r) => server.close(() => r())),
  };
}
