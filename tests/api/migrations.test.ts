import { DEMO_LAB_NAME, loadDemoData } from '../../fixtures/demo';
import { createMigrator } from '../../server/migrate';
import { LabModel } from '../../server/models';
import { freshDatabase, type TestDatabase } from '../support/db';

let db: TestDatabase;
beforeAll(async () => {
  db = await freshDatabase();
});
afterAll(() => db.drop());

describe('migrations', () => {
  it('records migrations by name without the file extension', async () => {
    const [rows] = await db.sequelize.query('SELECT name FROM schema_migrations ORDER BY name');
    expect(rows).toEqual([{ name: '0001-labs' }]);
  });

  it('has nothing pending on a migrated database, and can go down and up again', async () => {
    const migrator = createMigrator(db.sequelize);
    expect(await migrator.pending()).toEqual([]);
    await migrator.down({ to: 0 });
    const [tables] = await db.sequelize.query("SELECT to_regclass('public.labs') AS t");
    expect(tables).toEqual([{ t: null }]);
    await migrator.up();
    expect((await migrator.executed()).map((m) => m.name)).toEqual(['0001-labs']);
  });
});

describe('demo data', () => {
  it('loads the demo lab once and changes nothing on a second run', async () => {
    expect(await loadDemoData()).toEqual({ loaded: true });
    expect(await loadDemoData()).toEqual({ loaded: false });
    expect(await LabModel.count({ where: { name: DEMO_LAB_NAME } })).toBe(1);
  });
});
