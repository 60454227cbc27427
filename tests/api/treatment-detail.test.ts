import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { DEMO_PASSWORD, demoPeople, loadDemoData } from '../../fixtures/demo';
import { rankingSchema } from '../../shared/schemas/ranking';
import { treatmentDetailSchema } from '../../shared/schemas/treatment';
import { bearer, signInForToken, signUpPerson, type Person } from '../support/accounts';
import { withTestApp } from '../support/app';
import { burnTreatment } from '../support/treatment';

const t = withTestApp();

// Student's sleep data (domain-facts §3), scaled to char lengths: control = 100 + 10·g2,
// treated = 100 + 10·g1, so control − treated = 10·(g2 − g1).
const g1 = [0.7, -1.6, -0.2, -1.2, -0.1, 3.4, 3.7, 0.8, 0.0, 2.0];
const g2 = [1.9, 0.8, 1.1, 0.1, -0.1, 4.4, 5.5, 1.6, 4.6, 3.4];
const sleepPairs = g1.map((a, i) => ({
  controlMm: Math.round(100 + 10 * g2[i]!),
  treatedMm: Math.round(100 + 10 * a),
  treatedAfterflameS: i + 1,
}));

type Owner = Person & { labId: string };
let owner: Owner;
let sleep: Awaited<ReturnType<typeof burnTreatment>>;

beforeAll(async () => {
  owner = await signUpPerson(t, 'Detail lab');
  // Two sessions of one treatment: the later one is made first, to check the order.
  sleep = await burnTreatment(owner.labId, owner.userId, {
    substrate: 'Cotton duck',
    pairs: sleepPairs.slice(5),
    heldAt: '2026-03-10T10:00:00.000Z',
  });
  await burnTreatment(owner.labId, owner.userId, {
    substrate: 'Cotton duck',
    revisionId: sleep.revisionId,
    pairs: sleepPairs.slice(0, 5),
    heldAt: '2026-03-02T10:00:00.000Z',
    igniter: 'match',
  });
});

const path = (labId: string, key: string, qs = '') =>
  `/api/labs/${labId}/rankings/treatments/${encodeURIComponent(key)}${qs ? `?${qs}` : ''}`;

async function detail(key: string, qs = '', who: Owner = owner) {
  const res = await request(t.app)
    .get(path(who.labId, key, qs))
    .set(bearer(who.token));
  return res;
}

