import { existsSync, mkdtempSync, readdirSync, rmSync, statSync } from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import fc from 'fast-check';
import { errorBodySchema } from '../../shared/schemas/error';
import { pairImportPreviewSchema } from '../../shared/schemas/pair-import';
import { withTestApp } from '../support/app';
import { changedTables, databaseChecksum, type DatabaseFigures } from '../support/db-checksum';
import { hostileCases, type BodyKind, type HostileCase } from '../support/hostile/cases';
import { brokenFiles } from '../support/hostile/csv';
import { validRequests } from '../support/hostile/routes';
import type { JsonSchema, OpenApiDocument } from '../support/hostile/schema-slots';
import { sendCase, type Answer, type BaseRequest } from '../support/hostile/send';
import { idsOf, makeLabWorld, signInTokens, smallJpeg, type World } from '../support/hostile/world';
import { hostileRunsPerRoute, recordFigures, soak } from '../support/soak';

// Every write route in the OpenAPI document gets hostile requests made from its own schema:
// wrong types, missing and unknown fields, huge and unstorable strings, numbers out of range or
// infinite, ids of another lab, bad paths, bad credentials, bad files. Each must get a 4xx (a
// 400 names its fields), and neither the database nor the photo folder may change.

const dataDir = mkdtempSync(path.join(os.tmpdir(), 'qb-hostile-'));
const photosDir = path.join(dataDir, 'photos');
const logged: unknown[] = [];
const t = withTestApp({ config: { dataDir }, logError: (err) => logged.push(err) });
const WRITE_METHODS = ['post', 'put', 'patch', 'delete'];
// The one write route that stores nothing: it computes a plan.
const STORES_NOTHING = ['POST /api/labs/{labId}/batch-plans'];

let world: World;
let server: http.Server;
let url: string;
let doc: OpenApiDocument;
const figures: Record<string, Seen> = {};

