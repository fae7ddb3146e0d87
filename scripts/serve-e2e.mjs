#!/usr/bin/env node
/**
 * The server of the end-to-end tests (Playwright's webServer): starts the already built app
 * (`next start`, build folder NEXT_DIST_DIR, default .next-e2e) on E2E_PORT (default 3210) in
 * demo mode with a fresh temporary data directory and the fake SMTP server on E2E_SMTP_PORT
 * (default 2725). The data directory is removed when the server stops.
 *
 * Build first: `NEXT_DIST_DIR=.next-e2e npx next build` (scripts/test.sh does it).
 */
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const port = process.env.E2E_PORT || '3210';
const smtpPort = process.env.E2E_SMTP_PORT || '2725';
const distDir = process.env.NEXT_DIST_DIR || '.next-e2e';

if (!fs.existsSync(path.join(root, distDir, 'BUILD_ID'))) {
  console.error(
    `serve-e2e: no production build in ${distDir}. Build it first: NEXT_DIST_DIR=${distDir} npx next build`,
  );
  process.exit(1);
}

const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'edgefield-e2e-'));
const env = {
  ...process.env,
  NODE_ENV: 'production',
  NEXT_TELEMETRY_DISABLED: '1',
  NEXT_DIST_DIR: distDir,
  EDGEFIELD_DEMO: '1',
  EDGEFIELD_DATA_DIR: dataDir,
  EDGEFIELD_SMTP_PORT: smtpPort,
  NEXTAUTH_URL: `http://localhost:${port}`,
  PORT: port,
};
// The tests always run on the embedded database of their own fresh folder.
delete env.DATABASE_URL;
delete env.SMTP_HOST;

console.log(`serve-e2e: http://localhost:${port}, build ${distDir}, data ${dataDir}, fake SMTP :${smtpPort}`);
const nextBin = path.join(root, 'node_modules', 'next', 'dist', 'bin', 'next');
const child = spawn(process.execPath, [nextBin, 'start', '-p', port, '-H', '127.0.0.1'], { cwd: root, env, stdio: 'inherit' });

let cleaned = false;
function cleanup() {
  if (cleaned) return;
  cleaned = true;
  try {
    fs.rmSync(dataDir, { recursive: true, force: true });
  } catch {
    /* best effort */
  }
}

for (const sig of ['SIGINT', 'SIGTERM', 'SIGHUP']) {
  process.on(sig, () => {
    child.kill('SIGTERM');
    setTimeout(() => child.kill('SIGKILL'), 8000).unref();
  });
}
// If whoever started us dies without stopping us (a killed test run), do not linger as an orphan.
const parent = process.ppid;
setInterval(() => {
  if (process.ppid !== parent) {
    console.error('serve-e2e: parent process gone; stopping the server');
    child.kill('SIGTERM');
    setTimeout(() => child.kill('SIGKILL'), 8000).unref();
  }
}, 2000).unref();

child.on('exit', (code, signal) => {
  cleanup();
  process.exit(code ?? (signal ? 0 : 1));
});
