import { randomUUID } from 'node:crypto';
import sharp from 'sharp';
import request from 'supertest';
import { pairSchema } from '../../shared/schemas/burn';
import { PhotoModel } from '../../server/models';
import { bearer, memberWithRole, signUpPerson } from '../support/accounts';
import { withTestApp } from '../support/app';
import { sessionWithPair } from '../support/burn';

const t = withTestApp();

async function lab() {
  const lead = await signUpPerson(t);
  const tech = await memberWithRole(t, lead.labId, 'technician');
  const reviewer = await memberWithRole(t, lead.labId, 'reviewer');
  return { lead, tech, reviewer };
}

const mark = (specimenId: string, kind: string, atMs: number, extra: object = {}) => ({
  id: randomUUID(),
  specimenId,
  kind,
  atMs,
  ...extra,
});

describe('POST /api/labs/:labId/pairs/:pairId/marks', () => {
  it('stores a mark sent twice (same client id) once, and derives the times from the events', async () => {
    const { lead, tech } = await lab();
    const { pair, treatedId } = await sessionWithPair(lead.labId, tech.email);
    const path = `/api/labs/${lead.labId}/pairs/${pair.id}/marks`;
    const marks = [
      mark(treatedId, 'flame_applied', 1000),
      mark(treatedId, 'flame_removed', 13000),
      mark(treatedId, 'flame_out', 15500),
      mark(treatedId, 'glow_out', 19000),
    ];
    const first = await request(t.app)
      .post(path)
      .set(bearer(tech.token))
      .send({ marks: marks.slice(0, 3) });
    expect(first.status).toBe(200);
    // The retry after a lost answer resends what it had, plus the next mark.
    const again = await request(t.app).post(path).set(bearer(tech.token)).send({ marks });
    expect(again.status).toBe(200);
    const treated = pairSchema.parse(again.body).lanes[1]!;
    expect(treated.marks).toHaveLength(4);
    // exposure = 13000 − 1000; afterflame = 15500 − 13000; afterglow = 19000 − 15500 (arithmetic on the scripted times)
    expect(treated.derived).toMatchObject({
      exposureMs: 12000,
      afterflameMs: 2500,
      afterglowMs: 3500,
      afterflameComplete: true,
    });
  });

  it('refuses marks until the safety checklist is complete', async () => {
    const { lead, tech } = await lab();
    const { pair, treatedId } = await sessionWithPair(lead.labId, tech.email, { checklist: false });
    const res = await request(t.app)
      .post(`/api/labs/${lead.labId}/pairs/${pair.id}/marks`)
      .set(bearer(tech.token))
      .send({ marks: [mark(treatedId, 'flame_applied', 0)] });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('checklist_required');
  });

  it('refuses a mark for a specimen outside the pair', async () => {
    const { lead, tech } = await lab();
    const { pair } = await sessionWithPair(lead.labId, tech.email);
    const res = await request(t.app)
      .post(`/api/labs/${lead.labId}/pairs/${pair.id}/marks`)
      .set(bearer(tech.token))
      .send({ marks: [mark(randomUUID(), 'flame_applied', 0)] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields[0].path).toBe('marks.0.specimenId');
  });

  // Found by the hostile-input tests: an undo naming any id at all used to be stored.
  it('returns 400 when an undo names a mark of another test, and stores nothing', async () => {
    const { lead, tech } = await lab();
    const other = await sessionWithPair(lead.labId, tech.email);
    const { pair, treatedId } = await sessionWithPair(lead.labId, tech.email);
    const elsewhere = mark(other.treatedId, 'flame_applied', 0);
    const post = (pairId: string, marks: object[]) =>
      request(t.app)
        .post(`/api/labs/${lead.labId}/pairs/${pairId}/marks`)
        .set(bearer(tech.token))
        .send({ marks });
    expect((await post(other.pair.id, [elsewhere])).status).toBe(200);
    const applied = mark(treatedId, 'flame_applied', 0);
    const res = await post(pair.id, [
      applied,
      mark(treatedId, 'undo', 10, { undoes: elsewhere.id }),
    ]);
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual([
      { path: 'marks.1.undoes', message: 'Names no mark of this test' },
    ]);
    const sameRequest = await post(pair.id, [
      applied,
      mark(treatedId, 'undo', 10, { undoes: applied.id }),
    ]);
    expect(sameRequest.status).toBe(200);
    expect(pairSchema.parse(sameRequest.body).lanes[1]!.marks).toHaveLength(2);
  });
});

describe('review and sign-off', () => {
  it('locks a signed-off test: edits answer 409, a correction with a reason is applied and audited with old and new values', async () => {
    const { lead, tech, reviewer } = await lab();
    const { pair, treatedId } = await sessionWithPair(lead.labId, tech.email);
    const base = `/api/labs/${lead.labId}/pairs/${pair.id}`;
    const measure = await request(t.app)
      .put(`${base}/measurements/${treatedId}`)
      .set(bearer(tech.token))
      .send({ charLengthMm: 48, massBeforeG: 4.3, massAfterG: 4.0 });
    expect(measure.status).toBe(200);
    // mass loss = (4.3 − 4.0)/4.3 = 6.98 % (definition, arithmetic)
    expect(measure.body.lanes[1].measurement.massLossPct).toBeCloseTo(6.98, 2);
    const same = await request(t.app)
      .put(`${base}/measurements/${treatedId}`)
      .set(bearer(tech.token))
      .send({ charLengthMm: 48, massBeforeG: 4.3, massAfterG: 4.0 });
    expect(same.body.lanes[1].measurement.charLengthMm).toBe(48);

    expect((await request(t.app).post(`${base}/submit`).set(bearer(tech.token))).body.status).toBe(
      'submitted',
    );
    expect((await request(t.app).post(`${base}/sign-off`).set(bearer(tech.token))).status).toBe(
      403,
    );
    expect(
      (await request(t.app).post(`${base}/sign-off`).set(bearer(reviewer.token))).body.status,
    ).toBe('signed_off');

    const edit = await request(t.app)
      .put(`${base}/measurements/${treatedId}`)
      .set(bearer(tech.token))
      .send({ charLengthMm: 40 });
    expect(edit.status).toBe(409);
    expect(edit.body.error.code).toBe('locked');
    const marks = await request(t.app)
      .post(`${base}/marks`)
      .set(bearer(tech.token))
      .send({ marks: [mark(treatedId, 'flame_applied', 0)] });
    expect(marks.status).toBe(409);

    const noReason = await request(t.app)
      .post(`${base}/corrections`)
      .set(bearer(reviewer.token))
      .send({ specimenId: treatedId, changes: { charLengthMm: 52 } });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.fields[0].path).toBe('reason');
    const corrected = await request(t.app)
      .post(`${base}/corrections`)
      .set(bearer(reviewer.token))
      .send({
        specimenId: treatedId,
        changes: { charLengthMm: 52 },
        reason: 'Re-measured along the longest tear',
      });
    expect(corrected.status).toBe(200);
    expect(corrected.body.lanes[1].measurement.charLengthMm).toBe(52);
    const correction = corrected.body.history.find(
      (h: { action: string }) => h.action === 'measurement_corrected',
    );
    expect(correction.detail).toMatchObject({
      reason: 'Re-measured along the longest tear',
      before: { charLengthMm: 48 },
      after: { charLengthMm: 52 },
    });
    expect(corrected.body.history.map((h: { action: string }) => h.action)).toEqual([
      'pair_submitted',
      'pair_signed_off',
      'measurement_corrected',
    ]);
  });

  it('returns a test with a comment, after which the technician can edit and resubmit', async () => {
    const { lead, tech, reviewer } = await lab();
    const { pair, controlId } = await sessionWithPair(lead.labId, tech.email);
    const base = `/api/labs/${lead.labId}/pairs/${pair.id}`;
    await request(t.app).post(`${base}/submit`).set(bearer(tech.token));
    const queue = await request(t.app)
      .get(`/api/labs/${lead.labId}/review-queue`)
      .set(bearer(reviewer.token));
    expect(queue.body.pairs.map((p: { id: string }) => p.id)).toContain(pair.id);
    const returned = await request(t.app)
      .post(`${base}/return`)
      .set(bearer(reviewer.token))
      .send({ comment: 'Control char length missing' });
    expect(returned.body).toMatchObject({
      status: 'returned',
      reviewComment: 'Control char length missing',
    });
    expect(
      (
        await request(t.app)
          .put(`${base}/measurements/${controlId}`)
          .set(bearer(tech.token))
          .send({ charLengthMm: 180 })
      ).status,
    ).toBe(200);
    expect((await request(t.app).post(`${base}/submit`).set(bearer(tech.token))).body.status).toBe(
      'submitted',
    );
  });

  it('lets only one of two reviewers acting at once move a test, with one history entry', async () => {
    const { lead, tech, reviewer } = await lab();
    const { pair } = await sessionWithPair(lead.labId, tech.email);
    const base = `/api/labs/${lead.labId}/pairs/${pair.id}`;
    await request(t.app).post(`${base}/submit`).set(bearer(tech.token));
    const [signOff, giveBack] = await Promise.all([
      request(t.app).post(`${base}/sign-off`).set(bearer(lead.token)),
      request(t.app)
        .post(`${base}/return`)
        .set(bearer(reviewer.token))
        .send({ comment: 'Redo it' }),
    ]);
    expect([signOff.status, giveBack.status].sort()).toEqual([200, 409]);
    const after = await request(t.app).get(base).set(bearer(tech.token));
    expect(after.body.history.map((h: { action: string }) => h.action)).toHaveLength(2);
  });
});

