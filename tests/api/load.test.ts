import { Op } from 'sequelize';
import { MarkModel } from '../../server/models';
import { startTestServer } from '../support/app';
import { freshDatabase, type TestDatabase } from '../support/db';
import { formatResults, mib, runLoad, seedLoadLab, type LoadLab } from '../support/load';

// The quick form of `npm run bench`'s load benchmark: a few technicians and viewers for a few
// seconds, as fast as the answers come. The long form (50 + 10 for 60 s) prints its figures.
jest.setTimeout(120_000);

let db: TestDatabase;
let server: Awaited<ReturnType<typeof startTestServer>>;
let lab: LoadLab;

beforeAll(async () => {
  db = await freshDatabase();
  server = await startTestServer(db);
  lab = await seedLoadLab(server.deps, { technicians: 5, viewers: 2, pairsPerTechnician: 2 });
});

afterAll(async () => {
  await server?.close();
  await db?.drop();
});

describe('technicians posting marks and measurements while viewers read the rankings', () => {
  it('answers every request with a 2xx for 5 s and stores each mark once', async () => {
    const before = process.memoryUsage();
    const results = await runLoad(lab, { url: server.url, durationS: 5 });
    const after = process.memoryUsage();
    console.log(
      [
        'Load, quick form (5 technicians, 2 viewers, 5 s, server in the test process):',
        ...formatResults(results),
        `  memory rss ${mib(before.rss)} → ${mib(after.rss)}, heap ${mib(before.heapUsed)} → ${mib(after.heapUsed)}`,
      ].join('\n'),
    );

    for (const r of results) {
      expect({ route: r.route, errors: r.errors, non2xx: r.non2xx }).toEqual({
        route: r.route,
        errors: 0,
        non2xx: 0,
      });
      expect(r.ok).toBeGreaterThan(0);
      expect(Object.keys(r.statusCodes).filter((code) => code.startsWith('5'))).toEqual([]);
    }

    // Every answered mark is stored once; a request cut off when the time ran out may or may
    // not have been stored, at most one per connection.
    // Requests still in the server when the time ran out finish first.
    const marks = results[0]!;
    const count = () =>
      MarkModel.count({
        where: { pairId: { [Op.in]: lab.technicians.flatMap((t) => t.pairs.map((p) => p.id)) } },
      });
    let stored = await count();
    for (let previous = -1; stored !== previous;) {
      await new Promise((resolve) => setTimeout(resolve, 1000));
      [previous, stored] = [stored, await count()];
    }
    expect(stored).toBeGreaterThanOrEqual(marks.ok);
    expect(stored).toBeLessThanOrEqual(marks.ok + marks.connections);
  });
});
