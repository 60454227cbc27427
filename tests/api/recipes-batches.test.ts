import { randomUUID } from 'node:crypto';
import request from 'supertest';
import { batchPlanSchema, batchSchema } from '../../shared/schemas/batch';
import { recipeSchema } from '../../shared/schemas/recipe';
import { bearer, memberWithRole, signUpPerson } from '../support/accounts';
import { withTestApp } from '../support/app';

const t = withTestApp();

type Lab = { labId: string; token: string };
async function chemicalId(lab: Lab, referenceKey: string): Promise<string> {
  const res = await request(t.app).get(`/api/labs/${lab.labId}/chemicals`).set(bearer(lab.token));
  return res.body.chemicals.find(
    (c: { referenceKey: string | null }) => c.referenceKey === referenceKey,
  ).id;
}

/** A recipe body of one chemical at `amount` g per 100 g water, with what a test changes. */
function recipeBody(chemical: string, amount: number, changes: Record<string, unknown> = {}) {
  return {
    name: `Boric soak ${randomUUID().slice(0, 6)}`,
    substrate: 'cotton',
    ingredients: [{ chemicalId: chemical, amount, unit: 'g_per_100g_water' }],
    mixingTempC: 40,
    soakMinutes: 30,
    dryingMethod: 'rack',
    ...changes,
  };
}

async function boricRecipe(lab: Lab, gPer100gWater = 5) {
  const boric = await chemicalId(lab, 'boric-acid');
  const res = await request(t.app)
    .post(`/api/labs/${lab.labId}/recipes`)
    .set(bearer(lab.token))
    .send(recipeBody(boric, gPer100gWater, { drainMinutes: 5, dryingMinutes: 720 }));
  expect(res.status).toBe(201);
  return { recipe: recipeSchema.parse(res.body), boric };
}

async function rowCounts(): Promise<Record<string, number>> {
  const [rows] = await t.db.sequelize.query(
    `SELECT (SELECT count(*) FROM recipes)::int AS recipes, (SELECT count(*) FROM recipe_revisions)::int AS revisions,
            (SELECT count(*) FROM ingredients)::int AS ingredients, (SELECT count(*) FROM batches)::int AS batches,
            (SELECT count(*) FROM weigh_ins)::int AS weigh_ins, (SELECT count(*) FROM specimens)::int AS specimens`,
  );
  return rows[0] as Record<string, number>;
}

function batchBody(revisionId: string, chemical: string, weighedG: number) {
  return {
    clientId: randomUUID(),
    recipeRevisionId: revisionId,
    target: { basis: 'water_volume', millilitres: 5000 },
    storageTempC: 20,
    weighIns: [{ chemicalId: chemical, weighedG, lot: 'LOT-7731' }],
    cautionsAcknowledged: true,
  };
}

describe('GET /api/labs/:labId/chemicals', () => {
  it('lists the reference retardants with molar mass, boron and hazards', async () => {
    const lab = await signUpPerson(t);
    const res = await request(t.app).get(`/api/labs/${lab.labId}/chemicals`).set(bearer(lab.token));
    const boric = res.body.chemicals.find(
      (c: { referenceKey: string }) => c.referenceKey === 'boric-acid',
    );
    // Source: domain facts §1, IUPAC atomic weights [D]: 61.83 g/mol, 17.48 % B
    expect(boric.molarMass).toBeCloseTo(61.83, 2);
    expect(boric.boronPercent).toBeCloseTo(17.48, 2);
    expect(boric.hazards.map((h: { code: string }) => h.code)).toContain('H360FD');
    expect(res.body.chemicals.map((c: { referenceKey: string }) => c.referenceKey)).toEqual(
      expect.arrayContaining([
        'boric-acid',
        'borax-decahydrate',
        'borax-pentahydrate',
        'borax-anhydrous',
        'diammonium-phosphate',
        'monoammonium-phosphate',
        'ammonium-sulfate',
      ]),
    );
  });

  it("adds a lab's own chemical that other labs do not see", async () => {
    const lab = await signUpPerson(t);
    const other = await signUpPerson(t);
    const res = await request(t.app)
      .post(`/api/labs/${lab.labId}/chemicals`)
      .set(bearer(lab.token))
      .send({ name: 'Workshop salt mix', hazards: [{ code: 'H319', text: 'Irritates the eyes' }] });
    expect(res.status).toBe(201);
    expect(res.body.solubility).toBeNull();
    const theirs = await request(t.app)
      .get(`/api/labs/${other.labId}/chemicals/${res.body.id}`)
      .set(bearer(other.token));
    expect(theirs.status).toBe(404);
  });
});