describe('POST /api/labs/:labId/pairs/:pairId/photos', () => {
  const jpeg = () =>
    sharp({ create: { width: 64, height: 48, channels: 3, background: '#884422' } })
      .jpeg()
      .toBuffer();

  it('stores a photo once per client id and serves it and its thumbnail', async () => {
    const { lead, tech } = await lab();
    const { pair, treatedId } = await sessionWithPair(lead.labId, tech.email);
    const id = randomUUID();
    const upload = async () =>
      request(t.app)
        .post(`/api/labs/${lead.labId}/pairs/${pair.id}/photos`)
        .set(bearer(tech.token))
        .field('clientId', id)
        .field('specimenId', treatedId)
        .field('stage', 'after')
        .attach('photo', await jpeg(), { filename: 'after.jpg', contentType: 'image/jpeg' });
    expect((await upload()).status).toBe(201);
    expect((await upload()).status).toBe(200);
    expect(await PhotoModel.count({ where: { pairId: pair.id } })).toBe(1);
    const image = await request(t.app)
      .get(`/api/labs/${lead.labId}/photos/${id}`)
      .set(bearer(tech.token));
    expect(image.headers['content-type']).toBe('image/jpeg');
    expect((await sharp(image.body as Buffer).metadata()).width).toBe(64);
    const thumb = await request(t.app)
      .get(`/api/labs/${lead.labId}/photos/${id}/thumbnail`)
      .set(bearer(tech.token));
    expect(thumb.status).toBe(200);
  });

  it.each([
    ['a text file', Buffer.from('not an image at all'), 'notes.txt', 'text/plain', 415],
    [
      'a file that claims to be a JPEG but is not',
      Buffer.from('GIF89a fake bytes here'),
      'photo.jpg',
      'image/jpeg',
      415,
    ],
  ])(
    'refuses %s with 4xx and stores nothing',
    async (_label, body, filename, contentType, status) => {
      const { lead, tech } = await lab();
      const { pair, treatedId } = await sessionWithPair(lead.labId, tech.email);
      const res = await request(t.app)
        .post(`/api/labs/${lead.labId}/pairs/${pair.id}/photos`)
        .set(bearer(tech.token))
        .field('clientId', randomUUID())
        .field('specimenId', treatedId)
        .field('stage', 'before')
        .attach('photo', body, { filename, contentType });
      expect(res.status).toBe(status);
      expect(await PhotoModel.count({ where: { pairId: pair.id } })).toBe(0);
    },
  );

  it('refuses an oversized file with 413 and stores nothing', async () => {
    const { lead, tech } = await lab();
    const { pair, treatedId } = await sessionWithPair(lead.labId, tech.email);
    const res = await request(t.app)
      .post(`/api/labs/${lead.labId}/pairs/${pair.id}/photos`)
      .set(bearer(tech.token))
      .field('clientId', randomUUID())
      .field('specimenId', treatedId)
      .field('stage', 'before')
      .attach('photo', Buffer.alloc(16 * 1024 * 1024, 1), {
        filename: 'huge.jpg',
        contentType: 'image/jpeg',
      });
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('payload_too_large');
    expect(await PhotoModel.count({ where: { pairId: pair.id } })).toBe(0);
  });

  // Found by the hostile-input tests: form fields the route does not know used to be dropped.
  it('returns 400 naming a form field it does not know, and stores nothing', async () => {
    const { lead, tech } = await lab();
    const { pair, treatedId } = await sessionWithPair(lead.labId, tech.email);
    const res = await request(t.app)
      .post(`/api/labs/${lead.labId}/pairs/${pair.id}/photos`)
      .set(bearer(tech.token))
      .field('clientId', randomUUID())
      .field('specimenId', treatedId)
      .field('stage', 'before')
      .field('labId', randomUUID())
      .attach('photo', await jpeg(), { filename: 'p.jpg', contentType: 'image/jpeg' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toEqual([{ path: 'labId', message: 'Unknown field' }]);
    expect(await PhotoModel.count({ where: { pairId: pair.id } })).toBe(0);
  });
});

describe('roles on burn-test routes', () => {
  it('lets a viewer read but not mark, submit or sign off; another lab gets 404', async () => {
    const { lead, tech } = await lab();
    const viewer = await memberWithRole(t, lead.labId, 'viewer');
    const other = await signUpPerson(t);
    const { pair, treatedId } = await sessionWithPair(lead.labId, tech.email);
    const base = `/api/labs/${lead.labId}/pairs/${pair.id}`;
    expect((await request(t.app).get(base).set(bearer(viewer.token))).status).toBe(200);
    expect(
      (await request(t.app).get(`/api/labs/${lead.labId}/burn-sessions`).set(bearer(viewer.token)))
        .status,
    ).toBe(200);
    expect(
      (
        await request(t.app)
          .post(`${base}/marks`)
          .set(bearer(viewer.token))
          .send({ marks: [mark(treatedId, 'flame_applied', 0)] })
      ).status,
    ).toBe(403);
    expect((await request(t.app).post(`${base}/submit`).set(bearer(viewer.token))).status).toBe(
      403,
    );
    expect((await request(t.app).post(`${base}/sign-off`).set(bearer(viewer.token))).status).toBe(
      403,
    );
    expect(
      (
        await request(t.app)
          .get(`/api/labs/${other.labId}/pairs/${pair.id}`)
          .set(bearer(other.token))
      ).status,
    ).toBe(404);
    expect(
      (
        await request(t.app)
          .get(`/api/labs/${lead.labId}/pairs/${pair.id}`)
          .set(bearer(other.token))
      ).status,
    ).toBe(404);
  });
});

describe('POST /api/labs/:labId/burn-sessions', () => {
  it("records the criteria profile the session is judged against, and refuses another lab's profile", async () => {
    const { lead, tech } = await lab();
    const other = await signUpPerson(t);
    const own = await request(t.app)
      .post(`/api/labs/${lead.labId}/criteria-profiles/copy-preset`)
      .set(bearer(lead.token))
      .send({ presetKey: 'nfpa-705-field' });
    const foreign = await request(t.app)
      .post(`/api/labs/${other.labId}/criteria-profiles/copy-preset`)
      .set(bearer(other.token))
      .send({ presetKey: 'nfpa-705-field' });
    const body = {
      heldAt: new Date().toISOString(),
      place: 'Yard',
      draft: 'open_air',
      wind: 'light breeze',
      igniter: 'match',
      orientation: 'vertical',
    };
    const ok = await request(t.app)
      .post(`/api/labs/${lead.labId}/burn-sessions`)
      .set(bearer(tech.token))
      .send({ ...body, clientId: randomUUID(), criteriaProfileId: own.body.id });
    expect(ok.status).toBe(201);
    expect(ok.body.criteriaProfile).toEqual({ id: own.body.id, name: own.body.name });
    expect(ok.body.exposureS).toBe(12);
    const bad = await request(t.app)
      .post(`/api/labs/${lead.labId}/burn-sessions`)
      .set(bearer(tech.token))
      .send({ ...body, clientId: randomUUID(), criteriaProfileId: foreign.body.id });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields[0].path).toBe('criteriaProfileId');
  });
});
