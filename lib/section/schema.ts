/**
 * The Edgefield section format, "edgefield.section/1": the one contract between the
 * editor, the solver, storage, the CLI and the files users keep.
 *
 * Lengths are in the section's `units`. Any length or material value may be a number or
 * an expression string over the section's named `variables` (for example "w/2 + d");
 * `resolveSection` (lib/section/resolve.ts) turns a section into a `ResolvedSection`
 * in which every such value is a plain number.
 *
 * This file holds only the structural schema. Geometric checks that need more than one
 * shape (short circuits, self-intersections, missing reference ...) live in
 * lib/section/check.ts and run on the resolved section.
 */
import { z } from 'zod';

export const SECTION_FORMAT = 'edgefield.section/1' as const;

export const UNITS = ['m', 'mm', 'um', 'mil', 'in'] as const;
export const unitsSchema = z.enum(UNITS);
export type Units = z.infer<typeof unitsSchema>;

/** Metres per one section unit. 1 mil = 25.4 µm, 1 in = 25.4 mm (exact by definition). */
export const METRES_PER_UNIT: Record<Units, number> = {
  m: 1,
  mm: 1e-3,
  um: 1e-6,
  mil: 25.4e-6,
  in: 25.4e-3,
};

/** Size limits; beyond them a section is refused before meshing. */
export const LIMITS = {
  shapes: 2000,
  polygonVertices: 2000,
  totalVertices: 20000,
  nets: 64,
  signalNets: 32,
  materials: 200,
  variables: 200,
  idLength: 64,
  nameLength: 120,
  expressionLength: 200,
} as const;

const idSchema = z
  .string()
  .min(1, 'must not be empty')
  .max(LIMITS.idLength, `must be at most ${LIMITS.idLength} characters`);
const nameSchema = z
  .string()
  .min(1, 'must not be empty')
  .max(LIMITS.nameLength, `must be at most ${LIMITS.nameLength} characters`);

/** A finite number, or an expression over the section's variables. */
export const valueSchema = z.union([
  z.number().finite('must be a finite number'),
  z
    .string()
    .min(1, 'expression must not be empty')
    .max(LIMITS.expressionLength, `expression must be at most ${LIMITS.expressionLength} characters`),
]);
export type Value = z.infer<typeof valueSchema>;
/** A value with a description for the generated JSON Schema (docs/section.schema.json). */
const described = (description: string) => valueSchema.describe(description);
const length = (what: string) => described(`${what}, in the section's units (a number or an expression over the variables)`);

export const materialSchema = z.strictObject({
  id: idSchema,
  name: nameSchema,
  /** Relative permittivity, ≥ 1. */
  epsR: described('relative permittivity εr, at least 1'),
  /** Loss tangent tan δ, ≥ 0. */
  lossTangent: described('loss tangent tan δ, at least 0').optional(),
  /** Typical dielectric strength in kV/mm (a laboratory figure, not a rating). */
  breakdownKVPerMm: described('typical dielectric strength in kV/mm (a laboratory figure, not a rating)').optional(),
  /** Where the values come from, free text (shown in the editor). */
  source: z.string().max(300).optional(),
});
export type Material = z.infer<typeof materialSchema>;

