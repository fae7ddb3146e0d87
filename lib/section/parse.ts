/**
 * From a section file's text to a checked, resolved section: the one function the CLI,
 * the API and the editor's import use. Stages, each stopping at its first failure:
 *   1. JSON syntax (errors with line and column),
 *   2. the zod schema (issues like `shapes[2] (id "top"): width: must be a finite number`),
 *   3. resolving variables and expressions,
 *   4. checkSection (errors block; warnings are returned with a valid section).
 */
import type { z } from 'zod';
import { sectionSchema, type ResolvedSection, type Section } from './schema';
import { resolveSection } from './resolve';
import { checkSection } from './check';
import { locateJsonError } from './json-locate';
import { summariseIssues, type SectionIssue } from './issues';

export type { SectionIssue } from './issues';

/** Largest section file accepted, in characters. */
export const MAX_SECTION_FILE_CHARS = 5_000_000;

export type ParseSectionResult =
  | { ok: true; section: Section; resolved: ResolvedSection; warnings: SectionIssue[] }
  | {
      ok: false;
      /** One or a few lines for people; names what is wrong and where. */
      message: string;
      issues: SectionIssue[];
      /** Which stage failed. */
      stage: 'read' | 'json' | 'schema' | 'resolve' | 'check';
    };

function typeOfValue(v: unknown): string {
  if (v === undefined) return 'nothing';
  if (v === null) return 'null';
  if (Array.isArray(v)) return 'a list';
  if (typeof v === 'number') return Number.isFinite(v) ? `the number ${v}` : 'a number that is not finite';
  if (typeof v === 'string') return v.length > 40 ? 'a long string' : `the string ${JSON.stringify(v)}`;
  if (typeof v === 'object') return 'an object';
  return typeof v;
}

function valueAt(root: unknown, path: readonly PropertyKey[]): unknown {
  let cur: unknown = root;
  for (const p of path) {
    if (cur === null || typeof cur !== 'object') return undefined;
    cur = (cur as Record<PropertyKey, unknown>)[p];
  }
  return cur;
}

/** `shapes[2] (id "top"): width` for a zod path, naming the shape, net or material. */
export function describeZodPath(root: unknown, path: readonly PropertyKey[]): string {
  let out = '';
  for (let k = 0; k < path.length; k++) {
    const p = path[k]!;
    if (typeof p === 'number') {
      out += `[${p}]`;
      const parent = path[k - 1];
      if (k === 1 && (parent === 'shapes' || parent === 'materials' || parent === 'nets')) {
        const item = valueAt(root, path.slice(0, k + 1));
        if (item && typeof item === 'object') {
          const o = item as Record<string, unknown>;
          const key = parent === 'nets' ? 'name' : 'id';
          if (typeof o[key] === 'string') out += ` (${key} ${JSON.stringify(o[key])})`;
        }
        if (k < path.length - 1) out += ':';
      }
    } else {
      const name = String(p);
      out += out === '' ? name : out.endsWith(':') ? ` ${name}` : `.${name}`;
    }
  }
  return out;
}

function zodIssueText(root: unknown, issue: z.core.$ZodIssue): string {
  const got = valueAt(root, issue.path);
  switch (issue.code) {
    case 'invalid_type':
      if (got === undefined) return 'is missing';
      if (issue.expected === 'number' && typeof got === 'number') return 'must be a finite number';
      return `must be ${issue.expected === 'array' ? 'a list' : issue.expected === 'object' ? 'an object' : `a ${issue.expected}`} (got ${typeOfValue(got)})`;
    case 'invalid_union': {
      if ('discriminator' in issue && issue.discriminator) {
        const opts = (issue as { options?: unknown[] }).options ?? [];
        return `must be one of ${opts.map((o) => JSON.stringify(o)).join(', ')} (got ${typeOfValue(got)})`;
      }
      const branches = issue.errors.flat();
      // A value field: number or expression.
      if (branches.length === 2 && branches.every((b) => b.code === 'invalid_type')) {
        if (got === undefined) return 'is missing';
        if (typeof got === 'number') return 'must be a finite number';
        return `must be a number or an expression string (got ${typeOfValue(got)})`;
      }
      const custom = branches.find((b) => b.code !== 'invalid_type');
      if (custom) return custom.message;
      return issue.message;
    }
    case 'invalid_value':
      if (issue.values.length === 1) return `must be ${JSON.stringify(issue.values[0])} (got ${typeOfValue(got)})`;
      return `must be one of ${issue.values.map((v) => JSON.stringify(v)).join(', ')} (got ${typeOfValue(got)})`;
    case 'unrecognized_keys':
      return `unknown field${issue.keys.length > 1 ? 's' : ''} ${issue.keys.map((k) => JSON.stringify(k)).join(', ')}`;
    case 'invalid_key':
      return `bad name: ${issue.issues[0]?.message ?? issue.message}`;
    case 'too_small':
    case 'too_big':
      if (issue.message.startsWith('Too ') || issue.message.startsWith('Invalid')) {
        const rel = issue.code === 'too_small' ? (issue.inclusive ? 'at least' : 'more than') : issue.inclusive ? 'at most' : 'less than';
        const what = issue.origin === 'array' ? ' items' : issue.origin === 'string' ? ' characters' : '';
        return `must be ${rel} ${String(issue.code === 'too_small' ? issue.minimum : issue.maximum)}${what}`;
      }
      return issue.message;
    default:
      return issue.message;
  }
}