describe('recipes and revisions', () => {
  it('edits an unused recipe in place, keeping revision 1', async () => {
    const lab = await signUpPerson(t);
    const { recipe, boric } = await boricRecipe(lab);
    const res = await request(t.app)
      .put(`/api/labs/${lab.labId}/recipes/${recipe.id}`)
      .set(bearer(lab.token))
      .send(recipeBody(boric, 4, { name: recipe.name }));
    expect(res.status).toBe(200);
    expect(res.body.current.number).toBe(1);
    expect(res.body.current.id).toBe(recipe.current.id);
    expect(res.body.revisionCount).toBe(1);
  });

  it('freezes a revision once a batch uses it: the edit becomes revision 2 and the batch keeps revision 1', async () => {
    const lab = await signUpPerson(t);
    const { recipe, boric } = await boricRecipe(lab);
    const batch = await request(t.app)
      .post(`/api/labs/${lab.labId}/batches`)
      .set(bearer(lab.token))
      .send(batchBody(recipe.current.id, boric, 250));
    expect(batch.status).toBe(201);
    const edit = await request(t.app)
      .put(`/api/labs/${lab.labId}/recipes/${recipe.id}`)
      .set(bearer(lab.token))
      .send(recipeBody(boric, 6, { name: recipe.name, mixingTempC: 45 }));
    expect(edit.status).toBe(200);
    expect(edit.body.current.number).toBe(2);
    expect(edit.body.current.ingredients[0].gPer100gWater).toBe(6);
    const history = await request(t.app)
      .get(`/api/labs/${lab.labId}/recipes/${recipe.id}/revisions`)
      .set(bearer(lab.token));
    expect(
      history.body.revisions.map((r: { number: number; batchCount: number }) => [
        r.number,
        r.batchCount,
      ]),
    ).toEqual([
      [2, 0],
      [1, 1],
    ]);
    expect(history.body.revisions[1].ingredients[0].gPer100gWater).toBe(5);
    const kept = await request(t.app)
      .get(`/api/labs/${lab.labId}/batches/${batch.body.id}`)
      .set(bearer(lab.token));
    expect(kept.body.recipe).toMatchObject({ revisionId: recipe.current.id, revisionNumber: 1 });
  });

  it('stores amounts canonically: 10 % of solution is 11.11 g per 100 g water', async () => {
    const lab = await signUpPerson(t);
    const dap = await chemicalId(lab, 'diammonium-phosphate');
    const res = await request(t.app)
      .post(`/api/labs/${lab.labId}/recipes`)
      .set(bearer(lab.token))
      .send({
        name: 'DAP ten percent',
        substrate: 'paper',
        ingredients: [{ chemicalId: dap, amount: 10, unit: 'pct_solution' }],
        mixingTempC: 30,
        soakMinutes: 10,
        dryingMethod: 'air',
      });
    expect(res.status).toBe(201);
    // 10 g in 100 g of solution is 10 g per 90 g of water: 100·10/90 (arithmetic)
    expect(res.body.current.ingredients[0].gPer100gWater).toBeCloseTo(11.111, 3);
  });

  it('searches by name and filters by substrate', async () => {
    const lab = await signUpPerson(t);
    await boricRecipe(lab);
    const paper = await request(t.app)
      .get(`/api/labs/${lab.labId}/recipes?substrate=paper`)
      .set(bearer(lab.token));
    expect(paper.body.recipes).toEqual([]);
    const found = await request(t.app)
      .get(`/api/labs/${lab.labId}/recipes?q=boric`)
      .set(bearer(lab.token));
    expect(found.body.recipes).toHaveLength(1);
  });

  it.each([
    [
      'a zero amount',
      (b: string) => [{ chemicalId: b, amount: 0, unit: 'g_per_100g_water' }],
      {},
      'ingredients.0.amount',
    ],
    [
      'a negative amount',
      (b: string) => [{ chemicalId: b, amount: -3, unit: 'g_per_100g_water' }],
      {},
      'ingredients.0.amount',
    ],
    [
      'an unknown chemical',
      () => [{ chemicalId: randomUUID(), amount: 5, unit: 'g_per_100g_water' }],
      {},
      'ingredients.0.chemicalId',
    ],
    [
      'amounts that make the solution over 100 %',
      (b: string) => [{ chemicalId: b, amount: 120, unit: 'pct_solution' }],
      {},
      'ingredients',
    ],
    [
      'a mixing temperature below freezing',
      (b: string) => [{ chemicalId: b, amount: 5, unit: 'g_per_100g_water' }],
      { mixingTempC: -5 },
      'mixingTempC',
    ],
  ])(
    'answers 400 naming the field for %s, and changes nothing',
    async (_label, ingredients, extra, field) => {
      const lab = await signUpPerson(t);
      const boric = await chemicalId(lab, 'boric-acid');
      const before = await rowCounts();
      const res = await request(t.app)
        .post(`/api/labs/${lab.labId}/recipes`)
        .set(bearer(lab.token))
        .send({
          name: 'Bad recipe',
          substrate: 'wood',
          ingredients: ingredients(boric),
          mixingTempC: 20,
          soakMinutes: 10,
          dryingMethod: 'air',
          ...extra,
        });
      expect(res.status).toBe(400);
      expect(res.body.error.fields.map((f: { path: string }) => f.path)).toContain(field);
      expect(await rowCounts()).toEqual(before);
    },
  );
});

