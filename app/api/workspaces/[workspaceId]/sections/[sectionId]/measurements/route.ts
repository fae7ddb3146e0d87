import { getSectionFile, insertSectionFile, listSectionFiles } from '@/db/queries/files';
import { getSectionRow } from '@/db/queries/sections';
import { ImportError, MAX_CSV_BYTES, parseMeasuredCsv } from '@/lib/import';
import { requireWorkspaceRole } from '@/lib/server/access';
import { ApiError, apiHandler, json, notFound, parseSearchParams, readBodyBytes, type RouteCtx, readParams } from '@/lib/server/http';
import { measurementQuerySchema } from '@/lib/validations/import';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string; sectionId: string }>;

/** Measured capacitance data kept with a section, parsed (any member). */
export const GET = apiHandler(async (_req: Request, ctx: Ctx) => {
  const { workspaceId, sectionId } = await readParams(ctx);
  await requireWorkspaceRole(workspaceId, 'viewer');
  if (!(await getSectionRow(workspaceId, sectionId))) throw notFound('The section');
  const list = await listSectionFiles(workspaceId, sectionId, 'measured-csv');
  const measurements = [];
  for (const item of list) {
    const f = await getSectionFile(workspaceId, sectionId, item.id);
    if (!f) continue;
    const data = parseMeasuredCsv(new TextDecoder().decode(f.data));
    measurements.push({ ...item, data });
  }
  return json({ measurements });
});

/**
 * Upload measured data as CSV (editors): body text/csv (≤ 1 MB), ?name=<file name>. The
 * CSV is checked (header with units, numbers only) before it is stored; 422 names the row
 * and column of the first problem.
 */
export const POST = apiHandler(async (req: Request, ctx: Ctx) => {
  const { workspaceId, sectionId } = await readParams(ctx);
  const { user } = await requireWorkspaceRole(workspaceId, 'editor');
  const { name } = parseSearchParams(req, measurementQuerySchema);
  const section = await getSectionRow(workspaceId, sectionId);
  if (!section || section.deletedAt) throw notFound('The section');
  const type = (req.headers.get('content-type') ?? '').toLowerCase();
  if (!type.startsWith('text/csv') && !type.startsWith('text/plain') && !type.startsWith('application/octet-stream')) {
    throw new ApiError(415, 'unsupported_media_type', 'Send measured data as text/csv.');
  }
  const bytes = await readBodyBytes(req, MAX_CSV_BYTES);
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    throw new ApiError(422, 'import_failed', `"${name}" is not a UTF-8 text file.`, 'file');
  }
  let data;
  try {
    data = parseMeasuredCsv(text, bytes.byteLength);
  } catch (e) {
    if (e instanceof ImportError) throw new ApiError(422, 'import_failed', e.message, 'file');
    throw e;
  }
  const row = await insertSectionFile({ workspaceId, sectionId, kind: 'measured-csv', name, mediaType: 'text/csv', data: bytes, uploadedBy: user.id });
  return json({ measurement: { id: row.id, name, createdAt: row.createdAt, rows: data.x.length, parameter: data.parameter, series: data.series.map((s) => ({ name: s.name, unit: s.unit })) } }, 201);
});