beforeAll(async () => {
  world = { a: await makeLabWorld(t, 'Lab A'), b: await makeLabWorld(t, 'Lab B') };
  server = http.createServer(t.app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  doc = (await (await fetch(`${url}/api/openapi.json`)).json()) as OpenApiDocument;
}, 120_000);

afterAll(async () => {
  server?.closeAllConnections();
  await new Promise((resolve) => server?.close(resolve));
  recordFigures('hostile-input', { runsPerRoute: hostileRunsPerRoute, routes: figures });
  rmSync(dataDir, { recursive: true, force: true });
});

type Snapshot = { db: DatabaseFigures; files: string };

function photoFiles(): string {
  if (!existsSync(photosDir)) return '';
  return readdirSync(photosDir)
    .sort()
    .map((f) => `${f}:${statSync(path.join(photosDir, f)).size}`)
    .join(',');
}

async function snapshot(): Promise<Snapshot> {
  return { db: await databaseChecksum(t.db.sequelize), files: photoFiles() };
}

function bodyOf(key: string): { kind: BodyKind; schema?: JsonSchema } {
  const [method, route] = key.split(' ') as [string, string];
  const content = doc.paths[route]?.[method.toLowerCase()]?.requestBody?.content;
  if (content?.['multipart/form-data']) {
    return { kind: 'multipart', schema: content['multipart/form-data'].schema };
  }
  if (content?.['application/json']) {
    return { kind: 'json', schema: content['application/json'].schema };
  }
  if (content?.['text/csv']) return { kind: 'csv' };
  return { kind: 'none' };
}

type Base = BaseRequest & { clientIdPaths: string[]; tokenParams: string[] };

async function baseRequest(key: string): Promise<Base> {
  const [method, route] = key.split(' ') as [string, string];
  const own = await signInTokens(t, world.a.manager.email);
  const valid = validRequests[key]!(world.a, own);
  return {
    method,
    path: route,
    params: valid.params ?? {},
    bodyKind: bodyOf(key).kind,
    body: valid.body,
    auth: valid.auth ?? 'bearer',
    credentials: own,
    photo: await smallJpeg(),
    clientIdPaths: valid.clientIdPaths ?? [],
    tokenParams: valid.tokenParams ?? [],
  };
}

/** What is wrong with the answer to a hostile case; empty when all is well. */
function problemsWith(c: HostileCase, answer: Answer, filesBefore: string): string[] {
  const problems: string[] = [];
  if (answer.status < 400 || answer.status > 499) problems.push(`answered ${answer.status}`);
  const body = errorBodySchema.safeParse(answer.json);
  if (!body.success) problems.push('the answer is not the error body');
  else if (
    answer.status === 400 &&
    body.data.error.code !== 'invalid_link' &&
    !body.data.error.fields?.length
  ) {
    problems.push('a 400 without field details');
  }
  const [only] = c.breaking;
  if (c.breaking.length === 1 && only!.expect.length && !only!.expect.includes(answer.status)) {
    problems.push(`"${only!.label}" should answer ${only!.expect.join(' or ')}`);
  }
  if (photoFiles() !== filesBefore) problems.push('changed the photo folder');
  if (logged.length) problems.push(`logged an error: ${String(logged[0])}`);
  return problems;
}

// A rate-limited route (sign-in, sign-up, resets, invitations) counts every try before it reads
// the body, refused or not: that is the limit's job, so those counts are not a refused write.
const COUNTS_TRIES = 'rate_limits';
const written = (before: DatabaseFigures, after: DatabaseFigures) =>
  changedTables(before, after).filter((table) => table !== COUNTS_TRIES);

type Seen = { statuses: Record<number, number>; changes: Record<string, number> };

/**
 * Sends every case of one route. The database checksum is compared once for the whole run (a
 * rejected request writes nothing, so nothing may change); when it did change, the same cases
 * run again with a checksum around each one, so the failure names the case that wrote.
 */
async function assertHostileRun(base: Base, arbitrary: fc.Arbitrary<HostileCase>, seen: Seen) {
  const seed = Math.floor(Math.random() * 2 ** 31);
  const run = (eachCase: boolean) =>
    fc.assert(
      fc.asyncProperty(arbitrary, async (c) => {
        logged.length = 0;
        const before = eachCase ? await snapshot() : undefined;
        const filesBefore = before?.files ?? photoFiles();
        const answer = await sendCase(url, base, c);
        const problems = problemsWith(c, answer, filesBefore);
        if (before) {
          const wrote = written(before.db, await databaseChecksum(t.db.sequelize));
          if (wrote.length) problems.push(`wrote to ${wrote.join(', ')}`);
        }
        seen.statuses[answer.status] = (seen.statuses[answer.status] ?? 0) + 1;
        for (const { kind } of c.breaking) seen.changes[kind] = (seen.changes[kind] ?? 0) + 1;
        if (problems.length) {
          throw new Error(
            `${problems.join('; ')}\nchanges: ${c.breaking.map((b) => b.label).join(' + ')}\n` +
              `answer: ${answer.status} ${answer.text.slice(0, 400)}`,
          );
        }
      }),
      { numRuns: hostileRunsPerRoute, seed },
    );
  const start = await databaseChecksum(t.db.sequelize);
  await run(false);
  const end = await databaseChecksum(t.db.sequelize);
  if (!written(start, end).length) return;
  await run(true);
  throw new Error(`The run wrote to ${written(start, end).join(', ')} (seed ${seed})`);
}

describe('write routes in the OpenAPI document', () => {
  it('each have a valid request that the hostile cases are made from', () => {
    const documented = Object.entries(doc.paths).flatMap(([route, ops]) =>
      Object.keys(ops)
        .filter((m) => WRITE_METHODS.includes(m))
        .map((m) => `${m.toUpperCase()} ${route}`),
    );
    expect(Object.keys(validRequests).sort()).toEqual(documented.sort());
  });
});

describe.each(Object.keys(validRequests))('%s', (key) => {
  let base: Base;

  it(
    `answers ${hostileRunsPerRoute} hostile requests with a 4xx and writes nothing`,
    async () => {
      base = await baseRequest(key);
      const body = bodyOf(key);
      const seen: Seen = { statuses: {}, changes: {} };
      figures[key] = seen;
      const arbitrary = hostileCases({
        doc,
        bodySchema: body.schema,
        bodyKind: body.kind,
        exampleBody: base.body,
        params: base.params,
        authenticated: base.auth === 'bearer',
        clientIdPaths: base.clientIdPaths,
        tokenParams: base.tokenParams,
        otherLabIds: idsOf(world.b),
      });
      await assertHostileRun(base, arbitrary, seen);
    },
    soak ? 900_000 : 60_000,
  );

  it('accepts the same request unbroken, and that one is seen in the database', async () => {
    const before = await snapshot();
    const answer = await sendCase(url, base, { breaking: [], noise: [] });
    expect(answer.status).toBeGreaterThanOrEqual(200);
    expect(answer.status).toBeLessThan(300);
    const after = await snapshot();
    if (!STORES_NOTHING.includes(key)) expect(after.db.checksum).not.toBe(before.db.checksum);
  });
});

// A readable file with broken rows is not a refused request: the preview answers 201 with each
// row's errors and keeps the valid rows as a pending import. So these are checked apart from the
// 4xx cases above: every broken row is named, odd text is kept as written (a formula is text),
// and nothing is written but the pending import.
describe('POST /api/labs/{labId}/pair-imports/preview with broken rows', () => {
  it('answers 201 naming each broken row by line and column, and writes no burn record', async () => {
    const { token } = await signInTokens(t, world.a.manager.email);
    await fc.assert(
      fc.asyncProperty(brokenFiles(world.a.importRecipeName), async (file) => {
        logged.length = 0;
        const before = await databaseChecksum(t.db.sequelize);
        const res = await fetch(`${url}/api/labs/${world.a.labId}/pair-imports/preview`, {
          method: 'POST',
          headers: { Authorization: `Bearer ${token}`, 'Content-Type': 'text/csv' },
          body: file.text,
        });
        expect(res.status).toBe(201);
        const preview = pairImportPreviewSchema.parse(await res.json());
        expect(preview.rows.map((r) => r.line)).toEqual(file.rows.map((r) => r.line));
        file.rows.forEach((sent, i) => {
          const got = preview.rows[i]!;
          if (sent.brokenAt) {
            expect({ line: got.line, ok: got.ok }).toEqual({ line: sent.line, ok: false });
            expect(got.errors.map((e) => e.field)).toContain(sent.brokenAt);
          } else {
            expect({ line: got.line, errors: got.errors }).toEqual({ line: sent.line, errors: [] });
            expect(got.values.substrate).toBe(sent.substrate);
          }
        });
        const after = await databaseChecksum(t.db.sequelize);
        expect(changedTables(before, after)).toEqual(['pair_imports']);
        expect(logged).toEqual([]);
      }),
      { numRuns: soak ? 300 : 25 },
    );
  }, 120_000);
});
