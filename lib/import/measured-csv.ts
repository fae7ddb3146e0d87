/**
 * Measured capacitance data as CSV (parsed with papaparse), kept with a section for overlay
 * on sweep charts.
 *
 * Format: a header row, then numbers. The first column is the swept quantity (for example
 * "w (mm)" or "spacing [um]"); every further column is a capacitance per unit length whose
 * header names its unit: "C (pF/m)", "C11 [pF/cm]". Lines starting with "#" are comments.
 * Units: F/m, nF/m, pF/m, fF/m, pF/cm, pF/mm, fF/mm, fF/um, pF/in, pF/ft. Values are stored
 * as given and also converted to F/m.
 */
import Papa from 'papaparse';
import { ImportError, MAX_CSV_BYTES } from './types';

/** Farad per metre for one of each unit (1 in = 0.0254 m, 1 ft = 0.3048 m, exact by definition). */
export const CAPACITANCE_UNITS: Record<string, number> = {
  'F/m': 1,
  'nF/m': 1e-9,
  'pF/m': 1e-12,
  'fF/m': 1e-15,
  'pF/cm': 1e-12 / 1e-2,
  'pF/mm': 1e-12 / 1e-3,
  'fF/mm': 1e-15 / 1e-3,
  'fF/um': 1e-15 / 1e-6,
  'pF/in': 1e-12 / 0.0254,
  'pF/ft': 1e-12 / 0.3048,
};

export const MAX_CSV_ROWS = 10_000;
export const MAX_CSV_SERIES = 16;

export interface MeasuredSeries {
  name: string;
  unit: string;
  /** As given in the file. */
  values: number[];
  /** Converted to F/m. */
  valuesFPerM: number[];
}

export interface MeasuredData {
  parameter: { name: string; unit: string | null };
  x: number[];
  series: MeasuredSeries[];
}

function splitHeader(h: string): { name: string; unit: string | null } {
  const m = /^\s*(.*?)\s*[([]\s*([^)\]]+?)\s*[)\]]\s*$/.exec(h);
  if (m) return { name: m[1]!.trim(), unit: m[2]!.trim().replace('µ', 'u').replace('μ', 'u') };
  return { name: h.trim(), unit: null };
}

/** Parse and check a measured-data CSV. Throws ImportError naming the row and column. */
export function parseMeasuredCsv(text: string, bytes = text.length): MeasuredData {
  if (bytes > MAX_CSV_BYTES) throw new ImportError(`The file is ${(bytes / 1048576).toFixed(1)} MB; measured data may be at most 1 MB.`);
  if (text.includes('\u0000')) throw new ImportError('The file is binary; measured data must be a CSV text file.');
  const res = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { skipEmptyLines: 'greedy', comments: '#', dynamicTyping: false });
  const fatal = res.errors.find((e) => e.type !== 'Delimiter' || res.data.length === 0);
  if (fatal && fatal.type !== 'Delimiter') {
    throw new ImportError(`The CSV could not be read${fatal.row !== undefined ? ` at row ${fatal.row + 1}` : ''}: ${fatal.message}.`);
  }
  const rows = res.data;
  if (rows.length < 2) throw new ImportError('The CSV needs a header row and at least one row of numbers.');
  const header = rows[0]!.map((h) => h.trim());
  if (header.length < 2) throw new ImportError('The CSV needs at least two columns: the swept quantity, then one or more capacitance columns.');
  if (header.length - 1 > MAX_CSV_SERIES) throw new ImportError(`The CSV has ${header.length - 1} capacitance columns; at most ${MAX_CSV_SERIES} are allowed.`);
  if (rows.length - 1 > MAX_CSV_ROWS) throw new ImportError(`The CSV has ${rows.length - 1} rows of data; at most ${MAX_CSV_ROWS} are allowed.`);
  const parameter = splitHeader(header[0]!);
  if (!parameter.name) throw new ImportError('Column 1 has no name in the header row.');
  if (/^[+-]?\d/.test(header[0]!) && /^[+-]?\d/.test(header[1] ?? '')) throw new ImportError('The first row holds numbers; the CSV needs a header row naming the columns and their units.');
  const series: MeasuredSeries[] = header.slice(1).map((h, k) => {
    const { name, unit } = splitHeader(h);
    const col = `column ${k + 2} ("${h}")`;
    if (!name) throw new ImportError(`The header of column ${k + 2} is empty.`);
    if (!unit) throw new ImportError(`${col} names no unit; write it like "C (pF/m)". Units: ${Object.keys(CAPACITANCE_UNITS).join(', ')}.`);
    if (!(unit in CAPACITANCE_UNITS)) throw new ImportError(`${col}: "${unit}" is not a capacitance-per-length unit Edgefield knows (${Object.keys(CAPACITANCE_UNITS).join(', ')}).`);
    return { name, unit, values: [], valuesFPerM: [] };
  });
  const x: number[] = [];
  const NUM = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
  for (let r = 1; r < rows.length; r++) {
    const row = rows[r]!;
    if (row.length !== header.length) throw new ImportError(`Row ${r + 1} has ${row.length} values; the header has ${header.length} columns.`);
    row.forEach((cell, c) => {
      const v = cell.trim();
      if (!NUM.test(v)) throw new ImportError(`Row ${r + 1}, column ${c + 1} ("${header[c]}"): "${v.slice(0, 20)}" is not a number.`);
      const n = Number(v);
      if (!Number.isFinite(n)) throw new ImportError(`Row ${r + 1}, column ${c + 1}: the number is out of range.`);
      if (c === 0) x.push(n);
      else {
        if (n < 0) throw new ImportError(`Row ${r + 1}, column ${c + 1} ("${header[c]}"): a capacitance cannot be negative.`);
        const s = series[c - 1]!;
        s.values.push(n);
        s.valuesFPerM.push(n * CAPACITANCE_UNITS[s.unit]!);
      }
    });
  }
  return { parameter, x, series };
}
