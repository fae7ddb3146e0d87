/**
 * A small MIME reader for the mails the demo's fake SMTP server catches (nodemailer's own
 * output: plain, multipart/alternative, quoted-printable, base64, encoded-word subjects).
 * Not a general mail parser; good enough to show our own mails in the demo mailbox.
 */

export interface ParsedMail {
  from: string;
  to: string;
  subject: string;
  text: string;
  html: string;
}

type Headers = Map<string, string>;

function splitHeaderBody(raw: string): { headers: Headers; body: string } {
  const norm = raw.replace(/\r\n/g, '\n');
  const idx = norm.indexOf('\n\n');
  const head = idx === -1 ? norm : norm.slice(0, idx);
  const body = idx === -1 ? '' : norm.slice(idx + 2);
  const headers: Headers = new Map();
  const unfolded = head.replace(/\n[ \t]+/g, ' ');
  for (const line of unfolded.split('\n')) {
    const c = line.indexOf(':');
    if (c <= 0) continue;
    const k = line.slice(0, c).trim().toLowerCase();
    if (!headers.has(k)) headers.set(k, line.slice(c + 1).trim());
  }
  return { headers, body };
}

function decodeBytes(bytes: Uint8Array, charset: string): string {
  try {
    return new TextDecoder(charset || 'utf-8').decode(bytes);
  } catch {
    return new TextDecoder('utf-8').decode(bytes);
  }
}

function qpToBytes(s: string, header = false): Uint8Array {
  const src = header ? s.replace(/_/g, ' ') : s.replace(/=\n/g, '');
  const out: number[] = [];
  for (let i = 0; i < src.length; i++) {
    const ch = src[i]!;
    if (ch === '=' && /^[0-9A-Fa-f]{2}$/.test(src.slice(i + 1, i + 3))) {
      out.push(parseInt(src.slice(i + 1, i + 3), 16));
      i += 2;
    } else {
      const code = ch.charCodeAt(0);
      if (code < 128) out.push(code);
      else out.push(...new TextEncoder().encode(ch));
    }
  }
  return new Uint8Array(out);
}

function base64ToBytes(s: string): Uint8Array {
  return new Uint8Array(Buffer.from(s.replace(/\s+/g, ''), 'base64'));
}

/** Decode RFC 2047 encoded words (=?utf-8?Q?...?= / =?utf-8?B?...?=). */
export function decodeWords(s: string): string {
  return s
    .replace(/(\?=)\s+(=\?)/g, '$1$2')
    .replace(/=\?([^?]+)\?([QqBb])\?([^?]*)\?=/g, (_m, cs: string, enc: string, text: string) =>
      decodeBytes(enc.toUpperCase() === 'B' ? base64ToBytes(text) : qpToBytes(text, true), cs),
    );
}

function param(value: string, name: string): string | undefined {
  const m = new RegExp(`${name}\\s*=\\s*(?:"([^"]*)"|([^;\\s]+))`, 'i').exec(value);
  return m ? (m[1] ?? m[2]) : undefined;
}

function decodePart(headers: Headers, body: string): string {
  const cte = (headers.get('content-transfer-encoding') ?? '7bit').toLowerCase();
  const charset = param(headers.get('content-type') ?? '', 'charset') ?? 'utf-8';
  if (cte === 'quoted-printable') return decodeBytes(qpToBytes(body), charset);
  if (cte === 'base64') return decodeBytes(base64ToBytes(body), charset);
  return body;
}

function walk(headers: Headers, body: string, out: { text: string; html: string }, depth = 0) {
  const ct = (headers.get('content-type') ?? 'text/plain').toLowerCase();
  if (ct.startsWith('multipart/') && depth < 5) {
    const boundary = param(headers.get('content-type') ?? '', 'boundary');
    if (!boundary) return;
    const parts = body.split(`--${boundary}`);
    for (const p of parts.slice(1)) {
      if (p.startsWith('--')) break;
      const sub = splitHeaderBody(p.replace(/^\n/, ''));
      walk(sub.headers, sub.body.replace(/\n$/, ''), out, depth + 1);
    }
    return;
  }
  if (ct.startsWith('text/html')) out.html ||= decodePart(headers, body);
  else if (ct.startsWith('text/plain')) out.text ||= decodePart(headers, body);
}

export function parseMail(raw: string): ParsedMail {
  const { headers, body } = splitHeaderBody(raw);
  const out = { text: '', html: '' };
  walk(headers, body, out);
  return {
    from: decodeWords(headers.get('from') ?? ''),
    to: decodeWords(headers.get('to') ?? ''),
    subject: decodeWords(headers.get('subject') ?? ''),
    text: out.text.trim(),
    html: out.html.trim(),
  };
}
