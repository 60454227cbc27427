import { randomUUID } from 'node:crypto';
import { QueryTypes, type Transaction } from 'sequelize';
import Papa from 'papaparse';
import request from 'supertest';
import { LabModel } from '../../server/models';
import { rankingSchema } from '../../shared/schemas/ranking';
import { bearer, memberWithRole, signUpPerson } from '../support/accounts';
import { withTestApp } from '../support/app';
import { sessionWithPair } from '../support/burn';

const t = withTestApp();

const mark = (specimenId: string, kind: string, atMs: number) => ({
  id: randomUUID(),
  specimenId,
  kind,
  atMs,
});

async function version(labId: string): Promise<number> {
  const [row] = await LabModel.sequelize!.query<{ version: string }>(
    'SELECT version FROM lab_data_versions WHERE lab_id = :labId',
    { type: QueryTypes.SELECT, replacements: { labId } },
  );
  return Number(row!.version);
}

/** A lab with one signed-off pair: control 200 mm, treated `treatedMm`. */
async function labWithSignedOffPair(treatedMm: number) {
  const lead = await signUpPerson(t);
  const tech = await memberWithRole(t, lead.labId, 'technician');
  const reviewer = await memberWithRole(t, lead.labId, 'reviewer');
  const { pair, treatedId, controlId } = await sessionWithPair(lead.labId, tech.email);
  const base = `/api/labs/${lead.labId}/pairs/${pair.id}`;
  for (const [id, mm] of [
    [treatedId, treatedMm],
    [controlId, 200],
  ] as const) {
    await request(t.app)
      .put(`${base}/measurements/${id}`)
      .set(bearer(tech.token))
      .send({ charLengthMm: mm });
  }
  await request(t.app).post(`${base}/submit`).set(bearer(tech.token));
  await request(t.app).post(`${base}/sign-off`).set(bearer(reviewer.token));
  return { lead, tech, reviewer, base, treatedId, labId: lead.labId };
}

async function ranking(labId: string, token: string) {
  const res = await request(t.app).get(`/api/labs/${labId}/rankings`).set(bearer(token));
  expect(res.status).toBe(200);
  const r = rankingSchema.parse(res.body);
  return [...r.ranked, ...r.notEnoughPairs];
}

