import { DEMO_LAB_NAME, demoPeople, loadDemoData } from '../../fixtures/demo';
import { createMigrator, migrateUp } from '../../server/migrate';
import { LabModel, MembershipModel, UserModel } from '../../server/models';
import { buildApp } from '../support/app';
import { freshDatabase, type TestDatabase } from '../support/db';

// Every migration in server/migrations, by the name umzug stores.
const ALL = [
  '0001-labs',
  '0002-accounts',
  '0003-recipes-batches',
  '0004-burn-tests',
  '0005-criteria-profiles',
  '0006-lab-data-versions',
  '0007-pair-imports',
  '0008-rate-limits',
];

let db: TestDatabase;
beforeAll(async () => {
  db = await freshDatabase();
});
afterAll(() => db.drop());

describe('migrations', () => {
  it('records migrations by name without the file extension', async () => {
    const [rows] = await db.sequelize.query('SELECT name FROM schema_migrations ORDER BY name');
    expect(rows).toEqual(ALL.map((name) => ({ name })));
  });

  it('has nothing pending on a migrated database, and can go down and up again', async () => {
    const migrator = createMigrator(db.sequelize);
    expect(await migrator.pending()).toEqual([]);
    await migrator.down({ to: 0 });
    const [tables] = await db.sequelize.query("SELECT to_regclass('public.labs') AS t");
    expect(tables).toEqual([{ t: null }]);
    await migrateUp(db.sequelize);
    expect((await migrator.executed()).map((m) => m.name)).toEqual(ALL);
  });
});

describe('demo data', () => {
  it('loads the demo lab and its four people once, and changes nothing on a second run', async () => {
    const built = buildApp(db);
    try {
      expect(await loadDemoData(built.deps)).toEqual({ loaded: true });
      expect(await loadDemoData(built.deps)).toEqual({ loaded: false });
    } finally {
      await built.close();
    }
    expect(await LabModel.count({ where: { name: DEMO_LAB_NAME } })).toBe(1);
    const lab = await LabModel.findOne({ where: { name: DEMO_LAB_NAME } });
    const members = await MembershipModel.findAll({
      where: { labId: lab!.id },
      include: [{ model: UserModel, as: 'user' }],
    });
    const [counts] = await db.sequelize.query(
      'SELECT (SELECT count(*) FROM recipes)::int AS recipes, (SELECT count(*) FROM batches)::int AS batches, (SELECT count(*) FROM burn_pairs)::int AS pairs',
    );
    expect(counts).toEqual([{ recipes: 4, batches: 6, pairs: 12 }]);
    expect(members.map((m) => [m.user!.email, m.role]).sort()).toEqual(
      demoPeople.map((p) => [p.email, p.role]).sort(),
    );
  });
});
