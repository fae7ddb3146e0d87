/**
 * Finds every server action in the source tree (issue 8), without Next: modules whose first
 * statement is the 'use server' directive (every exported function is an action), and
 * functions with an inline 'use server' directive in their body (reported by file and line).
 */
import fs from 'node:fs';
import path from 'node:path';

export interface ServerActionModule {
  /** Path relative to the scanned root, with forward slashes. */
  file: string;
  /** Exported names ('default' for a default export), in source order. */
  exports: string[];
}

export interface InlineDirective {
  file: string;
  line: number;
}

/** Skipped anywhere. */
const SKIP_ANYWHERE = new Set(['node_modules', '.git']);
/** Skipped at the top of the tree only (tests, the data folder, build and report output). */
const SKIP_AT_ROOT = new Set(['tests', 'data', 'coverage', 'dist', 'out', 'test-results', 'playwright-report']);
const SOURCE = /\.(?:ts|tsx|js|jsx|mjs|cjs|mts|cts)$/;
const DIRECTIVE = /^(['"])use server\1/;
const DIRECTIVE_LINE = /^\s*(['"])use server\1\s*;?\s*$/;

/** Source files under `root`, skipping dependencies, build folders (.next*), and the top-level data and tests folders. */
export function sourceFiles(root: string): string[] {
  const out: string[] = [];
  const walk = (dir: string) => {
    for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
      if (e.isDirectory()) {
        if (SKIP_ANYWHERE.has(e.name) || e.name.startsWith('.next') || (dir === root && SKIP_AT_ROOT.has(e.name))) continue;
        walk(path.join(dir, e.name));
      } else if (SOURCE.test(e.name) && !e.name.endsWith('.d.ts')) {
        out.push(path.join(dir, e.name));
      }
    }
  };
  walk(root);
  return out.sort();
}

/** The source with leading whitespace, comments and a shebang removed. */
function stripLeadingTrivia(src: string): string {
  let s = src.replace(/^\uFEFF/, '').replace(/^#![^\n]*\n/, '');
  for (;;) {
    const t = s.replace(/^\s+/, '');
    if (t.startsWith('//')) {
      const nl = t.indexOf('\n');
      s = nl < 0 ? '' : t.slice(nl + 1);
    } else if (t.startsWith('/*')) {
      const end = t.indexOf('*/');
      s = end < 0 ? '' : t.slice(end + 2);
    } else {
      return t;
    }
  }
}

/** True when the module's first statement is the 'use server' directive. */
export function isServerActionModule(src: string): boolean {
  return DIRECTIVE.test(stripLeadingTrivia(src));
}

/**
 * Exported value names of a module, read from its text. Type-only exports are left out;
 * `export *` is returned as '*' (it cannot be listed without resolving the other module).
 */
export function exportedNames(src: string): string[] {
  const names: string[] = [];
  const add = (n: string) => {
    if (!names.includes(n)) names.push(n);
  };
  // Drop comments so commented-out exports do not count (strings with // are rare in actions).
  const code = src.replace(/\/\*[\s\S]*?\*\//g, '').replace(/(^|[^:'"`])\/\/[^\n]*/g, '$1');
  for (const m of code.matchAll(/\bexport\s+(default\s+)?(?:async\s+)?function\s*\*?\s*([A-Za-z_$][\w$]*)?/g)) add(m[1] ? 'default' : m[2]!);
  for (const m of code.matchAll(/\bexport\s+(?:const|let|var)\s+([A-Za-z_$][\w$]*)/g)) add(m[1]!);
  for (const m of code.matchAll(/\bexport\s+(?:const|let|var)\s*\{([^}]*)\}/g)) {
    for (const part of m[1]!.split(',')) {
      const n = part.split(':').pop()!.split('=')[0]!.trim();
      if (n) add(n);
    }
  }
  for (const m of code.matchAll(/\bexport\s+default\s+(?!async\s+function|function)/g)) if (m) add('default');
  for (const m of code.matchAll(/\bexport\s+class\s+([A-Za-z_$][\w$]*)/g)) add(m[1]!);
  for (const m of code.matchAll(/\bexport\s*\{([^}]*)\}/g)) {
    for (const part of m[1]!.split(',')) {
      const p = part.trim();
      if (!p || p.startsWith('type ')) continue;
      const as = /\bas\s+([A-Za-z_$][\w$]*)$/.exec(p);
      add(as ? as[1]! : p);
    }
  }
  if (/\bexport\s*\*/.test(code)) add('*');
  return names;
}

/** Every 'use server' module and every inline 'use server' directive under `root`. */
export function scanServerActions(root: string): { modules: ServerActionModule[]; inline: InlineDirective[] } {
  const modules: ServerActionModule[] = [];
  const inline: InlineDirective[] = [];
  for (const abs of sourceFiles(root)) {
    const src = fs.readFileSync(abs, 'utf8');
    if (!src.includes('use server')) continue;
    const file = path.relative(root, abs).split(path.sep).join('/');
    const isModule = isServerActionModule(src);
    if (isModule) modules.push({ file, exports: exportedNames(src) });
    const lines = src.split('\n');
    let seenModuleDirective = false;
    lines.forEach((l, i) => {
      if (!DIRECTIVE_LINE.test(l)) return;
      if (isModule && !seenModuleDirective) {
        seenModuleDirective = true; // the module's own directive
        return;
      }
      inline.push({ file, line: i + 1 });
    });
  }
  return { modules, inline };
}
