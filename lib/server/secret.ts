/**
 * The next-auth secret. NEXTAUTH_SECRET when set; otherwise (demo mode or development) a
 * random secret generated once and kept in `<dataDir>/auth-secret` (mode 0600), so sessions
 * survive restarts. In production without demo mode, NEXTAUTH_SECRET is required (several
 * instances must share one secret).
 */
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { getDataDir } from './data-dir';

export function isDemoMode(): boolean {
  return process.env.EDGEFIELD_DEMO === '1' || process.env.EDGEFIELD_DEMO === 'true';
}

let cached: string | undefined;

export function getAuthSecret(): string {
  if (process.env.NEXTAUTH_SECRET) return process.env.NEXTAUTH_SECRET;
  if (cached) return cached;
  if (process.env.NODE_ENV === 'production' && !isDemoMode()) {
    throw new Error(
      'Edgefield: NEXTAUTH_SECRET is not set. Set it to a long random string (for example `openssl rand -base64 32`), ' +
        'or run in demo mode (EDGEFIELD_DEMO=1), where a secret is generated under the data directory.',
    );
  }
  const file = path.join(getDataDir(), 'auth-secret');
  try {
    cached = fs.readFileSync(file, 'utf8').trim();
  } catch {
    fs.mkdirSync(path.dirname(file), { recursive: true });
    const secret = crypto.randomBytes(32).toString('base64url');
    try {
      fs.writeFileSync(file, secret, { mode: 0o600, flag: 'wx' });
      cached = secret;
    } catch {
      cached = fs.readFileSync(file, 'utf8').trim();
    }
  }
  if (!cached) throw new Error(`Edgefield: the secret file ${file} is empty; delete it to generate a new one.`);
  return cached;
}
