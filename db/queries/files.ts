import 'server-only';
import { and, desc, eq } from 'drizzle-orm';
import { getDb, type DbOrTx } from '../client';
import { files, users } from '../schema';
import { insertAuditEvent } from './audit';

/** Kinds of files kept with a section. */
export type FileKind = 'drawing-svg' | 'drawing-dxf' | 'measured-csv';

export interface FileListItem {
  id: string;
  sectionId: string | null;
  kind: FileKind;
  name: string;
  mediaType: string;
  bytes: number;
  createdAt: Date;
  uploadedBy: { id: string; name: string } | null;
}

const listColumns = {
  id: files.id,
  sectionId: files.sectionId,
  kind: files.kind,
  name: files.name,
  mediaType: files.mediaType,
  bytes: files.bytes,
  createdAt: files.createdAt,
  uploaderId: users.id,
  uploaderName: users.name,
  uploaderEmail: users.email,
};

type ListRow = { [K in keyof typeof listColumns]: unknown } & Record<string, unknown>;

function toItem(r: ListRow): FileListItem {
  return {
    id: r.id as string,
    sectionId: (r.sectionId as string | null) ?? null,
    kind: r.kind as FileKind,
    name: r.name as string,
    mediaType: r.mediaType as string,
    bytes: r.bytes as number,
    createdAt: r.createdAt as Date,
    uploadedBy: r.uploaderId ? { id: r.uploaderId as string, name: ((r.uploaderName ?? r.uploaderEmail) as string) ?? '' } : null,
  };
}

/** Files kept with a section, newest first (without their bytes). */
export async function listSectionFiles(workspaceId: string, sectionId: string, kind?: FileKind): Promise<FileListItem[]> {
  const db = await getDb();
  const where = [eq(files.workspaceId, workspaceId), eq(files.sectionId, sectionId)];
  if (kind) where.push(eq(files.kind, kind));
  const rows = await db
    .select(listColumns)
    .from(files)
    .leftJoin(users, eq(users.id, files.uploadedBy))
    .where(and(...where))
    .orderBy(desc(files.createdAt), desc(files.id));
  return rows.map((r) => toItem(r as ListRow));
}

/** One file of a section of this workspace, with its bytes, or null. */
export async function getSectionFile(workspaceId: string, sectionId: string, fileId: string) {
  const db = await getDb();
  const [row] = await db
    .select()
    .from(files)
    .where(and(eq(files.id, fileId), eq(files.workspaceId, workspaceId), eq(files.sectionId, sectionId)))
    .limit(1);
  return row ?? null;
}

/**
 * Keep a file with a section: the file row and its audit event in one transaction (a nested
 * one, i.e. a savepoint, when `db` is already a transaction, so an import can store its
 * section, first revision and original file together).
 */
export async function insertSectionFile(
  data: { workspaceId: string; sectionId: string; kind: FileKind; name: string; mediaType: string; data: Uint8Array; uploadedBy: string },
  db?: DbOrTx,
) {
  const d = db ?? (await getDb());
  return d.transaction(async (tx) => {
    const [row] = await tx
      .insert(files)
      .values({ ...data, bytes: data.data.byteLength })
      .returning({ id: files.id, createdAt: files.createdAt });
    await insertAuditEvent(tx, {
      workspaceId: data.workspaceId,
      actorId: data.uploadedBy,
      action: data.kind === 'measured-csv' ? 'section.measurements' : 'section.import',
      targetType: 'section',
      targetId: data.sectionId,
      data: { fileId: row!.id, name: data.name, kind: data.kind, bytes: data.data.byteLength },
    });
    return row!;
  });
}
