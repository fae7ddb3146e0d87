/** Plain JSON shapes of the API's list items as the pages use them (dates as ISO strings). */
export type Role = 'owner' | 'editor' | 'viewer';

export interface SectionItem {
  id: string;
  name: string;
  description: string;
  createdAt: string;
  updatedAt: string;
  deletedAt: string | null;
  latestRevisionId: string | null;
  latestRevisionNumber: number | null;
  createdBy: { id: string; name: string } | null;
  solveCount: number;
}

export interface SolveItem {
  id: string;
  sectionId: string;
  sectionName: string;
  revisionId: string;
  revisionNumber: number;
  status: 'done' | 'failed';
  result: unknown;
  author: { id: string; name: string } | null;
  createdAt: string;
}

export interface SectionDetail {
  id: string;
  name: string;
  description: string;
  createdAt: string;
  updatedAt: string;
  deletedAt: string | null;
  latestRevision: {
    id: string;
    number: number;
    message: string;
    createdAt: string;
    author: { id: string; name: string } | null;
  } | null;
}

/** Dates → ISO strings, the way the JSON API sends them. */
export function toPlain<T>(v: T): unknown {
  return JSON.parse(JSON.stringify(v)) as unknown;
}

export const roleCanEdit = (role: Role) => role === 'owner' || role === 'editor';