describe('POST /api/labs/:labId/batch-plans', () => {
  it('computes a 5 L boric acid batch without saving anything', async () => {
    const lab = await signUpPerson(t);
    const { recipe } = await boricRecipe(lab);
    const before = await rowCounts();
    const res = await request(t.app)
      .post(`/api/labs/${lab.labId}/batch-plans`)
      .set(bearer(lab.token))
      .send({
        recipeRevisionId: recipe.current.id,
        target: { basis: 'water_volume', millilitres: 5000 },
        storageTempC: 20,
      });
    expect(res.status).toBe(200);
    const plan = batchPlanSchema.parse(res.body);
    // 5 g per 100 g water × 5000 g water (1 mL water taken as 1 g) = 250 g (arithmetic)
    expect(plan.ingredients[0]!.massG).toBeCloseTo(250, 6);
    expect(plan.solutionMassG).toBeCloseTo(5250, 6);
    expect(await rowCounts()).toEqual(before);
  });

  it('warns that a batch stored cold is supersaturated', async () => {
    const lab = await signUpPerson(t);
    const { recipe } = await boricRecipe(lab, 6);
    const res = await request(t.app)
      .post(`/api/labs/${lab.labId}/batch-plans`)
      .set(bearer(lab.token))
      .send({
        recipeRevisionId: recipe.current.id,
        target: { basis: 'water_mass', grams: 1000 },
        storageTempC: 5,
      });
    // Source: chemister.ru boric acid entry [C]: 3.65 g/100 g at 10 °C < 6 g
    expect(res.body.warnings.map((w: { code: string }) => w.code)).toContain(
      'supersaturated_at_storage',
    );
  });

  it('plans from inline ingredients too, and refuses a storage temperature below freezing', async () => {
    const lab = await signUpPerson(t);
    const boric = await chemicalId(lab, 'boric-acid');
    const ok = await request(t.app)
      .post(`/api/labs/${lab.labId}/batch-plans`)
      .set(bearer(lab.token))
      .send({
        ingredients: [{ chemicalId: boric, amount: 40, unit: 'g_per_l_water' }],
        mixingTempC: 30,
        storageTempC: 25,
        target: { basis: 'water_volume', millilitres: 2000 },
      });
    expect(ok.status).toBe(200);
    expect(ok.body.ingredients[0].massG).toBeCloseTo(80, 6);
    const cold = await request(t.app)
      .post(`/api/labs/${lab.labId}/batch-plans`)
      .set(bearer(lab.token))
      .send({
        ingredients: [{ chemicalId: boric, amount: 4, unit: 'g_per_100g_water' }],
        mixingTempC: 30,
        storageTempC: -2,
        target: { basis: 'water_volume', millilitres: 2000 },
      });
    expect(cold.status).toBe(400);
    expect(cold.body.error.fields[0].path).toBe('storageTempC');
  });
});

