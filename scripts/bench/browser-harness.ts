/**
 * Shared plumbing of the browser bench cases: build a static Vite harness page that imports
 * the app's real modules, serve it on loopback, and launch Debian's headless Chromium.
 */
import http from 'node:http';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const repoRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

export interface HarnessOptions {
  /** Folder of the harness page (index.html + entry), relative to the repository root. */
  dir: string;
  /** Extra module aliases (shims for Next-only modules), before the "@/" alias. */
  aliases?: { find: string | RegExp; replacement: string }[];
  /** Run the app's PostCSS (Tailwind) over the harness CSS. @default false */
  css?: boolean;
}

/** Builds the harness into bench-out/<name of dir> and returns that folder. */
export async function buildHarness(opts: HarnessOptions): Promise<string> {
  const { build } = await import('vite');
  const root = path.join(repoRoot, opts.dir);
  const outDir = path.join(repoRoot, 'bench-out', path.basename(opts.dir));
  await build({
    root,
    base: './',
    logLevel: 'error',
    configFile: false,
    resolve: { alias: [...(opts.aliases ?? []), { find: /^@\//, replacement: `${repoRoot}/` }] },
    ...(opts.css ? { css: { postcss: repoRoot } } : {}),
    define: { 'process.env.NODE_ENV': '"production"' },
    worker: { format: 'es' },
    build: { outDir, emptyOutDir: true, minify: true, sourcemap: false },
  });
  return outDir;
}

const TYPES: Record<string, string> = {
  '.html': 'text/html',
  '.js': 'text/javascript',
  '.css': 'text/css',
  '.woff2': 'font/woff2',
  '.svg': 'image/svg+xml',
};

/** Serves a folder on a free loopback port. */
export function serveStatic(dir: string): Promise<{ url: string; close: () => Promise<void> }> {
  const server = http.createServer((req, res) => {
    const p = path.join(dir, decodeURIComponent(new URL(req.url ?? '/', 'http://x').pathname));
    const file = p.endsWith('/') ? path.join(p, 'index.html') : p;
    if (!file.startsWith(dir) || !fs.existsSync(file)) {
      res.writeHead(404).end();
      return;
    }
    res.writeHead(200, { 'content-type': TYPES[path.extname(file)] ?? 'application/octet-stream' });
    fs.createReadStream(file).pipe(res);
  });
  return new Promise((resolve) => {
    server.listen(0, '127.0.0.1', () => {
      const a = server.address();
      const port = typeof a === 'object' && a ? a.port : 0;
      resolve({ url: `http://127.0.0.1:${port}/`, close: () => new Promise((r) => server.close(() => r())) });
    });
  });
}

/** Debian's headless Chromium (never a downloaded browser). */
export async function launchChromium() {
  const { chromium } = await import('@playwright/test');
  return chromium.launch({
    executablePath: '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-dev-shm-usage', '--no-first-run', '--disable-background-networking'],
  });
}
