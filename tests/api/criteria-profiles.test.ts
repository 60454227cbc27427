import request from 'supertest';
import { DEMO_PASSWORD, demoPeople, loadDemoData } from '../../fixtures/demo';
import { criteriaProfileOutputSchema } from '../../shared/schemas/criteria';
import { rankingSchema } from '../../shared/schemas/ranking';
import { bearer, memberWithRole, signInForToken, signUpPerson } from '../support/accounts';
import { withTestApp } from '../support/app';

const t = withTestApp();

describe('criteria profiles of a lab', () => {
  it('copies a preset into the lab, where a manager edits it; a second copy gets a new name', async () => {
    const lead = await signUpPerson(t);
    const base = `/api/labs/${lead.labId}/criteria-profiles`;
    const copied = await request(t.app)
      .post(`${base}/copy-preset`)
      .set(bearer(lead.token))
      .send({ presetKey: 'nfpa-2112' });
    expect(copied.status).toBe(201);
    const profile = criteriaProfileOutputSchema.parse(copied.body);
    expect(profile.presetKey).toBe('nfpa-2112');
    // Source: domain facts §2, NFPA 2112 char ≤ 4 in (102 mm) [C]
    expect(profile.rules).toContainEqual({
      kind: 'max_char_length_mm',
      limit: 102,
      appliesTo: 'each',
    });
    const again = await request(t.app)
      .post(`${base}/copy-preset`)
      .set(bearer(lead.token))
      .send({ presetKey: 'nfpa-2112' });
    expect(again.body.name).toBe(`${profile.name} (2)`);

    const edited = await request(t.app)
      .put(`${base}/${profile.id}`)
      .set(bearer(lead.token))
      .send({
        name: 'Our drape rule',
        minSpecimens: 3,
        rules: [{ kind: 'max_char_length_mm', limit: 80, appliesTo: 'average' }],
      });
    expect(edited.status).toBe(200);
    expect(edited.body).toMatchObject({ name: 'Our drape rule', minSpecimens: 3 });
    const list = await request(t.app).get(base).set(bearer(lead.token));
    expect(list.body.profiles.map((p: { name: string }) => p.name).sort()).toEqual(
      [`${profile.name} (2)`, 'Our drape rule'].sort(),
    );
  });

  it('refuses a rule without its limit, a duplicate name, and non-managers', async () => {
    const lead = await signUpPerson(t);
    const base = `/api/labs/${lead.labId}/criteria-profiles`;
    const noLimit = await request(t.app)
      .post(base)
      .set(bearer(lead.token))
      .send({
        name: 'Loose',
        minSpecimens: 1,
        rules: [{ kind: 'max_afterflame_s', appliesTo: 'each' }],
      });
    expect(noLimit.status).toBe(400);
    expect(noLimit.body.error.fields[0].path).toBe('rules.0.limit');
    const body = {
      name: 'Strict',
      minSpecimens: 1,
      rules: [{ kind: 'no_flaming_drips', appliesTo: 'each' }],
    };
    expect((await request(t.app).post(base).set(bearer(lead.token)).send(body)).status).toBe(201);
    const dup = await request(t.app)
      .post(base)
      .set(bearer(lead.token))
      .send({ ...body, name: 'STRICT' });
    expect(dup.status).toBe(409);
    const tech = await memberWithRole(t, lead.labId, 'technician');
    expect(
      (
        await request(t.app)
          .post(base)
          .set(bearer(tech.token))
          .send({ ...body, name: 'Other' })
      ).status,
    ).toBe(403);
    expect((await request(t.app).get(base).set(bearer(tech.token))).status).toBe(200);
  });

  it("judges the ranking against the lab's own profile", async () => {
    await loadDemoData(t.deps);
    const token = await signInForToken(t, demoPeople[0]!.email, DEMO_PASSWORD);
    const labId = (await request(t.app).get('/api/me').set(bearer(token))).body.labs[0]
      .id as string;
    const own = await request(t.app)
      .post(`/api/labs/${labId}/criteria-profiles`)
      .set(bearer(token))
      .send({
        name: 'Short char',
        minSpecimens: 3,
        rules: [{ kind: 'max_char_length_mm', limit: 60, appliesTo: 'average' }],
      });
    const r = rankingSchema.parse(
      (
        await request(t.app)
          .get(`/api/labs/${labId}/rankings?profile=${own.body.id}`)
          .set(bearer(token))
      ).body,
    );
    expect(r.profile?.name).toBe('Short char');
    // Demo drape soak signed-off mean 54.5 mm ≤ 60 (arithmetic); board dip mean 71 mm > 60
    expect(r.ranked.find((x) => x.recipeName === 'Muslin drape soak')!.verdict!.pass).toBe(true);
    expect(r.ranked.find((x) => x.recipeName === 'Corrugated board dip')!.verdict!.pass).toBe(
      false,
    );
  });
});
