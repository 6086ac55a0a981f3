// A spreadsheet (CSV or XLSX) as rows of text cells, within limits: the row and column counts are
// checked while reading, so a file with a huge number of columns or rows is refused before it is
// held in memory as cells.
import Papa from 'papaparse';
import ExcelJS from 'exceljs';
import { Readable } from 'node:stream';
import { fileTypeFromBuffer } from 'file-type';
import { Unzip, UnzipInflate } from 'fflate';
import { AppError, unprocessable } from './app-error';

export interface SheetLimits {
  maxRows: number;
  maxColumns: number;
  /** What a workbook (a zip) may unpack to, all its parts together. */
  maxUnpackedBytes: number;
}

/** Parts of a workbook: a few dozen in a real one. */
const MAX_ZIP_ENTRIES = 1000;

export interface Sheet {
  format: 'csv' | 'xlsx';
  /** Rows as text cells, trailing empty cells trimmed; rowNumbers[i] is the file's line/row of rows[i]. */
  rows: string[][];
  rowNumbers: number[];
}

const XLSX_MIME = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

const tooManyColumns = (line: number, max: number) =>
  unprocessable(
    'too-many-columns',
    `Row ${line} has more than ${max} columns; a register needs a dozen or so. Remove the extra columns and try again.`,
  );
const tooManyRows = (max: number) =>
  unprocessable('too-many-rows', `The file has more than ${max.toLocaleString('en')} rows; split it into smaller files.`);
const unpacksTooLarge = (max: number) =>
  new AppError(
    413,
    'workbook-too-large',
    `The workbook unpacks to more than ${Math.round(max / 2 ** 20)} MB (an .xlsx file is compressed); a register is a few MB. Save it again without the extra content, or export it as CSV.`,
    { maxUnpackedBytes: max },
  );

/**
 * A zip bomb is refused before ExcelJS unpacks it: the parts are inflated here, counting the bytes
 * as they come and stopping at the limit (the sizes a zip declares can lie). The input is fed in
 * small slices, so no more than a few MB are inflated past the limit.
 */
function checkUnpackedSize(bytes: Uint8Array, maxBytes: number) {
  let total = 0;
  let entries = 0;
  let over = false;
  const unzip = new Unzip((file) => {
    if (over) return;
    if (++entries > MAX_ZIP_ENTRIES) {
      over = true;
      return;
    }
    // Another compression method: not a workbook part ExcelJS could read; it refuses the file later.
    if (file.compression !== 0 && file.compression !== 8) return;
    file.ondata = (err, chunk) => {
      if (err || over) return;
      total += chunk.length;
      if (total > maxBytes) {
        over = true;
        file.terminate();
      }
    };
    file.start();
  });
  unzip.register(UnzipInflate);
  const SLICE = 4096;
  try {
    for (let i = 0; i < bytes.length && !over; i += SLICE) unzip.push(bytes.subarray(i, i + SLICE), i + SLICE >= bytes.length);
  } catch {
    // A damaged archive: ExcelJS says so below (unreadable-workbook).
  }
  if (over) throw unpacksTooLarge(maxBytes);
}

export async function readSheet(bytes: Buffer, fileName: string, limits: SheetLimits): Promise<Sheet> {
  const ext = fileName.toLowerCase().split('.').pop() ?? '';
  const detected = await fileTypeFromBuffer(bytes);
  if (ext === 'xlsx') {
    if (detected?.mime !== XLSX_MIME) {
      throw new AppError(415, 'content-mismatch', `The file is named .xlsx but its content is ${detected?.mime ?? 'not a workbook'}.`);
    }
    checkUnpackedSize(bytes, limits.maxUnpackedBytes);
    return readXlsx(bytes, limits);
  }
  if (ext === 'csv' || ext === 'txt') {
    if (detected || bytes.includes(0)) {
      throw new AppError(415, 'content-mismatch', `The file is named .${ext} but holds ${detected?.mime ?? 'binary data'}, not text.`);
    }
    return readCsv(decodeText(bytes), limits);
  }
  throw new AppError(415, 'unsupported-type', 'Import a CSV (.csv) or Excel workbook (.xlsx).');
}

/** UTF-8, else Windows-1252 (what older spreadsheet programs write for "CSV"). */
function decodeText(bytes: Buffer): string {
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes).replace(/^\ufeff/, '');
  } catch {
    return new TextDecoder('windows-1252').decode(bytes);
  }
}

/** Counts the columns of every line (quotes respected) without building the cells. */
function checkColumns(text: string, delimiter: string, maxColumns: number) {
  const d = delimiter.charCodeAt(0);
  let columns = 1;
  let line = 1;
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 34) quoted = !quoted;
    else if (quoted) continue;
    else if (c === d) {
      if (++columns > maxColumns) throw tooManyColumns(line, maxColumns);
    } else if (c === 10) {
      columns = 1;
      line++;
    }
  }
}

