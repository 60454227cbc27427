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
 * Row counts and an md5 of every table's rows ordered by primary key. No table is left out: a
 * request refused before its service runs touches nothing, not even the audit log (a failed
 * sign-in is audited, but only once the body has passed validation).
 */
export async function databaseChecksum(sequelize: Sequelize): Promise<DatabaseFigures> {
  const query = sequelizeQuery(sequelize);
  // The schema does not change during a test file: look its tables up once.
  let tables = knownTables.get(sequelize);
  if (!tables) knownTables.set(sequelize, (tables = tablesWithKeys(query)));
  return databaseFigures(query, await tables);
}

const knownTables = new WeakMap<Sequelize, Promise<TableKey[]>>();
