import { QueryTypes, type Sequelize } from 'sequelize';
import {
  changedTables,
  databaseFigures,
  tablesWithKeys,
  type DatabaseFigures,
  type RunQuery,
  type TableKey,
} from '../../scripts/db-checksum';

export { changedTables, type DatabaseFigures };

export function sequelizeQuery(sequelize: Sequelize): RunQuery {
  return async <T>(sql: string) => (await sequelize.query(sql, { type: QueryTypes.SELECT })) as T[];
}

/**
 * Row counts and an md5 of every table's rows ordered by primary key. One table is left out:
 * `rate_limits` counts attempts at sign-in, sign-up, reset and invitations whatever their body,
 * so that a flood of bad requests is throttled too; that count is its job, not a write of the
 * request. Everything else stays: a request refused before its service runs touches nothing, not
 * even the audit log (a failed sign-in is audited, but only once the body has passed validation).
 */
export async function databaseChecksum(sequelize: Sequelize): Promise<DatabaseFigures> {
  const query = sequelizeQuery(sequelize);
  // The schema does not change during a test file: look its tables up once.
  let tables = knownTables.get(sequelize);
  if (!tables) {
    tables = tablesWithKeys(query).then((all) => all.filter((t) => !COUNTERS.has(t.table)));
    knownTables.set(sequelize, tables);
  }
  return databaseFigures(query, await tables);
}

const COUNTERS = new Set(['rate_limits']);

const knownTables = new WeakMap<Sequelize, Promise<TableKey[]>>();
