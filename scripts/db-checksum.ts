import { createHash } from 'node:crypto';

// Row counts and a checksum of every table's data, ordered by primary key: the same database
// gives the same figures wherever it is restored. Used by the backups (their manifest) and by the
// tests (a rejected request must leave them unchanged).

/** Runs one SQL text and returns its rows; a pg.Client or a Sequelize adapter fits. */
export type RunQuery = <T>(sql: string) => Promise<T[]>;

export type TableFigures = { table: string; rows: number; md5: string };
export type DatabaseFigures = { tables: TableFigures[]; rows: number; checksum: string };

const quoteIdent = (name: string) => `"${name.replace(/"/g, '""')}"`;

export type TableKey = { table: string; key: string[] };

/** The tables of the public schema with their primary key columns. */
export async function tablesWithKeys(query: RunQuery): Promise<TableKey[]> {
  const rows = await query<{ table: string; key: string[] | null }>(`
    SELECT c.relname::text AS table,
           (SELECT array_agg(a.attname::text ORDER BY k.ord)
              FROM pg_index i
              CROSS JOIN LATERAL unnest(i.indkey) WITH ORDINALITY AS k(attnum, ord)
              JOIN pg_attribute a ON a.attrelid = i.indrelid AND a.attnum = k.attnum
             WHERE i.indrelid = c.oid AND i.indisprimary) AS key
      FROM pg_class c
      JOIN pg_namespace n ON n.oid = c.relnamespace
     WHERE n.nspname = 'public' AND c.relkind IN ('r', 'p')
     ORDER BY c.relname`);
  return rows.map((r) => ({ table: r.table, key: r.key ?? [] }));
}

/**
 * Figures for every table in the public schema. A table without a primary key is ordered by its
 * whole row text, so the figure still does not depend on the physical row order.
 */
export async function databaseFigures(
  query: RunQuery,
  knownTables?: TableKey[],
): Promise<DatabaseFigures> {
  const tables = knownTables ?? (await tablesWithKeys(query));
  if (tables.length === 0) return { tables: [], rows: 0, checksum: combined([]) };
  const parts = tables.map(({ table, key }) => {
    const t = quoteIdent(table);
    const order = key.length ? key.map((k) => `t.${quoteIdent(k)}`).join(', ') : 't::text';
    return `SELECT '${table.replace(/'/g, "''")}' AS table, count(*)::int AS rows,
                   md5(coalesce(string_agg(t::text, E'\\n' ORDER BY ${order}), '')) AS md5
              FROM ${t} t`;
  });
  const figures = await query<TableFigures>(parts.join('\nUNION ALL\n'));
  figures.sort((a, b) => (a.table < b.table ? -1 : a.table > b.table ? 1 : 0));
  return {
    tables: figures,
    rows: figures.reduce((sum, f) => sum + f.rows, 0),
    checksum: combined(figures),
  };
}

function combined(figures: TableFigures[]): string {
  const text = figures.map((f) => `${f.table}:${f.rows}:${f.md5}`).join('\n');
  return createHash('md5').update(text).digest('hex');
}

/** Tables whose figures differ, for a message that says where a change happened. */
export function changedTables(before: DatabaseFigures, after: DatabaseFigures): string[] {
  const names = new Set([...before.tables, ...after.tables].map((t) => t.table));
  const of = (f: DatabaseFigures, name: string) => f.tables.find((t) => t.table === name);
  return [...names].filter((name) => {
    const a = of(before, name);
    const b = of(after, name);
    return a?.rows !== b?.rows || a?.md5 !== b?.md5;
  });
}
