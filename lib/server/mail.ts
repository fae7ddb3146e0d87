/**
 * Outgoing mail through nodemailer.
 *
 * - SMTP_HOST set: that server (SMTP_PORT, default 587; SMTP_USER / SMTP_PASSWORD; TLS on
 *   port 465, STARTTLS when the server offers it; SMTP_FROM as sender).
 * - Otherwise in demo mode: the project's fake SMTP server on 127.0.0.1:EDGEFIELD_SMTP_PORT
 *   (default 2525), whose mails show at /demo/mailbox.
 * - Otherwise: sending fails with a clear message (e-mail is not configured).
 */
import nodemailer, { type Transporter } from 'nodemailer';
import { isDemoMode } from './secret';

export function demoSmtpPort(): number {
  return Number(process.env.EDGEFIELD_SMTP_PORT || 2525);
}

export function mailFrom(): string {
  return process.env.SMTP_FROM || 'Edgefield <no-reply@edgefield.example>';
}

let transport: Transporter | undefined;

export function getMailTransport(): Transporter {
  if (transport) return transport;
  if (process.env.SMTP_HOST) {
    const port = Number(process.env.SMTP_PORT || 587);
    transport = nodemailer.createTransport({
      host: process.env.SMTP_HOST,
      port,
      secure: port === 465,
      auth: process.env.SMTP_USER ? { user: process.env.SMTP_USER, pass: process.env.SMTP_PASSWORD ?? '' } : undefined,
    });
  } else if (isDemoMode()) {
    transport = nodemailer.createTransport({ host: '127.0.0.1', port: demoSmtpPort(), secure: false, ignoreTLS: true });
  } else {
    throw new Error('E-mail is not configured: set SMTP_HOST (and SMTP_PORT, SMTP_USER, SMTP_PASSWORD, SMTP_FROM), or run in demo mode.');
  }
  return transport;
}

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

export async function sendMail(m: OutgoingMail): Promise<void> {
  await getMailTransport().sendMail({ from: mailFrom(), ...m });
}

function escapeHtml(s: string) {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** The sign-in link mail. */
export function signInMail(to: string, url: string): OutgoingMail {
  const host = (() => {
    try {
      return new URL(url).host;
    } catch {
      return 'Edgefield';
    }
  })();
  return {
    to,
    subject: 'Your Edgefield sign-in link',
    text:
      `Sign in to Edgefield (${host}) with this link:\n\n${url}\n\n` +
      `The link works once and expires in 24 hours. If you did not ask for it, ignore this mail.\n`,
    html:
      `<div style="font-family:system-ui,sans-serif;max-width:520px">` +
      `<p style="font-size:16px">Sign in to <strong>Edgefield</strong> (${escapeHtml(host)}).</p>` +
      `<p><a href="${escapeHtml(url)}" style="display:inline-block;padding:10px 16px;background:#0f4c5c;color:#fff;border-radius:6px;text-decoration:none">Sign in</a></p>` +
      `<p style="color:#555;font-size:13px">Or paste this link into your browser:<br>${escapeHtml(url)}</p>` +
      `<p style="color:#555;font-size:13px">The link works once and expires in 24 hours. If you did not ask for it, ignore this mail.</p>` +
      `</div>`,
  };
}
