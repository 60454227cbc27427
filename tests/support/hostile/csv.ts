import fc from 'fast-check';
import Papa from 'papaparse';
import {
  MAX_IMPORT_ROWS,
  pairImportColumnNames,
  pairImportColumns,
} from '../../../shared/schemas/pair-import';
import { sitting } from '../imports';
import type { Change, Edit } from './cases';
import { unstorableChars } from './values';

// Pairs files for the import preview: one that reads well, bodies the server refuses as a whole
// (4xx, nothing stored), and readable files with broken rows, which are data: 201 with each
// broken row named, and no burn record written.

/** A valid row for revision 1 of a recipe of the lab, every optional column filled. */
export function goodRow(recipe: string, n = 0): Record<string, string> {
  return {
    ...sitting,
    recipe,
    revision: '1',
    substrate: 'Muslin',
    batch: '',
    add_on_pct: '12.5',
    mode: 'sequential',
    control_char_mm: '300',
    control_afterflame_s: '30',
    control_afterflame_complete: 'true',
    control_afterglow_s: '2',
    control_burn_time_s: '32',
    control_burned_to_clamp: 'false',
    control_flaming_drips: 'no',
    treated_char_mm: String(40 + n),
    treated_afterflame_s: '0.8',
    treated_afterflame_complete: 'yes',
    treated_afterglow_s: '4',
    treated_burn_time_s: '5',
    treated_burned_to_clamp: 'false',
    treated_mass_loss_pct: '3.5',
    treated_flaming_drips: 'false',
  };
}

const columns = pairImportColumnNames.filter((c) => c in goodRow(''));
const line = (row: Record<string, string>) =>
  Papa.unparse([columns.map((c) => row[c] ?? '')], { newline: '\r\n' });
const header = columns.join(',');

export function pairsFile(recipe: string, rows = 1): string {
  const body = Array.from({ length: rows }, (_, n) => line(goodRow(recipe, n)));
  return `${[header, ...body].join('\r\n')}\r\n`;
}

const csv = (
  text: string | Buffer,
  contentType: string | null = 'text/csv',
  encoding?: string,
): Edit => ({ at: 'raw-body', contentType, text, encoding });
const refused = (label: string, edit: Edit, expect: readonly number[]): Change => ({
  kind: `csv: ${label}`,
  label: `csv: ${label}`,
  edit,
  expect,
});

const BOUNDARY = '----hostilecsv';
const asMultipart = (text: string) =>
  `--${BOUNDARY}\r\nContent-Disposition: form-data; name="file"; filename="pairs.csv"\r\n` +
  `Content-Type: text/csv\r\n\r\n${text}\r\n--${BOUNDARY}--\r\n`;
const withoutColumn = (head: string, column: string) =>
  head
    .split(',')
    .map((c) => (c === column ? `x_${c}` : c))
    .join(',');
const insertAt = (text: string, at: number, what: string | Buffer) =>
  Buffer.concat([Buffer.from(text.slice(0, at)), Buffer.from(what), Buffer.from(text.slice(at))]);

/**
 * Whole bodies the preview refuses: the wrong type, too big, not UTF-8 text, nothing to read.
 * Made from the route's valid file (a header and at least one row).
 */
export function csvChanges(example: string): fc.Arbitrary<Change>[] {
  const [head = '', row = ''] = example.split('\r\n');
  const repeat = (times: number) => `${head}\r\n${`${row}\r\n`.repeat(times)}`;
  const wide = Array.from({ length: 3000 }, (_, i) => `c${i}`).join(',');
  const at = fc.nat({ max: example.length });
  const fixed = [
    refused('sent as JSON', csv(JSON.stringify({ file: example }), 'application/json'), [415]),
    refused(
      'sent as multipart',
      csv(asMultipart(example), `multipart/form-data; boundary=${BOUNDARY}`),
      [415],
    ),
    refused('no body', csv('', null), [400]),
    refused('over 2 MB', csv(repeat(Math.ceil((2.1 * 2 ** 20) / row.length))), [413]),
    refused(`more than ${MAX_IMPORT_ROWS} rows`, csv(repeat(MAX_IMPORT_ROWS + 1)), [400]),
    refused('empty', csv(''), [400]),
    refused('blank lines only', csv('\r\n \r\n,,,\r\n'), [400]),
    refused('header only', csv(`${head}\r\n`), [400]),
    refused('a column twice', csv(example.replace('recipe', 'substrate')), [400]),
    refused('UTF-16', csv(Buffer.from(`\uFEFF${example}`, 'utf16le')), [400]),
    refused('unknown charset', csv(example, 'text/csv; charset=x-unknown'), [415]),
    refused('claimed gzip', csv(example, 'text/csv', 'gzip'), [400, 415]),
    refused(
      'Windows-1252',
      csv(Buffer.from(example.replace('Muslin', 'Mousseline écrue'), 'latin1')),
      [400],
    ),
    refused('3000 columns, none ours', csv(`${wide}\r\n${wide}\r\n`), [400]),
  ];
  return [
    ...fixed.map((change) => fc.constant(change)),
    fc
      .constantFrom(...pairImportColumns.filter((c) => c.required).map((c) => c.name))
      .map((c) =>
        refused(`no ${c} column`, csv(example.replace(head, withoutColumn(head, c))), [400]),
      ),
    fc
      .tuple(fc.constantFrom(...unstorableChars), at)
      .map(([bad, i]) =>
        refused('a NUL or half a surrogate pair', csv(insertAt(example, i, bad)), [400]),
      ),
    fc
      .tuple(fc.constantFrom(0x80, 0xc3, 0xed, 0xff), at)
      .map(([byte, i]) =>
        refused('a byte that is not UTF-8', csv(insertAt(example, i, Buffer.from([byte]))), [400]),
      ),
    fc
      .uint8Array({ minLength: 1, maxLength: 512 })
      .map((bytes) => refused('binary garbage', csv(Buffer.from(bytes)), [400])),
  ];
}

