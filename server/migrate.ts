import path from 'node:path';
import type { QueryInterface, Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';
import { syncReferenceChemicals } from './services/chemicals';

type MigrationModule = {
  up: (qi: QueryInterface) => Promise<void>;
  down: (qi: QueryInterface) => Promise<void>;
};

export function createMigrator(sequelize: Sequelize): Umzug<QueryInterface> {
  return new Umzug({
    migrations: {
      glob: ['migrations/*.{ts,js}', { cwd: __dirname, ignore: ['**/*.d.ts'] }],
      resolve: ({ name, path: file, context }) => {
        // Stored without the extension so a .ts run (tsx) and a built .js run agree.
        // eslint-disable-next-line @typescript-eslint/no-require-imports -- the migration file is only known at run time
        const migration = require(file as string) as MigrationModule;
        return {
          name: path.basename(name, path.extname(name)),
          up: () => migration.up(context),
          down: () => migration.down(context),
        };
      },
    },
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  });
}

/** Brings the schema up to date, then the reference chemicals that ship with the code. */
export async function migrateUp(sequelize: Sequelize): Promise<string[]> {
  const done = await createMigrator(sequelize).up();
  await syncReferenceChemicals();
  return done.map((m) => m.name);
}
