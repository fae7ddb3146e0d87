/**
 * The compressed field blob of a solve (lib/field/codec.ts, "EFLD" v1).
 * GET (viewer and up): the stored bytes. PUT (editor and up): store them once; the header,
 * the sizes against the stored result's mesh and signal nets, the compressed stream, the
 * checksum and the values are all checked first, so a corrupted, oversized or mismatched
 * upload is refused with a clear 4xx and nothing stored changes. The store itself is a
 * conditional update (`field is null`): of two concurrent uploads one gets 201 and the other
 * 409 field_exists, and the stored field never changes afterwards.
 */
import { getSolve, getSolveField, storeSolveField } from '@/db/queries/solves';
import { requireWorkspaceRole } from '@/lib/server/access';
import { ApiError, apiHandler, json, notFound, readBodyBytes, type RouteCtx, readParams } from '@/lib/server/http';
import { decodeFieldBlob, FieldBlobError } from '@/lib/field/codec';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string; solveId: string }>;

/** Largest accepted upload (compressed), bytes. */
const MAX_FIELD_UPLOAD_BYTES = 32 * 1024 * 1024;
const FIELD_EXISTS_MESSAGE = 'This solve already holds its field; a stored solve does not change.';

export const GET = apiHandler(async (_req: Request, ctx: Ctx) => {
  const { workspaceId, solveId } = await readParams(ctx);
  await requireWorkspaceRole(workspaceId, 'viewer');
  const field = await getSolveField(workspaceId, solveId);
  if (field === undefined) throw notFound('The solve');
  if (field === null) throw new ApiError(404, 'no_field', 'This solve has no stored field.');
  return new Response(new Uint8Array(field), {
    status: 200,
    headers: {
      'content-type': 'application/octet-stream',
      'content-length': String(field.byteLength),
      // a stored field never changes (solves are immutable), but access is per user
      'cache-control': 'private, max-age=31536000, immutable',
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
