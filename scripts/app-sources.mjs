/**
 * What counts as the app's sources when deciding whether a production build is stale (a file
 * there newer than the build's BUILD_ID). Shared by `npm run demo` (scripts/demo.mjs) and the
 * load bench (scripts/bench/load-server.ts).
 */
import fs from 'node:fs';
import path from 'node:path';

/** Folders and files of the app, relative to the repository root. */
export const APP_SOURCES = [
  'app', 'components', 'lib', 'db', 'workers', 'public', 'instrumentation.ts', 'proxy.ts', 'middleware.ts',
  'next.config.mjs', 'package.json', 'package-lock.json', 'postcss.config.mjs', 'tailwind.config.ts',
];

/** Newest modification time (ms) of a file or, recursively, of a folder (node_modules and dot entries skipped); 0 when missing. */
export function newestMtime(p) {
  let st;
  try {
    st = fs.statSync(p);
  } catch {
    return 0;
  }
  if (!st.isDirectory()) return st.mtimeMs;
  let m = 0;
  for (const e of fs.readdirSync(p)) {
    if (e === 'node_modules' || e.startsWith('.')) continue;
    m = Math.max(m, newestMtime(path.join(p, e)));
  }
  return m;
}

/** Newest modification time over `sources` (default APP_SOURCES) below `root`. */
export function newestSourceMtime(root, sources = APP_SOURCES) {
  return Math.max(...sources.map((s) => newestMtime(path.join(root, s))));
}
