/**
 * No secrets and no server-only code in the client bundles of a production build.
 *
 *   npx tsx scripts/check-client-bundle.ts [distDir]     (default: $NEXT_DIST_DIR or .next)
 *
 * Reads every file under <distDir>/static (what the browser can download) and fails (exit 1)
 * when one contains: the NEXTAUTH_SECRET or DATABASE_URL of this environment, any auth secret
 * generated under the data folders (data/**\/auth-secret), a private key block, payment
 * service secret prefixes, or the names of server-only modules (db/client, PGlite, bcrypt,
 * nodemailer, smtp-server, node-postgres, the server's own modules).
 * Run by scripts/test.sh right after the production build.
 */
import fs from 'node:fs';
import path from 'node:path';

interface Rule {
  label: string;
  test: (text: string) => boolean;
}

const dist = path.resolve(process.argv[2] || process.env.NEXT_DIST_DIR || '.next');
const staticDir = path.join(dist, 'static');
if (!fs.existsSync(staticDir)) {
  console.error(`check-client-bundle: ${staticDir} does not exist (build first).`);
  process.exit(2);
}

function files(dir: string): string[] {
  const out: string[] = [];
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...files(p));
    else out.push(p);
  }
  return out;
}

/** Auth secrets generated in demo/dev mode under any data folder beside the checkout. */
function generatedSecrets(): string[] {
  const found: string[] = [];
  const roots = [process.env.EDGEFIELD_DATA_DIR, 'data'].filter((x): x is string => !!x);
  const seen = new Set<string>();
  const walk = (d: string, depth: number) => {
    if (depth > 3 || seen.has(d)) return;
    seen.add(d);
    let entries: fs.Dirent[];
    try {
      entries = fs.readdirSync(d, { withFileTypes: true });
    } catch {
      return;
    }
    for (const e of entries) {
      const p = path.join(d, e.name);
      if (e.isFile() && e.name === 'auth-secret') {
        const s = fs.readFileSync(p, 'utf8').trim();
        if (s.length >= 16) found.push(s);
      } else if (e.isDirectory() && e.name !== 'pglite') walk(p, depth + 1);
    }
  };
  for (const r of roots) walk(path.resolve(r), 0);
  return found;
}

const literal = (label: string, needle: string): Rule => ({ label, test: (t) => t.includes(needle) });
const rules: Rule[] = [
  { label: 'a private key block', test: (t) => /-----BEGIN [A-Z ]*PRIVATE KEY-----/.test(t) },
  { label: 'a live payment-service secret key', test: (t) => /\bsk_live_[A-Za-z0-9]{8,}/.test(t) },
  { label: 'a payment-service test secret key', test: (t) => /\bsk_test_[A-Za-z0-9_]{8,}/.test(t) },
  { label: 'a webhook signing secret', test: (t) => /\bwhsec_[A-Za-z0-9_-]{8,}/.test(t) },
  { label: 'a postgres connection URL', test: (t) => /postgres(ql)?:\/\/[^\s"'`]*@/.test(t) },
  literal('the name DATABASE_URL', 'DATABASE_URL'),
  literal('the name NEXTAUTH_SECRET', 'NEXTAUTH_SECRET'),
  literal('the PGlite package', '@electric-sql/pglite'),
  { label: 'the PGlite database code', test: (t) => /\bnew PGlite\b|pglite\.wasm|pglite\.data/i.test(t) },
  literal('the server-only module db/client', 'db/client'),
  literal('the server-only module lib/server', 'lib/server/'),
  literal('the node-postgres driver', 'pg-connection-string'),
  literal('bcrypt password hashing', 'bcryptjs'),
  literal('the mail sender', 'nodemailer'),
  literal('the fake SMTP server', 'smtp-server'),
];
for (const [name, v] of [
  ['NEXTAUTH_SECRET', process.env.NEXTAUTH_SECRET],
  ['DATABASE_URL', process.env.DATABASE_URL],
] as const) {
  if (v && v.length >= 8) rules.push(literal(`the value of ${name}`, v));
}
for (const s of generatedSecrets()) rules.push(literal('a generated auth secret (data/**/auth-secret)', s));

const all = files(staticDir);
const problems: string[] = [];
for (const f of all) {
  const text = fs.readFileSync(f).toString('latin1');
  for (const r of rules) if (r.test(text)) problems.push(`${path.relative(process.cwd(), f)}: ${r.label}`);
}
if (problems.length) {
  console.error(`check-client-bundle: ${problems.length} problem(s) in ${path.relative(process.cwd(), staticDir)}:`);
  for (const p of problems) console.error(`  ${p}`);
  process.exit(1);
}
console.log(`check-client-bundle: ${all.length} files under ${path.relative(process.cwd(), staticDir)}, ${rules.length} checks, nothing found.`);
