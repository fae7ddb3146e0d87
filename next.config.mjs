/**
 * Next.js configuration for Edgefield.
 * - distDir: each helper, the e2e run and production use their own build folder (NEXT_DIST_DIR).
 * - serverExternalPackages: PGlite ships WASM + data files that must be loaded from node_modules.
 * - typescript.ignoreBuildErrors: see below; `npm run typecheck` is the type gate.
 * - headers(): security headers on every response (see securityHeaders below).
 * @type {import('next').NextConfig}
 */

const isDev = process.env.NODE_ENV !== 'production';

/**
 * Content security policy. Everything Edgefield loads is its own: scripts and chunks from
 * /_next, the solver and analysis Web Workers (bundled chunks; blob: kept for workers created
 * from blobs), fonts bundled by next/font, images drawn to canvas/exported as data:/blob: URLs.
 * 'unsafe-inline' for scripts is needed by Next's inline bootstrap scripts without a per-request
 * nonce (a nonce would make every page dynamic); styles are inline from React/Konva.
 * 'unsafe-eval' only in development (React's dev tooling). No page may be framed.
 */
const csp = [
  "default-src 'self'",
  `script-src 'self' 'unsafe-inline'${isDev ? " 'unsafe-eval'" : ''}`,
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "font-src 'self' data:",
  `connect-src 'self'${isDev ? ' ws: wss:' : ''}`,
  "worker-src 'self' blob:",
  "object-src 'none'",
  "base-uri 'self'",
  "frame-ancestors 'none'",
  "form-action 'self'",
].join('; ');

/**
 * No COOP/COEP: the solver's SharedArrayBuffer cancel flag is used only when the page is
 * cross-origin isolated and otherwise falls back to ending the worker (lib/client/solver-client.ts),
 * so the headers stay consistent with that (nothing depends on isolation).
 * Strict-Transport-Security belongs to the TLS-terminating proxy (it must not be sent over plain http).
 */
const securityHeaders = [
  { key: 'Content-Security-Policy', value: csp },
  { key: 'X-Frame-Options', value: 'DENY' },
  { key: 'X-Content-Type-Options', value: 'nosniff' },
  { key: 'Referrer-Policy', value: 'strict-origin-when-cross-origin' },
  { key: 'Permissions-Policy', value: 'camera=(), microphone=(), geolocation=(), payment=(), usb=()' },
  { key: 'Cross-Origin-Resource-Policy', value: 'same-origin' },
];

const nextConfig = {
  async headers() {
    return [{ source: '/:path*', headers: securityHeaders }];
  },
  distDir: process.env.NEXT_DIST_DIR || '.next',
  serverExternalPackages: ['@electric-sql/pglite', 'pdfkit'],
  typedRoutes: false,
  // Types are checked once, by `npm run typecheck` (first step of scripts/test.sh and CI), over
  // the whole tree including tests; the build does not repeat it (it doubled build time here).
  typescript: { ignoreBuildErrors: true },
  poweredByHeader: false,
  reactStrictMode: true,
};

export default nextConfig;