/** Turn zod issues into section issues with readable messages. */
export function formatZodIssues(root: unknown, issues: readonly z.core.$ZodIssue[]): SectionIssue[] {
  return issues.map((issue) => {
    const where = describeZodPath(root, issue.path);
    const text = zodIssueText(root, issue);
    const shapeIndex = issue.path[0] === 'shapes' && typeof issue.path[1] === 'number' ? issue.path[1] : undefined;
    const shapeId = shapeIndex !== undefined ? valueAt(root, ['shapes', shapeIndex, 'id']) : undefined;
    const out: SectionIssue = {
      severity: 'error',
      code: 'schema',
      message: where ? `${where}: ${text}` : text,
      path: issue.path.filter((p): p is string | number => typeof p !== 'symbol'),
    };
    if (typeof shapeId === 'string') out.shapeIds = [shapeId];
    return out;
  });
}

function failure(stage: Exclude<ParseSectionResult, { ok: true }>['stage'], lead: string, issues: SectionIssue[]): ParseSectionResult {
  const lines = issues.filter((i) => i.severity === 'error').map((i) => i.message);
  const shown = lines.slice(0, 8);
  const more = lines.length > shown.length ? `\n  … and ${lines.length - shown.length} more` : '';
  const message = lines.length <= 1 ? `${lead}: ${summariseIssues(issues)}` : `${lead} (${lines.length} problems):\n  ${shown.join('\n  ')}${more}`;
  return { ok: false, message, issues, stage };
}

/** Validate, resolve and check an already-parsed value (for example a request body). */
export function parseSectionValue(value: unknown): ParseSectionResult {
  if (value === null || typeof value !== 'object' || Array.isArray(value)) {
    const issue: SectionIssue = { severity: 'error', code: 'schema', message: `expected a JSON object with "format": "edgefield.section/1", got ${typeOfValue(value)}` };
    return failure('schema', 'not a section', [issue]);
  }
  const fmt = (value as Record<string, unknown>).format;
  if (fmt !== 'edgefield.section/1') {
    const issue: SectionIssue = {
      severity: 'error',
      code: 'schema',
      message:
        fmt === undefined
          ? '"format" is missing: an Edgefield section starts with "format": "edgefield.section/1"'
          : `"format" must be "edgefield.section/1" (got ${typeOfValue(fmt)})`,
      path: ['format'],
    };
    return failure('schema', 'not an Edgefield section', [issue]);
  }
  const parsed = sectionSchema.safeParse(value);
  if (!parsed.success) return failure('schema', 'not a valid section', formatZodIssues(value, parsed.error.issues));
  const section = parsed.data;
  const resolved = resolveSection(section);
  if (!resolved.ok) return failure('resolve', 'the section has values that cannot be evaluated', resolved.issues);
  const issues = checkSection(resolved.section);
  if (issues.some((i) => i.severity === 'error')) return failure('check', 'the section cannot be solved', issues);
  return { ok: true, section, resolved: resolved.section, warnings: issues };
}

/** Parse a section file's text. Never throws. */
export function parseSectionFile(text: string): ParseSectionResult {
  if (typeof text !== 'string') {
    return failure('read', 'cannot read the file', [{ severity: 'error', code: 'read', message: 'the file is not text' }]);
  }
  if (text.length > MAX_SECTION_FILE_CHARS) {
    return failure('read', 'cannot read the file', [
      { severity: 'error', code: 'too-large', message: `the file has ${text.length} characters; a section file may have at most ${MAX_SECTION_FILE_CHARS}` },
    ]);
  }
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  if (body.trim() === '') return failure('json', 'not JSON', [{ severity: 'error', code: 'json', message: 'the file is empty' }]);
  let value: unknown;
  try {
    value = JSON.parse(body);
  } catch (e) {
    const where = locateJsonError(body);
    const message = where
      ? `line ${where.line}, column ${where.column}: ${where.message}`
      : `the text is not valid JSON (${e instanceof Error ? e.message : String(e)})`;
    return failure('json', 'not valid JSON', [{ severity: 'error', code: 'json', message }]);
  }
  return parseSectionValue(value);
}
