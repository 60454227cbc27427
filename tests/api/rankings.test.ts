import Papa from 'papaparse';
import request from 'supertest';
import { loadDemoData, demoPeople, DEMO_PASSWORD } from '../../fixtures/demo';
import { rankingSchema } from '../../shared/schemas/ranking';
import { bearer, signInForToken, signUpPerson } from '../support/accounts';
import { withTestApp } from '../support/app';

const t = withTestApp();

async function demo() {
  await loadDemoData(t.deps);
  const token = await signInForToken(t, demoPeople[3]!.email, DEMO_PASSWORD); // the viewer
  const me = await request(t.app).get('/api/me').set(bearer(token));
  return { token, labId: me.body.labs[0].id as string };
}

describe('GET /api/labs/:labId/rankings', () => {
  it('ranks the demo treatments by treated char length from signed-off pairs only', async () => {
    const { token, labId } = await demo();
    const res = await request(t.app).get(`/api/labs/${labId}/rankings`).set(bearer(token));
    expect(res.status).toBe(200);
    const r = rankingSchema.parse(res.body);
    // The demo has 12 pairs, one waiting for review: 11 signed off.
    expect(r.pairsCounted).toBe(11);
    expect(r.ranked.map((x) => x.recipeName)).toEqual([
      'Muslin drape soak',
      'Corrugated board dip',
      'Muslin weak sulfate rinse',
    ]);
    const drape = r.ranked[0]!;
    // Signed-off demo drape pairs: treated 52, 61, 48, 57 mm → mean 54.5 (arithmetic)
    expect(drape.pairs).toBe(4);
    expect(drape.treatedChar.mean).toBeCloseTo(54.5, 6);
    expect(drape.difference.ci95).not.toBeNull();
    expect(r.leaderStatement).toEqual(expect.any(String));
    const withUnreviewed = rankingSchema.parse(
      (await request(t.app).get(`/api/labs/${labId}/rankings?unreviewed=true`).set(bearer(token)))
        .body,
    );
    expect(withUnreviewed.pairsCounted).toBe(12);
  });

  it('judges against a preset and names the rule that failed', async () => {
    const { token, labId } = await demo();
    const res = await request(t.app)
      .get(`/api/labs/${labId}/rankings?profile=preset:nfpa-705-field`)
      .set(bearer(token));
    const r = rankingSchema.parse(res.body);
    expect(r.profile?.caution).toMatch(/Authority Having Jurisdiction/);
    const weak = r.ranked.find((x) => x.recipeName === 'Muslin weak sulfate rinse')!;
    expect(weak.verdict?.pass).toBe(false);
    expect(weak.verdict?.failed.join(' ')).toMatch(/char length/i);
  });

  it('answers 400 for an unknown profile or a bad date, and 404 for another lab', async () => {
    const { token, labId } = await demo();
    const bad = await request(t.app)
      .get(`/api/labs/${labId}/rankings?profile=preset:nope`)
      .set(bearer(token));
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields[0].path).toBe('profile');
    const date = await request(t.app)
      .get(`/api/labs/${labId}/rankings?from=yesterday`)
      .set(bearer(token));
    expect(date.status).toBe(400);
    const stranger = await signUpPerson(t);
    expect(
      (await request(t.app).get(`/api/labs/${labId}/rankings`).set(bearer(stranger.token))).status,
    ).toBe(404);
  });

  it('exports the ranking and the pairs as CSV that parse back to the same numbers', async () => {
    const { token, labId } = await demo();
    const json = rankingSchema.parse(
      (await request(t.app).get(`/api/labs/${labId}/rankings`).set(bearer(token))).body,
    );
    const csv = await request(t.app).get(`/api/labs/${labId}/rankings.csv`).set(bearer(token));
    expect(csv.headers['content-type']).toMatch(/text\/csv/);
    const rows = Papa.parse<Record<string, string>>(csv.text, {
      header: true,
      skipEmptyLines: true,
    }).data;
    expect(rows.map((r) => r.recipe)).toEqual(json.ranked.map((x) => x.recipeName));
    expect(Number(rows[0]!.treated_char_mean_mm)).toBeCloseTo(json.ranked[0]!.treatedChar.mean!, 2);
    const pairs = await request(t.app).get(`/api/labs/${labId}/pairs.csv`).set(bearer(token));
    expect(Papa.parse(pairs.text, { header: true, skipEmptyLines: true }).data).toHaveLength(11);
  });

  it('filters by substrate', async () => {
    const { token, labId } = await demo();
    const r = rankingSchema.parse(
      (await request(t.app).get(`/api/labs/${labId}/rankings?substrate=board`).set(bearer(token)))
        .body,
    );
    expect(r.ranked.map((x) => x.recipeName)).toEqual(['Corrugated board dip']);
  });
});
