/**
 * Problems found in a section, shared by the resolver, the checks, the parser, the editor
 * (which marks `shapeIds` on the canvas) and the API (which returns them with a 422).
 */
export type IssuePath = (string | number)[];

export interface SectionIssue {
  /** Errors block solving; warnings are shown but do not. */
  severity: 'error' | 'warning';
  /** Stable machine-readable kind, for example "short-circuit" or "unknown-net". */
  code: string;
  /** One sentence for people that names the shape, net or material concerned. */
  message: string;
  /** Where in the section file, for example ["shapes", 3, "width"]. */
  path?: IssuePath;
  /** Shapes concerned (the editor highlights them). */
  shapeIds?: string[];
  /** Net concerned, where there is one. */
  net?: string;
}

/** "shapes[3].width" from ["shapes", 3, "width"]. */
export function formatIssuePath(path: IssuePath | undefined): string {
  if (!path || path.length === 0) return '';
  let out = '';
  for (const p of path) {
    if (typeof p === 'number') out += `[${p}]`;
    else out += out === '' ? p : `.${p}`;
  }
  return out;
}

export function hasErrors(issues: readonly SectionIssue[]): boolean {
  return issues.some((i) => i.severity === 'error');
}

/** Raised by solveSection (and others) when a section cannot be solved as given. */
export class SectionError extends Error {
  constructor(
    message: string,
    readonly issues: SectionIssue[],
  ) {
    super(message);
    this.name = 'SectionError';
  }
}

/** A short summary of issues for one-line messages: the first error and how many more. */
export function summariseIssues(issues: readonly SectionIssue[]): string {
  const errors = issues.filter((i) => i.severity === 'error');
  const list = errors.length > 0 ? errors : issues;
  if (list.length === 0) return 'no problems';
  const first = list[0]!.message;
  return list.length === 1 ? first : `${first} (and ${list.length - 1} more problem${list.length === 2 ? '' : 's'})`;
}
