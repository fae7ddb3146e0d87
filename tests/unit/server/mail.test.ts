/**
 * Demo mail: nodemailer's output read back by our MIME reader, and the fake SMTP server
 * catching a sign-in mail sent the way the app sends it.
 */
import { describe, expect, it } from 'vitest';
import nodemailer from 'nodemailer';
import { parseMail, decodeWords } from '@/lib/server/mime';
import { startFakeSmtp } from '@/lib/server/fake-smtp';
import { signInMail } from '@/lib/server/mail';

const url = 'http://localhost:3000/api/auth/callback/email?callbackUrl=http%3A%2F%2Flocalhost%3A3000%2F&token=abc123&email=a%40b.example';

async function compose(m: nodemailer.SendMailOptions): Promise<string> {
  const t = nodemailer.createTransport({ streamTransport: true, buffer: true, newline: 'unix' });
  const info = await t.sendMail(m);
  return (info.message as Buffer).toString('utf8');
}

describe('MIME reader', () => {
  it('reads subject, addresses, text and html of a multipart mail, decoding quoted-printable', async () => {
    const raw = await compose({ from: 'Edgefield <no-reply@edgefield.example>', ...signInMail('ines.varga@harrowlane.example', url) });
    const m = parseMail(raw);
    expect(m.subject).toBe('Your Edgefield sign-in link');
    expect(m.to).toBe('ines.varga@harrowlane.example');
    expect(m.from).toContain('no-reply@edgefield.example');
    expect(m.text).toContain(url); // the long link survives soft line breaks
    expect(m.html).toContain('href="http://localhost:3000/api/auth/callback/email?callbackUrl=');
  });

  it('decodes non-ASCII subjects and bodies', async () => {
    const raw = await compose({ from: 'a@b.example', to: 'c@d.example', subject: 'Kapazität — 5 µm Spalt', text: 'εr = 4.4, Ø 0.6 mm' });
    const m = parseMail(raw);
    expect(m.subject).toBe('Kapazität — 5 µm Spalt');
    expect(m.text).toBe('εr = 4.4, Ø 0.6 mm');
    expect(decodeWords('=?UTF-8?B?w5xiZXI=?=')).toBe('Über');
  });
});

describe('fake SMTP server', () => {
  it('catches a mail sent through nodemailer the way the demo sends it', async () => {
    const caught: { subject: string; text: string; envelopeTo: string[] }[] = [];
    const server = await startFakeSmtp({ port: 0, onMail: async (m) => void caught.push(m) });
    try {
      const t = nodemailer.createTransport({ host: '127.0.0.1', port: server.port, secure: false, ignoreTLS: true });
      await t.sendMail({ from: 'Edgefield <no-reply@edgefield.example>', ...signInMail('tobias.quill@harrowlane.example', url) });
      expect(caught).toHaveLength(1);
      expect(caught[0]!.subject).toBe('Your Edgefield sign-in link');
      expect(caught[0]!.envelopeTo).toEqual(['tobias.quill@harrowlane.example']);
      expect(caught[0]!.text).toContain('token=abc123');
    } finally {
      await server.close();
    }
  });
});