describe('GET /api/labs/:labId/rankings (served again until the data changes)', () => {
  it('answers a correction made after a ranking was read with the corrected figure', async () => {
    const { lead, reviewer, base, treatedId, labId } = await labWithSignedOffPair(60);
    expect((await ranking(labId, lead.token))[0]!.treatedChar.mean).toBe(60);
    expect((await ranking(labId, lead.token))[0]!.treatedChar.mean).toBe(60);

    const corrected = await request(t.app)
      .post(`${base}/corrections`)
      .set(bearer(reviewer.token))
      .send({ specimenId: treatedId, changes: { charLengthMm: 75 }, reason: 'Misread the rule' });
    expect(corrected.status).toBe(200);
    expect((await ranking(labId, lead.token))[0]!.treatedChar.mean).toBe(75);
  });

  it('serves the ranking again from its cache while the data version stands', async () => {
    const { lead, treatedId, labId } = await labWithSignedOffPair(60);
    expect((await ranking(labId, lead.token))[0]!.treatedChar.mean).toBe(60);
    // A write with triggers switched off leaves the version where it was: the cached answer
    // stands, which shows the second read did not rank again.
    await LabModel.sequelize!.transaction(async (transaction) => {
      await LabModel.sequelize!.query("SET LOCAL session_replication_role = 'replica'", {
        transaction,
      });
      await LabModel.sequelize!.query(
        'UPDATE measurements SET char_length_mm = 99 WHERE specimen_id = :treatedId',
        { replacements: { treatedId }, transaction },
      );
    });
    expect((await ranking(labId, lead.token))[0]!.treatedChar.mean).toBe(60);
    const csv = await request(t.app).get(`/api/labs/${labId}/pairs.csv`).set(bearer(lead.token));
    expect(csv.text).toContain(',99,');
  });

  it('answers 304 to a client holding the current entity tag, and 200 once the data changed', async () => {
    const { lead, reviewer, base, treatedId, labId } = await labWithSignedOffPair(60);
    const path = `/api/labs/${labId}/rankings`;
    const first = await request(t.app).get(path).set(bearer(lead.token));
    const etag = first.headers.etag as string;
    expect(etag).toMatch(/^"ranking-/);
    const again = await request(t.app).get(path).set(bearer(lead.token)).set('If-None-Match', etag);
    expect(again.status).toBe(304);
    await request(t.app)
      .post(`${base}/corrections`)
      .set(bearer(reviewer.token))
      .send({ specimenId: treatedId, changes: { charLengthMm: 64 }, reason: 'Re-measured it' });
    const changed = await request(t.app)
      .get(path)
      .set(bearer(lead.token))
      .set('If-None-Match', etag);
    expect(changed.status).toBe(200);
    expect(rankingSchema.parse(changed.body).notEnoughPairs[0]!.treatedChar.mean).toBe(64);
  });

  it('sends the ranking compressed to clients that accept gzip, and the same figures uncompressed to others', async () => {
    const { lead, labId } = await labWithSignedOffPair(60);
    const path = `/api/labs/${labId}/rankings`;
    const zipped = await request(t.app)
      .get(path)
      .set(bearer(lead.token))
      .set('Accept-Encoding', 'gzip');
    expect(zipped.headers['content-encoding']).toBe('gzip');
    expect(zipped.headers.vary).toMatch(/Accept-Encoding/);
    const plain = await request(t.app)
      .get(path)
      .set(bearer(lead.token))
      .set('Accept-Encoding', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.headers.etag).not.toBe(zipped.headers.etag);
    expect(zipped.body).toEqual(plain.body);
  });

  it('answers a renamed recipe with the new name', async () => {
    const { lead, labId } = await labWithSignedOffPair(60);
    const [before] = await ranking(labId, lead.token);
    const renamed = `Renamed ${randomUUID().slice(0, 6)}`;
    await LabModel.sequelize!.query('UPDATE recipes SET name = :renamed WHERE id = :id', {
      replacements: { renamed, id: before!.recipeId },
    });
    expect((await ranking(labId, lead.token))[0]!.recipeName).toBe(renamed);
  });

  it('keeps the data version while a draft pair is timed, and moves it when the pair is submitted', async () => {
    const { lead, tech, labId } = await labWithSignedOffPair(60);
    const { pair, treatedId } = await sessionWithPair(labId, tech.email);
    const base = `/api/labs/${labId}/pairs/${pair.id}`;
    const before = await version(labId);
    const marks = await request(t.app)
      .post(`${base}/marks`)
      .set(bearer(tech.token))
      .send({
        marks: [mark(treatedId, 'flame_applied', 0), mark(treatedId, 'flame_removed', 12000)],
      });
    expect(marks.status).toBe(200);
    await request(t.app)
      .put(`${base}/measurements/${treatedId}`)
      .set(bearer(tech.token))
      .send({ charLengthMm: 55 });
    expect(await version(labId)).toBe(before);

    await request(t.app).post(`${base}/submit`).set(bearer(tech.token));
    expect(await version(labId)).toBeGreaterThan(before);
    const unreviewed = await request(t.app)
      .get(`/api/labs/${labId}/rankings?unreviewed=true`)
      .set(bearer(lead.token));
    expect(rankingSchema.parse(unreviewed.body).pairsCounted).toBe(2);
  });

  it('moves the version once per transaction, however many rows it writes', async () => {
    const { labId } = await labWithSignedOffPair(60);
    const before = await version(labId);
    const touchRecipes = (transaction?: Transaction) =>
      LabModel.sequelize!.query('UPDATE recipes SET name = name WHERE lab_id = :labId', {
        replacements: { labId },
        ...(transaction ? { transaction } : {}),
      });
    await LabModel.sequelize!.transaction(async (transaction) => {
      await touchRecipes(transaction);
      await touchRecipes(transaction);
      await touchRecipes(transaction);
    });
    expect(await version(labId)).toBe(before + 1);
    await touchRecipes();
    await touchRecipes();
    expect(await version(labId)).toBe(before + 3);
  });

  it('gives every lab its own version: a write in one lab leaves another lab alone', async () => {
    const a = await labWithSignedOffPair(60);
    const b = await labWithSignedOffPair(70);
    const bBefore = await version(b.labId);
    await request(t.app)
      .post(`${a.base}/corrections`)
      .set(bearer(a.reviewer.token))
      .send({ specimenId: a.treatedId, changes: { charLengthMm: 61 }, reason: 'Re-measured it' });
    expect(await version(b.labId)).toBe(bBefore);
    expect((await ranking(b.labId, b.lead.token))[0]!.treatedChar.mean).toBe(70);
  });
});

describe('GET /api/labs/:labId/pairs.csv and rankings.csv', () => {
  it('puts an apostrophe before a name a spreadsheet would run as a formula', async () => {
    const { lead, labId } = await labWithSignedOffPair(60);
    const [before] = await ranking(labId, lead.token);
    const formula = '=HYPERLINK("http://x.invalid","open")';
    await LabModel.sequelize!.query('UPDATE recipes SET name = :formula WHERE id = :id', {
      replacements: { formula, id: before!.recipeId },
    });
    for (const file of ['pairs.csv', 'rankings.csv']) {
      const res = await request(t.app).get(`/api/labs/${labId}/${file}`).set(bearer(lead.token));
      const rows = Papa.parse<Record<string, string>>(res.text, { header: true }).data;
      expect(rows[0]!.recipe).toBe(`'${formula}`);
    }
  });
});