describe('GET /api/labs/:labId/rankings/treatments/:key', () => {
  it('gives the paired statistics of the treatment, matching published values', async () => {
    const res = await detail(sleep.key);
    expect(res.status).toBe(200);
    const d = treatmentDetailSchema.parse(res.body).treatment;
    expect(d.pairs).toBe(10);
    // Source: domain-facts §3, sleep data paired t: mean 1.58, p = 0.002832890,
    // 95 % CI of g1 − g2 = (−2.4598858, −0.7001142); here ×10 and the sign of g2 − g1.
    expect(d.difference.mean).toBeCloseTo(15.8, 6);
    expect(d.difference.sd).toBeCloseTo(12.29995, 4);
    expect(d.difference.pairedP).toBeCloseTo(0.00283289, 7);
    expect(d.difference.ci95![0]).toBeCloseTo(7.001142, 4);
    expect(d.difference.ci95![1]).toBeCloseTo(24.598858, 4);
    // Source: derived from domain-facts §3: dz = 1.58 / 1.229995
    expect(d.difference.cohenDz).toBeCloseTo(1.58 / 1.229995, 4);
  });

  it('returns the same figures as the ranking, rank and verdict included', async () => {
    await loadDemoData(t.deps);
    const viewer = await signInForToken(t, demoPeople[3]!.email, DEMO_PASSWORD);
    const me = await request(t.app).get('/api/me').set(bearer(viewer));
    const labId = me.body.labs[0].id as string;
    const qs = 'profile=preset:nfpa-705-field&unreviewed=true';
    const ranking = rankingSchema.parse(
      (await request(t.app).get(`/api/labs/${labId}/rankings?${qs}`).set(bearer(viewer))).body,
    );
    const all = [...ranking.ranked, ...ranking.notEnoughPairs];
    expect(all).toHaveLength(3);
    for (const entry of all) {
      const res = await request(t.app)
        .get(path(labId, entry.key, qs))
        .set(bearer(viewer));
      expect(res.status).toBe(200);
      const d = treatmentDetailSchema.parse(res.body);
      expect(d.treatment).toEqual(entry);
      expect(d.profile).toEqual(ranking.profile);
      expect(d.onlySignedOff).toBe(false);
      expect(d.pairs).toHaveLength(entry.pairs);
    }
    // The weak rinse fails the chosen criteria, with the rule named.
    const weak = all.find((x) => x.recipeName === 'Muslin weak sulfate rinse')!;
    const d = treatmentDetailSchema.parse(
      (
        await request(t.app)
          .get(path(labId, weak.key, qs))
          .set(bearer(viewer))
      ).body,
    );
    expect(d.treatment.verdict?.pass).toBe(false);
    expect(d.treatment.verdict?.failed.join(' ')).toMatch(/char length/i);
  });

  it('lists the pairs oldest first with their char lengths and afterflame', async () => {
    const d = treatmentDetailSchema.parse((await detail(sleep.key)).body);
    expect(d.pairs.map((p) => p.heldAt.slice(0, 10))).toEqual([
      ...Array(5).fill('2026-03-02'),
      ...Array(5).fill('2026-03-10'),
    ]);
    const byLength = [...d.pairs].sort((a, b) => a.treated.afterflameS! - b.treated.afterflameS!);
    expect(byLength.map((p) => [p.control.charLengthMm, p.treated.charLengthMm])).toEqual(
      sleepPairs.map((p) => [p.controlMm, p.treatedMm]),
    );
    // Afterflame: flame out 1…10 s after the flame was removed (marks made by the test).
    expect(byLength.map((p) => p.treated.afterflameS)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10]);
    expect(new Set(d.pairs.map((p) => p.pairId)).size).toBe(10);
    expect(d.pairs.every((p) => p.batchCode.length > 0)).toBe(true);
  });

  it('applies the ranking filters to the statistics and the pairs', async () => {
    const later = treatmentDetailSchema.parse((await detail(sleep.key, 'from=2026-03-05')).body);
    expect(later.pairs).toHaveLength(5);
    expect(later.treatment.pairs).toBe(5);
    expect(later.pairs.every((p) => p.heldAt >= '2026-03-05')).toBe(true);
    const byMatch = treatmentDetailSchema.parse((await detail(sleep.key, 'igniter=match')).body);
    expect(byMatch.pairs.map((p) => p.heldAt.slice(0, 10))).toEqual(Array(5).fill('2026-03-02'));
    // Mean of the first five scaled differences: (12 + 24 + 13 + 13 + 0) / 5 = 12.4 (arithmetic)
    expect(byMatch.treatment.difference.mean).toBeCloseTo(12.4, 6);
    const none = await detail(sleep.key, 'to=2026-03-01');
    expect(none.status).toBe(404);
    expect((await detail(sleep.key, 'substrate=board')).status).toBe(404);
  });

  it('returns 404 for an unknown key and for a treatment of another lab', async () => {
    const unknown = await detail(`${randomUUID()}|cotton duck`);
    expect(unknown.status).toBe(404);
    expect(unknown.body.error.code).toBe('not_found');
    const other = await signUpPerson(t, 'Other lab');
    const theirs = await burnTreatment(other.labId, other.userId, {
      substrate: 'Jute',
      pairs: sleepPairs.slice(0, 3),
    });
    expect((await detail(theirs.key, '', other)).status).toBe(200);
    // Asked through our lab, their treatment does not exist; through theirs we are not members.
    expect((await detail(theirs.key)).status).toBe(404);
    const res = await request(t.app).get(path(other.labId, theirs.key)).set(bearer(owner.token));
    expect(res.status).toBe(404);
  });

  it('keeps a key whose substrate has URL characters intact', async () => {
    const odd = await burnTreatment(owner.labId, owner.userId, {
      substrate: 'Linen / jute 50% #2? & more',
      pairs: sleepPairs.slice(0, 3),
    });
    const res = await detail(odd.key);
    expect(res.status).toBe(200);
    const d = treatmentDetailSchema.parse(res.body);
    expect(d.treatment.key).toBe(odd.key);
    expect(d.treatment.substrate).toBe('Linen / jute 50% #2? & more');
  });

  it('returns 400 with the field named for a bad filter or profile', async () => {
    const date = await detail(sleep.key, 'from=yesterday');
    expect(date.status).toBe(400);
    expect(date.body.error.fields[0].path).toBe('from');
    const profile = await detail(sleep.key, 'profile=preset:nope');
    expect(profile.status).toBe(400);
    expect(profile.body.error.fields[0].path).toBe('profile');
    const long = await detail('x'.repeat(201));
    expect(long.status).toBe(400);
    expect(long.body.error.fields[0].path).toBe('key');
  });
});
