/**
 * Reading next-auth's session cookie without next-auth's session endpoint
 * (lib/server/session-token.ts): tokens made by next-auth's own `encode` are read back; forged,
 * foreign-secret and expired ones are not, also once a token has been remembered.
 */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { encode } from 'next-auth/jwt';

vi.mock('server-only', () => ({}));
import { readSessionToken, sessionCookieName, sessionUserId } from '@/lib/server/session-token';

const SECRET = 'bench-secret-for-tests-0123456789abcdef';

afterEach(() => {
  vi.useRealTimers();
  vi.unstubAllEnvs();
});

describe('sessionUserId', () => {
  it('reads the user id of a token made by next-auth, again from memory, and never with another secret', async () => {
    const token = await encode({ token: { sub: 'user-1', email: 'a@harrowlane.example' }, secret: SECRET });
    expect(await sessionUserId(token, SECRET)).toBe('user-1');
    expect(await sessionUserId(token, SECRET)).toBe('user-1');
    expect(await sessionUserId(token, 'another-secret-another-secret-000')).toBeNull();
    expect(await sessionUserId(token, SECRET)).toBe('user-1');
  });

  it('refuses a missing, malformed or altered token and one without a subject', async () => {
    const token = await encode({ token: { sub: 'user-2' }, secret: SECRET });
    expect(await sessionUserId('', SECRET)).toBeNull();
    expect(await sessionUserId('not.a.token', SECRET)).toBeNull();
    const parts = token.split('.');
    const ct = parts[3]!;
    parts[3] = (ct[0] === 'A' ? 'B' : 'A') + ct.slice(1);
    expect(await sessionUserId(parts.join('.'), SECRET)).toBeNull();
    expect(await sessionUserId(await encode({ token: { email: 'x@harrowlane.example' }, secret: SECRET }), SECRET)).toBeNull();
  });

  it('refuses an expired token, and forgets a remembered one when it expires (after next-auth’s 15 s tolerance)', async () => {
    const old = await encode({ token: { sub: 'user-3' }, secret: SECRET, maxAge: -60 });
    expect(await sessionUserId(old, SECRET)).toBeNull();

    vi.useFakeTimers({ toFake: ['Date'] });
    const t0 = new Date('2026-12-02T10:00:00Z');
    vi.setSystemTime(t0);
    const token = await encode({ token: { sub: 'user-4' }, secret: SECRET, maxAge: 100 });
    expect(await sessionUserId(token, SECRET)).toBe('user-4');
    vi.setSystemTime(new Date(t0.getTime() + 110_000)); // within the tolerance
    expect(await sessionUserId(token, SECRET)).toBe('user-4');
    vi.setSystemTime(new Date(t0.getTime() + 130_000));
    expect(await sessionUserId(token, SECRET)).toBeNull();
  });
});

describe('the session cookie', () => {
  it('is named as next-auth names it: secure prefix on an https origin', () => {
    vi.stubEnv('NEXTAUTH_URL', 'https://edgefield.example');
    expect(sessionCookieName(new Headers())).toBe('__Secure-next-auth.session-token');
    vi.stubEnv('NEXTAUTH_URL', 'http://localhost:3000');
    expect(sessionCookieName(new Headers())).toBe('next-auth.session-token');
  });

  it('joins chunks in numeric order as next-auth does', () => {
    const name = 'next-auth.session-token';
    expect(readSessionToken([{ name: 'other', value: 'x' }], name)).toBe('');
    expect(readSessionToken([{ name, value: 'whole' }], name)).toBe('whole');
    expect(
      readSessionToken(
        [
          { name: `${name}.10`, value: 'k' },
          { name: `${name}.2`, value: 'c' },
          { name: `${name}.0`, value: 'a' },
          { name: `${name}.1`, value: 'b' },
        ],
        name,
      ),
    ).toBe('abck');
  });
});