function readCsv(text: string, limits: SheetLimits): Sheet {
  // The delimiter is guessed on the start of the file only.
  const guess = Papa.parse<string[]>(text.slice(0, 16 * 1024), { preview: 20 });
  const delimiter = guess.meta.delimiter || ',';
  checkColumns(text, delimiter, limits.maxColumns);
  const rows: string[][] = [];
  const rowNumbers: number[] = [];
  let line = 0;
  let failure: AppError | null = null;
  Papa.parse<string[]>(text, {
    delimiter,
    skipEmptyLines: false,
    step: (result, parser) => {
      line++;
      const cells = trimTrailing(result.data.map((c) => String(c ?? '')));
      if (cells.length === 0) return;
      if (rows.length > limits.maxRows) {
        failure = tooManyRows(limits.maxRows);
        parser.abort();
        return;
      }
      rows.push(cells);
      rowNumbers.push(line);
    },
  });
  if (failure) throw failure;
  return { format: 'csv', rows, rowNumbers };
}

function trimTrailing(cells: string[]): string[] {
  let n = cells.length;
  while (n > 0 && cells[n - 1]!.trim() === '') n--;
  return n === cells.length ? cells : cells.slice(0, n);
}

function cellText(value: ExcelJS.CellValue): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'string') return value;
  if (typeof value === 'number' || typeof value === 'boolean') return String(value);
  if (value instanceof Date) return value.toISOString().slice(0, 10);
  if (typeof value === 'object') {
    if ('richText' in value) return value.richText.map((r) => r.text).join('');
    if ('result' in value) return cellText(value.result as ExcelJS.CellValue);
    if ('text' in value) return String(value.text);
    if ('error' in value) return '';
  }
  return '';
}

/** The first worksheet, streamed row by row, stopping at the limits. */
async function readXlsx(bytes: Buffer, limits: SheetLimits): Promise<Sheet> {
  const rows: string[][] = [];
  const rowNumbers: number[] = [];
  // Empty rows are skipped, not free: a sheet of millions of empty rows is refused as well.
  let rowsSeen = 0;
  try {
    const reader = new ExcelJS.stream.xlsx.WorkbookReader(Readable.from(bytes), {
      worksheets: 'emit',
      sharedStrings: 'cache',
      hyperlinks: 'ignore',
      styles: 'ignore',
      entries: 'ignore',
    });
    for await (const sheet of reader) {
      for await (const row of sheet) {
        if (++rowsSeen > limits.maxRows * 2) throw tooManyRows(limits.maxRows);
        const values = row.values as ExcelJS.CellValue[];
        // values[0] is unused: ExcelJS counts columns from 1.
        if (values.length - 1 > limits.maxColumns) {
          const last = trimTrailing(values.slice(1).map(cellText));
          if (last.length > limits.maxColumns) throw tooManyColumns(row.number, limits.maxColumns);
        }
        const cells = trimTrailing(values.slice(1, limits.maxColumns + 1).map(cellText));
        if (cells.length === 0) continue;
        if (rows.length > limits.maxRows) throw tooManyRows(limits.maxRows);
        rows.push(cells);
        rowNumbers.push(row.number);
      }
      break;
    }
  } catch (err) {
    if (err instanceof AppError) throw err;
    throw new AppError(415, 'unreadable-workbook', 'The workbook could not be read; save it again as .xlsx or export it as CSV.');
  }
  return { format: 'xlsx', rows, rowNumbers };
}

/**
 * One CSV cell (RFC 4180 quoting). A cell that a spreadsheet would run as a formula (starting with
 * = + - @, tab or carriage return) gets a leading apostrophe (OWASP "CSV Injection").
 */
export function csvCell(value: unknown): string {
  if (value === null || value === undefined) return '';
  let s = typeof value === 'boolean' ? (value ? 'yes' : 'no') : String(value);
  if (/^[=+\-@\t\r]/.test(s)) s = `'${s}`;
  return /[",\r\n]/.test(s) || s !== s.trim() ? `"${s.replace(/"/g, '""')}"` : s;
}

/** A file name that is safe in a Content-Disposition header and on any file system. */
export function safeFileName(name: string): string {
  const base = name
    .normalize('NFKD')
    .replace(/[^\x20-\x7e]/g, '')
    .replace(/[^A-Za-z0-9._-]+/g, '-')
    .replace(/^[-.]+|[-.]+$/g, '')
    .slice(0, 80);
  return base || 'venue';
}
