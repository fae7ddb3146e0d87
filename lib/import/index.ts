/** Drawing import (SVG, DXF) and measured-data CSV: the only import surface of lib/import. */
export * from './types';
export { readSvg } from './svg';
export { readDxf } from './dxf';
export { drawingToSection, drawingKindOf, importOptionsSchema, layerMappingSchema, type ImportOptions, type LayerMapping, type SectionFromDrawing } from './to-section';
export { parseMeasuredCsv, type MeasuredData } from './measured-csv';

import { readDxf } from './dxf';
import { readSvg } from './svg';
import { ImportError, MAX_DRAWING_BYTES, type ImportedDrawing } from './types';
import { drawingKindOf } from './to-section';

/** Read an SVG or DXF file's text (type from its name or content). Throws ImportError. */
export function readDrawing(name: string, text: string, bytes = text.length): ImportedDrawing {
  if (bytes > MAX_DRAWING_BYTES) throw new ImportError(`The file is ${(bytes / 1048576).toFixed(1)} MB; drawings may be at most 2 MB.`);
  if (text.includes('\u0000')) throw new ImportError('The file is binary; only SVG and ASCII DXF drawings can be imported.');
  const kind = drawingKindOf(name, text);
  if (kind === 'svg') return readSvg(text);
  if (kind === 'dxf') return readDxf(text);
  throw new ImportError('Only SVG (.svg) and DXF (.dxf) drawings can be imported.');
}
