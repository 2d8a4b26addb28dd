import Papa from 'papaparse';

import { lobeCsvLimits, type MeasurementData } from '@/shared/measurements';

import { HttpError } from '../http';

/**
 * Lobewright's lobe table (CSV, comma-separated, UTF-8):
 *
 *   # optional comment lines start with "#"; blank lines are ignored
 *   angle,1I,1E,2I,2E,...        <- header: "angle" (crank degrees) or "cam_angle" (cam degrees, doubled to crank)
 *   -120,0.0000,0.0123,...       <- one row per angle, lift in inches, angles increasing
 *
 * One column per lobe, named by cylinder number and I or E. Every cell must
 * hold a number; the first bad cell (and up to 20 in all) is reported by its
 * spreadsheet row (the file's line number, header included) and column name.
 */
export type LobeTable = MeasurementData['lobes'];

const MAX_REPORTED = 20;
const MAX_LIFT = lobeCsvLimits.maxLift;
const LOBE_NAME = /^(\d{1,2})([IE])$/;

class Problems {
  readonly fields: Record<string, string> = {};
  private count = 0;
  add(row: number, column: string, message: string) {
    if (this.count >= MAX_REPORTED) return;
    const key = `row ${row}, column ${column}`;
    if (!(key in this.fields)) {
      this.fields[key] = message;
      this.count += 1;
    }
  }
  get any() {
    return this.count > 0;
  }
  throwIfAny(): void {
    const [first] = Object.entries(this.fields);
    if (!first) return;
    const more = this.count > 1 ? ` (and ${this.count - 1} more)` : '';
    throw new HttpError(400, 'invalid_file', `${capitalize(first[0])}: ${first[1]}${more}. Nothing was saved.`, this.fields);
  }
}

function capitalize(s: string) {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

function fileError(message: string): HttpError {
  return new HttpError(400, 'invalid_file', `${message}. Nothing was saved.`, { file: message });
}

/** Reads a strict decimal number ("0.305", "-12", ".5", "1e-3"); null for anything else. */
function readNumber(cell: string): number | null {
  const text = cell.trim();
  if (!/^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(text)) return null;
  const value = Number(text);
  return Number.isFinite(value) ? value : null;
}

/** Parses and checks a lobe table; throws a 400 naming each bad row and column. Nothing is returned unless all of it is good. */
export function parseLobeTable(text: string, fileName: string): LobeTable {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ''), { delimiter: ',', header: false, skipEmptyLines: false });
  const rows = parsed.data;
  const isBlank = (cells: string[]) => cells.every((c) => c.trim() === '');
  const isComment = (cells: string[]) => (cells[0] ?? '').trim().startsWith('#');

  const headerIndex = rows.findIndex((cells) => !isBlank(cells) && !isComment(cells));
  const header = rows[headerIndex];
  if (headerIndex < 0 || !header) throw fileError('The file has no header row: start with angle (or cam_angle) and one column per lobe, e.g. angle,1I,1E');
  const headerRow = headerIndex + 1;
  const problems = new Problems();

  const first = (header[0] ?? '').trim().toLowerCase();
  const basis = first === 'angle' ? 'crank' : first === 'cam_angle' ? 'cam' : null;
  if (!basis) {
    problems.add(headerRow, '1', `Name the first column angle (crank degrees) or cam_angle (cam degrees), not "${(header[0] ?? '').trim()}"`);
  }
  const angleName = basis === 'cam' ? 'cam_angle' : 'angle';
  const lobeIds: string[] = [];
  const seen = new Set<string>();
  header.slice(1).forEach((raw, i) => {
    const position = String(i + 2);
    const name = raw.trim().toUpperCase();
    const match = LOBE_NAME.exec(name);
    if (name === '') problems.add(headerRow, position, 'Name this column by cylinder and I or E, e.g. 3E');
    else if (!match || Number(match[1]) < 1 || Number(match[1]) > 16) {
      problems.add(headerRow, position, `Unknown column "${raw.trim()}": name lobe columns by cylinder (1 to 16) and I or E, e.g. 3E`);
    } else if (seen.has(name)) problems.add(headerRow, position, `Column ${name} appears twice: keep one column per lobe`);
    seen.add(name);
    lobeIds.push(name);
  });
  if (header.length < 2) problems.add(headerRow, '2', 'Add at least one lobe column, e.g. 1I');
  if (lobeIds.length > 32) problems.add(headerRow, String(34), 'At most 32 lobe columns in one file');
  problems.throwIfAny();

  const points: { angle: number; lift: number }[][] = lobeIds.map(() => []);
  let previous: { angle: number; row: number } | null = null;
  let dataRows = 0;
  rows.forEach((cells, index) => {
    if (index <= headerIndex || isBlank(cells) || isComment(cells)) return;
    const row = index + 1;
    dataRows += 1;
    if (cells.length > header.length) {
      problems.add(row, String(header.length + 1), `This row has ${cells.length} cells but the header names ${header.length} columns`);
    }
    const angle = readNumber(cells[0] ?? '');
    if (angle === null) problems.add(row, angleName, `${basis === 'cam' ? 'Cam' : 'Crank'} angle must be a number in degrees`);
    else {
      const crank = basis === 'cam' ? angle * 2 : angle;
      if (crank < lobeCsvLimits.minAngle || crank > lobeCsvLimits.maxAngle) {
        problems.add(
          row,
          angleName,
          `Angle ${angle} is outside ${lobeCsvLimits.minAngle}…${lobeCsvLimits.maxAngle} crank degrees${basis === 'cam' ? ' (cam degrees are doubled)' : ''}`,
        );
      }
      if (previous && !(angle > previous.angle)) {
        problems.add(row, angleName, `Angles must increase down the file: ${angle} does not come after ${previous.angle} on row ${previous.row}`);
      }
      previous = { angle, row };
    }
    lobeIds.forEach((id, i) => {
      const cell = cells[i + 1];
      if (cell === undefined || cell.trim() === '') return problems.add(row, id, 'Lift is missing: give the lift in inches');
      const lift = readNumber(cell);
      if (lift === null) return problems.add(row, id, 'Lift must be a number in inches');
      if (lift < 0) return problems.add(row, id, 'Lift cannot be negative');
      if (lift > MAX_LIFT) return problems.add(row, id, `Lift is over ${MAX_LIFT} in: give lift in inches, not millimetres`);
      if (angle !== null) points[i]?.push({ angle: basis === 'cam' ? angle * 2 : angle, lift });
    });
  });
  problems.throwIfAny();
  if (dataRows < lobeCsvLimits.minRows) {
    throw fileError(`The table needs at least ${lobeCsvLimits.minRows} rows of readings; this one has ${dataRows}`);
  }
  if (dataRows > 1440) throw fileError(`The table has ${dataRows} rows; keep it to 1440 (every half degree over two turns)`);
  return {
    basis: basis ?? 'crank',
    fileName: fileName.slice(0, 200),
    lobes: lobeIds.map((id, i) => ({ id, points: points[i] ?? [] })),
  };
}