/** Cells that make a row wrong (or a surplus cell), and the column the preview must name. */
type Breaker = { column: string; cells: Record<string, string> };

const breakers: fc.Arbitrary<Breaker> = fc.oneof(
  fc.constant({ column: 'recipe', cells: { recipe: "=cmd|' /C calc'!A0" } }),
  fc
    .constantFrom('1e3', '0x10', '12 mm', '-5', '', 'NaN', '1.2.3')
    .map((v) => ({ column: 'control_char_mm', cells: { control_char_mm: v } })),
  fc.constantFrom('two', '99', '1.5').map((v) => ({ column: 'revision', cells: { revision: v } })),
  fc
    .constantFrom('2999-01-01', '14/03/2026', '2025-02-30', 'yesterday')
    .map((v) => ({ column: 'held_at', cells: { held_at: v } })),
  fc.constantFrom('blowtorch', '').map((v) => ({ column: 'igniter', cells: { igniter: v } })),
  fc.constant({ column: 'exposure_s', cells: { exposure_s: '0' } }),
  fc.constant({ column: 'treated_burn_time_s', cells: { treated_burn_time_s: '1' } }),
  fc.constant({ column: 'substrate', cells: { substrate: 'x'.repeat(81) } }),
  fc.constant({ column: 'line', cells: {} }),
);

/** Free text a spreadsheet would take for a formula, or with a line break: kept as written. */
const oddSubstrates = fc.constantFrom(
  '=HYPERLINK("http://example.invalid","open")',
  '+1+1',
  '-2+3',
  '@SUM(A1:A9)',
  'Muslin\nwashed twice',
  'Muslin "sheer", 60 g/m²',
);

export type BrokenFile = {
  text: string;
  rows: { line: number; brokenAt?: string; substrate: string }[];
};

/**
 * A readable file of good rows, odd but valid rows and broken rows; the last row may leave a
 * quote open, which takes the rest of the file into one cell.
 */
export function brokenFiles(recipe: string): fc.Arbitrary<BrokenFile> {
  const kind = fc.oneof(
    { weight: 2, arbitrary: fc.constant({ type: 'good' as const }) },
    { weight: 1, arbitrary: oddSubstrates.map((s) => ({ type: 'odd' as const, substrate: s })) },
    { weight: 3, arbitrary: breakers.map((b) => ({ type: 'broken' as const, b })) },
  );
  return fc
    .tuple(fc.array(kind, { minLength: 1, maxLength: 6 }), fc.boolean())
    .map(([kinds, openQuote]) => {
      let text = `${header}\r\n`;
      const rows: BrokenFile['rows'] = [];
      kinds.forEach((k, n) => {
        const row = goodRow(recipe, n);
        if (k.type === 'odd') row.substrate = k.substrate;
        if (k.type === 'broken') Object.assign(row, k.b.cells);
        let written = line(row);
        if (k.type === 'broken' && k.b.column === 'line') written += ',surplus';
        const lineNo = text.split('\n').length;
        rows.push({
          line: lineNo,
          brokenAt: k.type === 'broken' ? k.b.column : undefined,
          substrate: row.substrate!,
        });
        text += `${written}\r\n`;
      });
      if (openQuote) {
        const last = goodRow(recipe, kinds.length);
        rows.push({ line: text.split('\n').length, brokenAt: 'line', substrate: '' });
        text += line({ ...last, substrate: 'OPEN' }).replace('OPEN', '"Muslin') + '\r\n';
      }
      return { text, rows };
    });
}