describe('batches', () => {
  it('flags a weighed mass outside the lab tolerance (default ±2 %)', async () => {
    const lab = await signUpPerson(t);
    const { recipe, boric } = await boricRecipe(lab);
    const within = await request(t.app)
      .post(`/api/labs/${lab.labId}/batches`)
      .set(bearer(lab.token))
      .send(batchBody(recipe.current.id, boric, 254));
    expect(batchSchema.parse(within.body).weighIns[0]).toMatchObject({
      targetG: 250,
      weighedG: 254,
      deviationPct: 1.6,
      flagged: false,
    });
    const outside = await request(t.app)
      .post(`/api/labs/${lab.labId}/batches`)
      .set(bearer(lab.token))
      .send(batchBody(recipe.current.id, boric, 262));
    expect(outside.body.weighIns[0]).toMatchObject({ deviationPct: 4.8, flagged: true });
    expect(outside.body.anyOutOfTolerance).toBe(true);
    expect(outside.body.code).toMatch(/^B-\d{6}-\d{2}$/);
    expect(outside.body.code).not.toBe(within.body.code);
  });

  it("uses the lab's own tolerance once a manager changes it", async () => {
    const lab = await signUpPerson(t);
    const { recipe, boric } = await boricRecipe(lab);
    const set = await request(t.app)
      .patch(`/api/labs/${lab.labId}/settings`)
      .set(bearer(lab.token))
      .send({ weighTolerancePct: 5 });
    expect(set.status).toBe(200);
    const res = await request(t.app)
      .post(`/api/labs/${lab.labId}/batches`)
      .set(bearer(lab.token))
      .send(batchBody(recipe.current.id, boric, 262));
    expect(res.body).toMatchObject({ tolerancePct: 5, anyOutOfTolerance: false });
  });

  it('records a retried batch once: the same clientId answers 200 with the same batch', async () => {
    const lab = await signUpPerson(t);
    const { recipe, boric } = await boricRecipe(lab);
    const body = batchBody(recipe.current.id, boric, 250);
    const [a, b] = await Promise.all([
      request(t.app).post(`/api/labs/${lab.labId}/batches`).set(bearer(lab.token)).send(body),
      request(t.app).post(`/api/labs/${lab.labId}/batches`).set(bearer(lab.token)).send(body),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 201]);
    expect(a.body.id).toBe(b.body.id);
    const list = await request(t.app).get(`/api/labs/${lab.labId}/batches`).set(bearer(lab.token));
    expect(list.body.batches).toHaveLength(1);
  });

  it.each([
    ['without the cautions ticked', { cautionsAcknowledged: false }, 'cautionsAcknowledged'],
    ['with a zero weighed mass', { weighIns: 'zero' }, 'weighIns.0.weighedG'],
    ['with a chemical not in the recipe', { weighIns: 'foreign' }, 'weighIns.0.chemicalId'],
    ['with a storage temperature below freezing', { storageTempC: -1 }, 'storageTempC'],
  ] as [string, Record<string, unknown>, string][])(
    'answers 400 %s and changes nothing',
    async (_label, change, field) => {
      const lab = await signUpPerson(t);
      const { recipe, boric } = await boricRecipe(lab);
      const dap = await chemicalId(lab, 'diammonium-phosphate');
      const body: Record<string, unknown> = {
        ...batchBody(recipe.current.id, boric, 250),
        ...change,
      };
      if (change.weighIns === 'zero') body.weighIns = [{ chemicalId: boric, weighedG: 0 }];
      if (change.weighIns === 'foreign') body.weighIns = [{ chemicalId: dap, weighedG: 10 }];
      const before = await rowCounts();
      const res = await request(t.app)
        .post(`/api/labs/${lab.labId}/batches`)
        .set(bearer(lab.token))
        .send(body);
      expect(res.status).toBe(400);
      expect(res.body.error.fields.map((f: { path: string }) => f.path)).toContain(field);
      expect(await rowCounts()).toEqual(before);
    },
  );

  it('starts the soak timer, then moves prepared → in use → used up, and refuses going back', async () => {
    const lab = await signUpPerson(t);
    const { recipe, boric } = await boricRecipe(lab);
    const created = await request(t.app)
      .post(`/api/labs/${lab.labId}/batches`)
      .set(bearer(lab.token))
      .send(batchBody(recipe.current.id, boric, 250));
    const path = `/api/labs/${lab.labId}/batches/${created.body.id}`;
    const soak = await request(t.app).patch(path).set(bearer(lab.token)).send({ startSoak: true });
    expect(soak.body.status).toBe('in_use');
    const started = Date.parse(soak.body.soakStartedAt);
    expect(Date.parse(soak.body.soakEndsAt) - started).toBe(30 * 60_000);
    expect(Date.parse(soak.body.dryingReadyAt) - started).toBe((30 + 5 + 720) * 60_000);
    expect(
      (await request(t.app).patch(path).set(bearer(lab.token)).send({ status: 'used_up' })).body
        .status,
    ).toBe('used_up');
    const back = await request(t.app)
      .patch(path)
      .set(bearer(lab.token))
      .send({ status: 'prepared' });
    expect(back.status).toBe(409);
    expect(back.body.error.code).toBe('invalid_transition');
  });

  it('asks for a reason to discard', async () => {
    const lab = await signUpPerson(t);
    const { recipe, boric } = await boricRecipe(lab);
    const created = await request(t.app)
      .post(`/api/labs/${lab.labId}/batches`)
      .set(bearer(lab.token))
      .send(batchBody(recipe.current.id, boric, 250));
    const path = `/api/labs/${lab.labId}/batches/${created.body.id}`;
    const bare = await request(t.app)
      .patch(path)
      .set(bearer(lab.token))
      .send({ status: 'discarded' });
    expect(bare.status).toBe(400);
    expect(bare.body.error.fields[0].path).toBe('discardReason');
    const ok = await request(t.app)
      .patch(path)
      .set(bearer(lab.token))
      .send({ status: 'discarded', discardReason: 'Crystals overnight' });
    expect(ok.body).toMatchObject({ status: 'discarded', discardReason: 'Crystals overnight' });
  });

  it('logs specimens with their add-on and pick-up, once per clientId, codes unique in the lab', async () => {
    const lab = await signUpPerson(t);
    const { recipe, boric } = await boricRecipe(lab);
    const created = await request(t.app)
      .post(`/api/labs/${lab.labId}/batches`)
      .set(bearer(lab.token))
      .send(batchBody(recipe.current.id, boric, 250));
    const path = `/api/labs/${lab.labId}/batches/${created.body.id}/specimens`;
    const specimen = {
      clientId: randomUUID(),
      code: 'M-01',
      substrate: 'muslin',
      lengthMm: 300,
      widthMm: 75,
      dryMassBeforeG: 4.0,
      wetMassG: 9.2,
      dryMassAfterG: 4.26,
    };
    const first = await request(t.app).post(path).set(bearer(lab.token)).send(specimen);
    expect(first.status).toBe(201);
    // add-on = (4.26 − 4.0)/4.0 = 6.5 %; pick-up = (9.2 − 4.0)/4.0 = 130 % (definitions, arithmetic)
    expect(first.body).toMatchObject({ addOnPct: 6.5, pickUpPct: 130 });
    const retry = await request(t.app).post(path).set(bearer(lab.token)).send(specimen);
    expect(retry.status).toBe(200);
    expect(retry.body.id).toBe(first.body.id);
    const clash = await request(t.app)
      .post(path)
      .set(bearer(lab.token))
      .send({ ...specimen, clientId: randomUUID() });
    expect(clash.status).toBe(409);
    expect(clash.body.error.fields[0].path).toBe('code');
    const later = await request(t.app)
      .patch(`${path}/${first.body.id}`)
      .set(bearer(lab.token))
      .send({ dryMassAfterG: 4.4 });
    expect(later.body.addOnPct).toBe(10);
  });
});

describe('roles on recipe and batch routes', () => {
  it('lets a viewer read and plan but not write, and a reviewer likewise', async () => {
    const lab = await signUpPerson(t);
    const { recipe, boric } = await boricRecipe(lab);
    for (const role of ['viewer', 'reviewer'] as const) {
      const person = await memberWithRole(t, lab.labId, role);
      expect(
        (await request(t.app).get(`/api/labs/${lab.labId}/recipes`).set(bearer(person.token)))
          .status,
      ).toBe(200);
      const plan = await request(t.app)
        .post(`/api/labs/${lab.labId}/batch-plans`)
        .set(bearer(person.token))
        .send({
          recipeRevisionId: recipe.current.id,
          target: { basis: 'water_mass', grams: 100 },
          storageTempC: 20,
        });
      expect(plan.status).toBe(200);
      const write = await request(t.app)
        .post(`/api/labs/${lab.labId}/batches`)
        .set(bearer(person.token))
        .send(batchBody(recipe.current.id, boric, 250));
      expect(write.status).toBe(403);
    }
  });
});
