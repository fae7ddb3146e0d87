/**
 * The compressed field blob of a solve (lib/field/codec.ts, "EFLD" v1).
 * GET (viewer and up): the stored bytes. PUT (editor and up): store them once; the header,
 * the sizes against the stored result's mesh and signal nets, the compressed stream, the
 * checksum and the values are all checked first, so a corrupted, oversized or mismatched
 * upload is refused with a clear 4xx and nothing stored changes. The store itself is a
 * conditional update (`field is null`): of two concurrent uploads one gets 201 and the other
 * 409 field_exists, and the stored field never changes afterwards.
 */
import { getSolve, getSolveFieldInfoWithRole, getSolveFieldWithRole, storeSolveField } from '@/db/queries/solves';
import { readAsViewer, requireWorkspaceRole } from '@/lib/server/access';
import { ApiError, apiHandler, json, notFound, readBodyBytes, type RouteCtx, readParams } from '@/lib/server/http';
import { decodeFieldBlob, FieldBlobError } from '@/lib/field/codec';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string; solveId: string }>;

/** Largest accepted upload (compressed), bytes. */
const MAX_FIELD_UPLOAD_BYTES = 32 * 1024 * 1024;
const FIELD_EXISTS_MESSAGE = 'This solve already holds its field; a stored solve does not change.';

/**
 * A stored field never changes (solves are immutable and the field is stored once), so its
 * ETag is the solve id and size, and a browser that has it asks with If-None-Match and gets a
 * 304 without the blob being read. Access is checked first either way; the cache is private.
 */
const FIELD_CACHE_CONTROL = 'private, max-age=31536000, immutable';
const fieldEtag = (solveId: string, bytes: number) => `"field-${solveId}-${bytes}"`;

/** True when an If-None-Match header lists `etag` (or is "*"); weak forms compare equal. */
function ifNoneMatchHits(header: string | null, etag: string): boolean {
  if (!header) return false;
  return header.split(',').some((t) => {
    const v = t.trim();
    return v === '*' || v === etag || v === `W/${etag}`;
  });
}

export const GET = apiHandler(async (req: Request, ctx: Ctx) => {
  const { workspaceId, solveId } = await readParams(ctx);
  // The role is read in the same query as the field (statuses as requireWorkspaceRole 'viewer' first).
  const ifNoneMatch = req.headers.get('if-none-match');
  if (ifNoneMatch) {
    const { data: info } = await readAsViewer(workspaceId, (userId) => getSolveFieldInfoWithRole(userId, workspaceId, solveId), undefined);
    if (info === undefined) throw notFound('The solve');
    if (!info.hasField) throw new ApiError(404, 'no_field', 'This solve has no stored field.');
    if (info.fieldBytes !== null) {
      const etag = fieldEtag(solveId, info.fieldBytes);
      if (ifNoneMatchHits(ifNoneMatch, etag)) {
        return new Response(null, { status: 304, headers: { etag, 'cache-control': FIELD_CACHE_CONTROL } });
      }
    }
  }
  const { data: field } = await readAsViewer(workspaceId, (userId) => getSolveFieldWithRole(userId, workspaceId, solveId), undefined);
  if (field === undefined) throw notFound('The solve');
  if (field === null) throw new ApiError(404, 'no_field', 'This solve has no stored field.');
  // The bytes as parsed from the database, sent without another copy.
  return new Response(field as Uint8Array<ArrayBuffer>, {
    status: 200,
    headers: {
      'content-type': 'application/octet-stream',
      'content-length': String(field.byteLength),
      etag: fieldEtag(solveId, field.byteLength),
      // a stored field never changes (solves are immutable), but access is per user
      'cache-control': FIELD_CACHE_CONTROL,
    },
  });
});

export const PUT = apiHandler(async (req: Request, ctx: Ctx) => {
  const { workspaceId, solveId } = await readParams(ctx);
  const { user } = await requireWorkspaceRole(workspaceId, 'editor');
  const solve = await getSolve(workspaceId, solveId);
  if (!solve) throw notFound('The solve');
  const type = (req.headers.get('content-type') ?? '').split(';')[0]!.trim().toLowerCase();
  if (type !== 'application/octet-stream') {
    throw new ApiError(415, 'unsupported_type', 'Send the field as application/octet-stream.');
  }
  const bytes = await readBodyBytes(req, MAX_FIELD_UPLOAD_BYTES);
  if (solve.status !== 'done' || !solve.result) {
    throw new ApiError(409, 'no_result', 'Only a finished solve with a result can hold a field.');
  }
  if (solve.hasField) {
    throw new ApiError(409, 'field_exists', FIELD_EXISTS_MESSAGE);
  }
  const result = solve.result as { mesh?: { nx?: unknown; ny?: unknown; nodes?: unknown }; nets?: unknown };
  const nx = Number(result.mesh?.nx);
  const ny = Number(result.mesh?.ny);
  const fields = Array.isArray(result.nets) ? result.nets.length : NaN;
  if (!Number.isInteger(nx) || !Number.isInteger(ny) || !Number.isInteger(fields)) {
    throw new ApiError(409, 'no_mesh', 'The stored result does not describe its mesh, so no field can be checked against it.');
  }
  try {
    decodeFieldBlob(bytes, { nx, ny, fields });
  } catch (e) {
    if (e instanceof FieldBlobError) {
      throw new ApiError(e.code === 'too_large' ? 413 : 422, `field_${e.code}`, `The field upload was refused: ${e.message}.`);
    }
    throw e;
  }
  const stored = await storeSolveField(workspaceId, solveId, user.id, bytes);
  if (stored === 'not_found') throw notFound('The solve');
  if (stored === 'exists') throw new ApiError(409, 'field_exists', FIELD_EXISTS_MESSAGE);
  return json({ stored: true, bytes: bytes.byteLength }, 201);
});