export const netSchema = z.strictObject({
  name: nameSchema,
  role: z.enum(['signal', 'ground']).describe('"ground" nets are the 0 V reference; "signal" nets get a row of the capacitance matrix'),
  /** Conductivity of the net's conductors in S/m; copper (5.8e7) when absent. */
  conductivitySPerM: described("conductivity of the net's conductors in S/m; copper (5.8e7) when absent").optional(),
  /** Display colour, "#rrggbb"; the editor picks one when absent. */
  color: z
    .string()
    .regex(/^#[0-9a-fA-F]{6}$/, 'must be a colour like #1f6feb')
    .optional(),
});
export type Net = z.infer<typeof netSchema>;

const shapeBase = {
  id: idSchema,
  /** Optional label shown in the editor. */
  label: z.string().max(LIMITS.nameLength).optional(),
  /** Net name: the shape is a perfect conductor of that net. */
  conductor: nameSchema.describe('net name: the shape is a perfect conductor of that net').optional(),
  /** Material id: the shape is a dielectric of that material. */
  dielectric: idSchema.describe('material id: the shape is a dielectric of that material').optional(),
};

export const rectSchema = z.strictObject({
  ...shapeBase,
  type: z.literal('rect'),
  /** Lower-left corner. */
  x: length('x of the lower-left corner'),
  y: length('y of the lower-left corner'),
  width: length('width, greater than 0'),
  height: length('height, greater than 0'),
}).describe('axis-aligned rectangle; (x, y) is its lower-left corner');
export const circleSchema = z.strictObject({
  ...shapeBase,
  type: z.literal('circle'),
  cx: length('x of the centre'),
  cy: length('y of the centre'),
  r: length('radius, greater than 0'),
}).describe('disc');
export const ringSchema = z.strictObject({
  ...shapeBase,
  type: z.literal('ring'),
  cx: length('x of the centre'),
  cy: length('y of the centre'),
  rInner: length('inner radius, greater than 0 and smaller than rOuter'),
  rOuter: length('outer radius'),
}).describe('annulus; the hole is not part of the shape');
export const polygonSchema = z.strictObject({
  ...shapeBase,
  type: z.literal('polygon'),
  points: z
    .array(z.tuple([valueSchema, valueSchema]))
    .min(3, 'a polygon needs at least 3 points')
    .max(LIMITS.polygonVertices, `a polygon may have at most ${LIMITS.polygonVertices} points`)
    .describe("corner points [x, y] in the section's units; the polygon closes by itself and must not intersect itself"),
}).describe('closed simple polygon');
/** Axis-aligned conductor of zero thickness (foil, idealised plate). */
export const stripSchema = z.strictObject({
  ...shapeBase,
  type: z.literal('strip'),
  x1: length('x of one end'),
  y1: length('y of one end'),
  x2: length('x of the other end'),
  y2: length('y of the other end (y2 = y1 or x2 = x1: horizontal or vertical)'),
}).describe('conductor of zero thickness (foil, idealised plate), horizontal or vertical');

export const shapeSchema = z
  .discriminatedUnion('type', [rectSchema, circleSchema, ringSchema, polygonSchema, stripSchema])
  .superRefine((s, ctx) => {
    const hasC = s.conductor !== undefined;
    const hasD = s.dielectric !== undefined;
    if (hasC === hasD) {
      ctx.addIssue({
        code: 'custom',
        message: `shape "${s.id}" must have exactly one of "conductor" (a net name) or "dielectric" (a material id)`,
      });
    }
    if (s.type === 'strip' && hasD) {
      ctx.addIssue({
        code: 'custom',
        path: ['dielectric'],
        message: `strip "${s.id}" has zero thickness and can only be a conductor`,
      });
    }
  });
export type Shape = z.infer<typeof shapeSchema>;
export type ShapeType = Shape['type'];

export const boundarySideSchema = z.discriminatedUnion('type', [
  z.strictObject({ type: z.literal('open') }).describe('the field extends to infinity on this side (total charge zero)'),
  z.strictObject({ type: z.literal('ground'), at: length('position of the plane (x for left and right, y for bottom and top)') }).describe('an infinite ground plane along this line, part of the 0 V reference'),
  z.strictObject({ type: z.literal('mirror'), at: length('position of the plane (x for left and right, y for bottom and top)') }).describe('a symmetry plane: no field crosses it; draw only the inner half'),
]);
export type BoundarySide = z.infer<typeof boundarySideSchema>;

export const boundarySchema = z.strictObject({
  left: boundarySideSchema.default({ type: 'open' }),
  right: boundarySideSchema.default({ type: 'open' }),
  bottom: boundarySideSchema.default({ type: 'open' }),
  top: boundarySideSchema.default({ type: 'open' }),
});
export type Boundary = z.infer<typeof boundarySchema>;

export const MESH_PRESETS = ['quick', 'standard', 'precise'] as const;
export const meshSchema = z.strictObject({
  preset: z.enum(MESH_PRESETS).default('standard'),
  /** Expert: finest spacing near edges and corners, in section units. */
  finest: z.number().positive().finite().optional(),
  /** Expert: largest ratio between neighbouring spacings, 1.05 to 2. */
  growth: z.number().min(1.05).max(2).optional(),
  /** Expert: open sides are carried this many structure sizes away, 5 to 1000. */
  extent: z.number().min(5).max(1000).optional(),
});
export type MeshSettings = z.infer<typeof meshSchema>;

const variableNameSchema = z
  .string()
  .regex(/^[A-Za-z_][A-Za-z0-9_]*$/, 'a variable name starts with a letter or _ and holds letters, digits and _')
  .max(40);

export const sectionSchema = z.strictObject({
  format: z.literal(SECTION_FORMAT, { error: `"format" must be "${SECTION_FORMAT}"` }),
  /** Optional title for people. */
  title: z.string().max(200).optional(),
  units: unitsSchema,
  /** Named dimensions: a number, or an expression over other variables. */
  variables: z
    .record(variableNameSchema, valueSchema)
    .refine((v) => Object.keys(v).length <= LIMITS.variables, `at most ${LIMITS.variables} variables`)
    .optional(),
  background: z
    .strictObject({ epsR: valueSchema, lossTangent: valueSchema.optional() })
    .default({ epsR: 1 }),
  materials: z.array(materialSchema).max(LIMITS.materials).default([]),
  nets: z.array(netSchema).min(1, 'a section needs at least one net').max(LIMITS.nets),
  shapes: z.array(shapeSchema).max(LIMITS.shapes, `a section may have at most ${LIMITS.shapes} shapes`),
  boundary: boundarySchema.default({
    left: { type: 'open' },
    right: { type: 'open' },
    bottom: { type: 'open' },
    top: { type: 'open' },
  }),
  mesh: meshSchema.optional(),
});
/** A section as written in a file (values may be expressions). */
export type Section = z.infer<typeof sectionSchema>;
export type SectionInput = z.input<typeof sectionSchema>;

/**
 * Replace every `Value` (number | expression string) in T by `number`, leaving plain
 * string fields (ids, names, type tags) as they are. Optional values stay optional.
 */
type ResolveField<T> = [Exclude<T, undefined>] extends [Value]
  ? [Value] extends [Exclude<T, undefined>]
    ? number | Extract<T, undefined>
    : T
  : ResolveDeep<T>;
type ResolveDeep<T> = T extends readonly (infer U)[]
  ? T extends readonly [unknown, unknown]
    ? [ResolveField<T[0]>, ResolveField<T[1]>]
    : ResolveField<U>[]
  : T extends object
    ? { [K in keyof T]: ResolveField<T[K]> }
    : T;
type Resolved<T> = ResolveDeep<T>;

/** A section in which every value is a number (still in section units). */
export type ResolvedSection = Omit<Resolved<Section>, 'variables'> & {
  variables?: Record<string, number>;
};
export type ResolvedShape = ResolvedSection['shapes'][number];
export type ResolvedMaterial = ResolvedSection['materials'][number];
export type ResolvedNet = ResolvedSection['nets'][number];
export type ResolvedBoundarySide = ResolvedSection['boundary']['left'];
