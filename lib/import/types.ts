/**
 * Geometry brought in from a drawing file (SVG or DXF), before it becomes a section.
 * Coordinates are in the drawing's own units with y pointing up (SVG's y-down is flipped
 * by the SVG reader). Plain data, no DOM: the same readers run in the browser (preview and
 * mapping dialog) and on the server (the import route checks everything again).
 */

export type DrawingKind = 'svg' | 'dxf';

export type ImportedShape =
  | { type: 'rect'; layer: string; source: string; x: number; y: number; width: number; height: number }
  | { type: 'circle'; layer: string; source: string; cx: number; cy: number; r: number }
  | { type: 'polygon'; layer: string; source: string; points: [number, number][] };

export interface LayerSummary {
  name: string;
  shapes: number;
}

export interface ImportedDrawing {
  kind: DrawingKind;
  shapes: ImportedShape[];
  layers: LayerSummary[];
  /** Things that were skipped or approximated, one sentence each. */
  warnings: string[];
  /** Units the file declares, when it does (DXF $INSUNITS, SVG width/height with a unit). */
  declaredUnits?: 'm' | 'mm' | 'um' | 'mil' | 'in';
  bbox: { xmin: number; ymin: number; xmax: number; ymax: number } | null;
}

/** A drawing could not be read; the message names what is wrong and where. */
export class ImportError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ImportError';
  }
}

/** Largest drawing file accepted (bytes). */
export const MAX_DRAWING_BYTES = 2 * 1024 * 1024;
/** Largest measured-data CSV accepted (bytes). */
export const MAX_CSV_BYTES = 1024 * 1024;
/** Segments used to flatten a full circle of a curve (arcs, ellipses, Béziers use proportional counts). */
export const CURVE_SEGMENTS = 48;
