/** zod schemas for solve requests. The result is the "edgefield.result/1" JSON (lib/engine/types.ts). */
import { z } from 'zod';
import { RESULT_FORMAT } from '@/lib/engine/types';

/** Largest accepted solve body (settings + result JSON), bytes. */
export const MAX_SOLVE_BODY_BYTES = 4 * 1024 * 1024;

const finite = z.number().finite();
const matrix = z.array(z.array(finite).max(64)).max(64);

/**
 * Structural check of a SectionResult: the parts every view relies on are validated, the
 * rest is kept as sent (loose objects), so the engine may add fields without a server change.
 */
export const sectionResultSchema = z.looseObject({
  format: z.literal(RESULT_FORMAT),
  reference: z.array(z.string().max(200)).max(64),
  nets: z.array(z.string().max(200)).max(64),
  capacitance: z.looseObject({ maxwell: matrix, mutual: matrix.optional(), vacuum: matrix.optional() }),
  errorEstimate: z.looseObject({ relative: z.number().nonnegative() }),
  line: z
    .looseObject({ capacitancePerM: finite, inductancePerM: finite, z0Ohm: finite, epsEff: finite })
    .optional(),
  plates: z.looseObject({ gap: finite, width: finite, gapToWidth: finite, idealPerM: finite, solvedOverIdeal: finite }).optional(),
  mesh: z.looseObject({ nodes: z.number().int().nonnegative() }),
});

export const solveSettingsSchema = z.record(z.string().max(64), z.unknown()).refine(
  (v) => Object.keys(v).length <= 64,
  'at most 64 settings',
);

export const SOLVE_STATUS = ['done', 'failed'] as const;

export const createSolveSchema = z
  .strictObject({
    sectionId: z.string().min(1).max(64),
    revisionId: z.string().min(1).max(64),
    settings: solveSettingsSchema,
    /** Hash of the canonical settings, computed by the client (same revision + hash = same solve). */
    settingsHash: z.string().min(1).max(128).regex(/^[A-Za-z0-9_:.-]+$/, 'letters, digits and _ : . - only'),
    result: sectionResultSchema.nullable().optional(),
    status: z.enum(SOLVE_STATUS),
  })
  .refine((v) => v.status !== 'done' || v.result, { message: 'a finished solve needs its result', path: ['result'] });
export type CreateSolveInput = z.infer<typeof createSolveSchema>;

const isoDate = z
  .string()
  .max(40)
  .refine((s) => !Number.isNaN(Date.parse(s)), 'must be a date such as 2026-05-01 or an ISO timestamp');

export const SOLVE_SORTS = ['created', 'section', 'author'] as const;
export const listSolvesQuerySchema = z.object({
  sectionId: z.string().max(64).optional(),
  authorId: z.string().max(64).optional(),
  from: isoDate.optional(),
  to: isoDate.optional(),
  sort: z.enum(SOLVE_SORTS).default('created'),
  dir: z.enum(['asc', 'desc']).optional(),
  limit: z.coerce.number<number>().int().min(1).max(500).default(100),
});
export type ListSolvesQuery = z.infer<typeof listSolvesQuerySchema>;
