/** The body of POST /api/workspaces/[workspaceId]/report (a PDF of a solve, sweep or fringing study). */
import { z } from 'zod';

const cell = z.union([z.string().max(2000), z.number(), z.null()]);
export const reportTableSchema = z.strictObject({
  id: z.string().max(60),
  title: z.string().max(300),
  columns: z.array(z.string().max(200)).max(40),
  rows: z.array(z.array(cell).max(40)).max(500),
  note: z.string().max(4000).optional(),
});

export const reportChartSchema = z.strictObject({
  title: z.string().max(300),
  xLabel: z.string().max(200),
  yLabel: z.string().max(200),
  logX: z.boolean().default(false),
  series: z
    .array(z.strictObject({ name: z.string().max(200), points: z.array(z.tuple([z.number(), z.number()])).max(1000), dashed: z.boolean().optional() }))
    .max(8),
});

export const reportRequestSchema = z.strictObject({
  kind: z.enum(['solve', 'sweep', 'fringing']),
  title: z.string().min(1).max(200),
  /** The section drawn in the report (checked loosely; only its shapes are drawn). */
  section: z.unknown().optional(),
  tables: z.array(reportTableSchema).max(40),
  chart: reportChartSchema.optional(),
  /** PNG data URL of the field picture. */
  fieldImage: z
    .string()
    .max(4_000_000)
    .regex(/^data:image\/png;base64,[A-Za-z0-9+/=]+$/, 'the field picture must be a PNG data URL')
    .optional(),
  method: z.string().max(4000).optional(),
  warnings: z.array(z.string().max(1000)).max(50).optional(),
});
export type ReportRequest = z.infer<typeof reportRequestSchema>;
