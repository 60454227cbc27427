import { unescapeFormula } from '../../shared/csv/formulae';
import Papa from 'papaparse';
import {
  ignoredExportColumns,
  MAX_IMPORT_ROWS,
  pairImportColumnNames,
  pairImportColumns,
} from '../../shared/schemas/pair-import';
import { AppError } from '../errors';

export type CsvRow = {
  /** The line the row starts on, the header being line 1. */
  line: number;
  /** Every known column, '' where the file has no such column or an empty cell. */
  cells: Record<string, string>;
  /** What kept the row from being read as written. */
  problems: string[];
};

export type PairsCsv = { rows: CsvRow[]; ignoredColumns: string[] };

const badFile = (path: string, message: string) =>
  new AppError(400, 'invalid_request', 'The file cannot be imported.', [{ path, message }]);

// Our header names hold no separator, so the one that splits the header line most is the one.
function delimiterOf(headerLine: string): string {
  const counts = [',', ';', '\t'].map((d) => [d, headerLine.split(d).length] as const);
  return counts.reduce((best, c) => (c[1] > best[1] ? c : best))[0];
}

/**
 * A NUL (every other byte of a UTF-16 file; PostgreSQL cannot store it) or U+FFFD (what a byte
 * that is not UTF-8 was read as, e.g. from a Windows-1252 export): the file is not UTF-8 text, and
 * importing it would store something other than what the file says.
 */
function assertUtf8Text(text: string): void {
  const nul = text.indexOf('\u0000');
  const broken = text.indexOf('\uFFFD');
  if (nul < 0 && broken < 0) return;
  const at = nul < 0 ? broken : broken < 0 ? nul : Math.min(nul, broken);
  const line = text.slice(0, at).split('\n').length;
  throw badFile(
    'file',
    `Line ${line} has ${at === nul ? 'a NUL byte' : 'bytes that are not UTF-8 text'}: save the file as CSV UTF-8`,
  );
}

/** Reads a pairs file: header checks for the whole file, line numbers and problems per row. */
export function readPairsCsv(input: string): PairsCsv {
  // Excel writes a byte-order mark, and a file edited on two systems may mix line ends.
  const text = input.replace(/^\uFEFF/, '').replace(/\r\n?/g, '\n');
  assertUtf8Text(text);
  const lines: { cells: string[]; line: number; errors: string[] }[] = [];
  let consumed = 0;
  let line = 1;
  Papa.parse<string[]>(text, {
    delimiter: delimiterOf(text.split('\n', 1)[0] ?? ''),
    step: (result) => {
      lines.push({ cells: result.data, line, errors: result.errors.map((e) => e.message) });
      const end = result.meta.cursor;
      for (let i = consumed; i < end; i++) if (text.charCodeAt(i) === 10) line++;
      consumed = end;
    },
  });
  const filled = lines.filter((l) => l.cells.some((c) => c.trim() !== ''));
  const [head, ...data] = filled;
  if (!head) throw badFile('file', 'The file is empty');
  const header = head.cells.map((c) => c.trim().toLowerCase());
  const missing = pairImportColumns.filter((c) => c.required && !header.includes(c.name));
  if (missing.length) {
    throw new AppError(
      400,
      'invalid_request',
      `The file has no ${missing.map((c) => c.name).join(', ')} column${missing.length > 1 ? 's' : ''}.`,
      missing.map((c) => ({ path: c.name, message: `The file has no "${c.name}" column` })),
    );
  }
  const twice = header.find((h, i) => h && header.indexOf(h) !== i);
  if (twice) throw badFile(twice, `The column "${twice}" is in the header twice`);
  if (!data.length) throw badFile('file', 'The file has a header but no rows');
  if (data.length > MAX_IMPORT_ROWS) {
    throw badFile('file', `At most ${MAX_IMPORT_ROWS} rows at a time; split the file`);
  }
  const known = new Set<string>([...pairImportColumnNames, ...ignoredExportColumns]);
  return {
    ignoredColumns: header.filter((h) => h && !known.has(h)),
    rows: data.map((l) => {
      const problems = [...l.errors];
      if (l.cells.slice(header.length).some((c) => c.trim() !== '')) {
        problems.push(`The row has ${l.cells.length} cells, the header ${header.length}`);
      }
      const cells = Object.fromEntries(
        pairImportColumnNames.map((name) => {
          const at = header.indexOf(name);
          return [name, at < 0 ? '' : unescapeFormula(l.cells[at] ?? '')];
        }),
      );
      return { line: l.line, cells, problems };
    }),
  };
}
