#!/usr/bin/env node
/**
 * `npm run demo`: apply the migrations and seed an empty database with the fictional demo
 * team, its sections and a few stored solves (scripts/seed-demo.ts); build the app if the
 * build is missing or older than the sources; then start it in demo mode (EDGEFIELD_DEMO=1)
 * at http://localhost:${PORT:-3000}. The server starts the demo mail catcher
 * (EDGEFIELD_SMTP_PORT, default 2525) and prints the demo sign-ins.
 *
 * Environment: PORT, EDGEFIELD_DATA_DIR (default ./data), NEXT_DIST_DIR (default .next),
 * DATABASE_URL (optional PostgreSQL server), EDGEFIELD_SMTP_PORT.
 */
import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { APP_SOURCES, newestSourceMtime } from './app-sources.mjs';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
process.chdir(root);

const port = process.env.PORT || '3000';
const distDir = process.env.NEXT_DIST_DIR || '.next';
const env = {
  ...process.env,
  PORT: port,
  EDGEFIELD_DEMO: '1',
  NEXT_TELEMETRY_DISABLED: '1',
  NEXTAUTH_URL: process.env.NEXTAUTH_URL || `http://localhost:${port}`,
};
const nextBin = path.join(root, 'node_modules', 'next', 'dist', 'bin', 'next');

if (!fs.existsSync(nextBin)) {
  console.log('demo: installing packages (npm ci)');
  run('npm', ['ci']);
}

function run(cmd, args) {
  const r = spawnSync(cmd, args, { stdio: 'inherit', env });
  if (r.status !== 0) {
    console.error(`demo: "${cmd} ${args.join(' ')}" failed (exit ${r.status ?? r.signal})`);
    process.exit(r.status || 1);
  }
}

// Migrate and seed before building and serving: the fictional team, its sections and a few
// solved examples (solving takes seconds, so it happens here and not in the server). A data
// folder held by another running Edgefield stops the demo here, with the reason.
console.log('demo: preparing the database (migrations, demo data)');
{
  const r = spawnSync(process.execPath, ['--import', 'tsx', '--conditions=react-server', 'scripts/seed-demo.ts'], {
    stdio: 'inherit',
    env,
  });
  if (r.status === 3) process.exit(1);
  if (r.status !== 0) {
    console.error('demo: preparing the database failed');
    process.exit(r.status || 1);
  }
}

const buildId = path.join(distDir, 'BUILD_ID');
let builtAt = 0;
try {
  builtAt = fs.statSync(buildId).mtimeMs;
} catch {
  /* no build yet */
}
// tsconfig.json too: the demo's build folder is the default one, whose types Next adds to it.
const sourcesAt = newestSourceMtime(root, [...APP_SOURCES, 'tsconfig.json']);
if (!builtAt || sourcesAt > builtAt) {
  console.log(builtAt ? 'demo: sources changed since the last build; building' : 'demo: building the app (first run, about a minute)');
  run(process.execPath, [nextBin, 'build']);
} else {
  console.log(`demo: using the existing build in ${distDir}`);
}

console.log(`demo: starting Edgefield at http://localhost:${port} (demo mode)`);
const child = spawn(process.execPath, [nextBin, 'start', '-p', port], { stdio: 'inherit', env });
for (const sig of ['SIGINT', 'SIGTERM']) process.on(sig, () => child.kill(sig));
child.on('exit', (code, signal) => process.exit(code ?? (signal ? 0 : 1)));
