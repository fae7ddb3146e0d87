import 'server-only';
/**
 * Server side of drawing import and measured data (issue 7): the upload is read with a size
 * cap, parsed again on the server with the same readers the dialog used (the browser's
 * preview is never trusted), turned into a checked section, and stored with its original
 * file. Any refusal happens before anything is written, and the section, its first revision,
 * the original file and their audit events are stored in one transaction.
 */
import { getDb } from '@/db/client';
import { insertSectionFile, type FileKind } from '@/db/queries/files';
import { insertSection } from '@/db/queries/sections';
import { ImportError, MAX_DRAWING_BYTES, drawingToSection, readDrawing } from '@/lib/import';
import { importRequestSchema } from '@/lib/validations/import';
import { ApiError, readBodyBytes } from './http';

const FORM_OVERHEAD = 64 * 1024;

export interface ImportedSectionOut {
  sectionId: string;
  revisionId: string;
  warnings: string[];
  counts: { conductors: number; dielectrics: number; ignored: number };
}

/** Read a multipart upload (fields `file` and `options`) with a size cap. */
export async function readImportForm(req: Request): Promise<{ file: File; options: unknown }> {
  const type = req.headers.get('content-type') ?? '';
  if (!type.toLowerCase().startsWith('multipart/form-data')) {
    throw new ApiError(415, 'unsupported_media_type', 'Send the drawing as multipart/form-data with the fields "file" and "options".');
  }
  const bytes = await readBodyBytes(req, MAX_DRAWING_BYTES + FORM_OVERHEAD);
  let form: FormData;
  try {
    form = await new Response(bytes as BodyInit, { headers: { 'content-type': type } }).formData();
  } catch {
    throw new ApiError(400, 'bad_form', 'The upload could not be read as a form.');
  }
  const file = form.get('file');
  if (!(file instanceof File)) throw new ApiError(422, 'invalid', 'file: choose an SVG or DXF drawing to import.', 'file');
  if (file.size > MAX_DRAWING_BYTES) {
    throw new ApiError(413, 'too_large', `The file is ${(file.size / 1048576).toFixed(1)} MB; drawings may be at most 2 MB.`);
  }
  const raw = form.get('options');
  let options: unknown;
  try {
    options = JSON.parse(typeof raw === 'string' ? raw : '');
  } catch {
    throw new ApiError(422, 'invalid', 'options: the import options are missing or not JSON.', 'options');
  }
  return { file, options };
}

/** Parse, map, check and store: a new section whose first revision is the imported drawing. */
export async function importDrawingAsSection(args: { workspaceId: string; userId: string; file: File; options: unknown }): Promise<ImportedSectionOut> {
  const parsed = importRequestSchema.safeParse(args.options);
  if (!parsed.success) {
    const i = parsed.error.issues[0]!;
    const field = ['options', ...i.path.map(String)].join('.');
    throw new ApiError(422, 'invalid', `${field}: ${i.message}`, field);
  }
  const name = args.file.name || 'drawing';
  const ext = /\.([a-z0-9]+)$/i.exec(name)?.[1]?.toLowerCase();
  if (ext && ext !== 'svg' && ext !== 'dxf') {
    throw new ApiError(415, 'unsupported_media_type', `"${name}" is not a drawing Edgefield can import: choose an SVG (.svg) or DXF (.dxf) file.`, 'file');
  }
  const data = new Uint8Array(await args.file.arrayBuffer());
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(data);
  } catch {
    throw new ApiError(422, 'import_failed', `"${name}" is not a text file; only SVG and ASCII DXF drawings can be imported.`, 'file');
  }
  let built;
  let kind: FileKind;
  try {
    const drawing = readDrawing(name, text, data.byteLength);
    kind = drawing.kind === 'svg' ? 'drawing-svg' : 'drawing-dxf';
    const { name: _n, description: _d, ...opts } = parsed.data;
    built = drawingToSection(drawing, opts);
  } catch (e) {
    if (e instanceof ImportError) throw new ApiError(422, 'import_failed', e.message, 'file');
    throw e;
  }
  // Section, first revision, original file and their audit events commit together or not at all.
  const db = await getDb();
  const { section, revision } = await db.transaction(async (tx) => {
    const created = await insertSection(
      {
        workspaceId: args.workspaceId,
        authorId: args.userId,
        name: parsed.data.name,
        description: parsed.data.description,
        content: built.section,
        message: `Imported from ${name}`,
      },
      tx,
    );
    await insertSectionFile(
      {
        workspaceId: args.workspaceId,
        sectionId: created.section.id,
        kind,
        name,
        mediaType: kind === 'drawing-svg' ? 'image/svg+xml' : 'image/vnd.dxf',
        data,
        uploadedBy: args.userId,
      },
      tx,
    );
    return created;
  });
  return { sectionId: section.id, revisionId: revision.id, warnings: built.warnings, counts: built.counts };
}
