import Papa from 'papaparse';
import request from 'supertest';
import { DEMO_PASSWORD, demoPeople, loadDemoData } from '../../fixtures/demo';
import { PairImportModel } from '../../server/models';
import { signOffPair } from '../../server/services/burn-tests';
import { pairImportPreviewSchema, pairImportResultSchema } from '../../shared/schemas/pair-import';
import { pairSchema, type Pair } from '../../shared/schemas/burn';
import { rankingSchema } from '../../shared/schemas/ranking';
import {
  bearer,
  memberWithRole,
  signInForToken,
  signUpPerson,
  type Person,
} from '../support/accounts';
import { withTestApp } from '../support/app';
import { pairsCsv, recipeNamed, sitting } from '../support/imports';

const t = withTestApp();

type Lab = { id: string; manager: Person; technician: Person; reviewer: Person };
async function makeLab(name: string, recipe = 'Drape soak'): Promise<Lab> {
  const manager = await signUpPerson(t, name);
  await recipeNamed(manager.labId, manager.userId, recipe, 2);
  return {
    id: manager.labId,
    manager,
    technician: await memberWithRole(t, manager.labId, 'technician'),
    reviewer: await memberWithRole(t, manager.labId, 'reviewer'),
  };
}

const good = (over: Record<string, string> = {}) => ({
  ...sitting,
  recipe: 'Drape soak',
  revision: '2',
  substrate: 'Muslin',
  control_char_mm: '300',
  treated_char_mm: '52',
  treated_afterflame_s: '0.8',
  treated_afterglow_s: '4',
  ...over,
});

function preview(lab: Lab, text: string, who: Person = lab.technician, fileName = 'old-burns.csv') {
  return request(t.app)
    .post(`/api/labs/${lab.id}/pair-imports/preview?fileName=${encodeURIComponent(fileName)}`)
    .set(bearer(who.token))
    .set('Content-Type', 'text/csv')
    .send(text);
}

const accept = (lab: Lab, importId: string, who: Person = lab.technician) =>
  request(t.app).post(`/api/labs/${lab.id}/pair-imports/${importId}/accept`).set(bearer(who.token));

const TABLES = [
  'burn_sessions',
  'burn_pairs',
  'specimens',
  'marks',
  'measurements',
  'batches',
  'audit_events',
];
async function counts(): Promise<Record<string, number>> {
  const [rows] = await t.db.sequelize.query(
    `SELECT ${TABLES.map((n) => `(SELECT count(*) FROM ${n})::int AS ${n}`).join(', ')}`,
  );
  return rows[0] as Record<string, number>;
}

let labs: { a: Lab; b: Lab };
beforeAll(async () => {
  labs = { a: await makeLab('Import lab A'), b: await makeLab('Import lab B') };
});

describe('POST /api/labs/:labId/pair-imports/preview', () => {
  it('answers every row with its line and errors by column, and writes no burn record', async () => {
    const before = await counts();
    const res = await preview(
      labs.a,
      pairsCsv([
        good(),
        good({ recipe: 'Unknown soak', treated_char_mm: 'abc' }),
        good({ control_char_mm: '12,5', treated_char_mm: '10,5' }),
        good({ revision: '7', held_at: 'yesterday' }),
      ]),
    );
    expect(res.status).toBe(201);
    const p = pairImportPreviewSchema.parse(res.body);
    expect([p.validCount, p.errorCount]).toEqual([2, 2]);
    expect(p.rows.map((r) => [r.line, r.ok])).toEqual([
      [2, true],
      [3, false],
      [4, true],
      [5, false],
    ]);
    expect(p.rows[1]!.errors).toEqual([
      { field: 'treated_char_mm', message: '"abc" is not a number' },
    ]);
    expect(p.rows[3]!.errors).toEqual([
      { field: 'held_at', message: 'Write the date as 2026-03-14 or an ISO date and time' },
    ]);
    expect(p.rows[2]!.values).toMatchObject({ control_char_mm: 12.5, treated_char_mm: 10.5 });
    expect(await counts()).toEqual(before);
  });

  it('names the recipe or revision the lab does not have, once the cells are readable', async () => {
    const p = pairImportPreviewSchema.parse(
      (
        await preview(
          labs.a,
          pairsCsv([
            good({ recipe: 'Unknown soak' }),
            good({ recipe: 'drape SOAK', revision: '7' }),
          ]),
        )
      ).body,
    );
    expect(p.rows.map((r) => r.errors)).toEqual([
      [{ field: 'recipe', message: 'No recipe named "Unknown soak" in this lab' }],
      [{ field: 'revision', message: '"Drape soak" has no revision 7 (it has 1, 2)' }],
    ]);
  });

  it('refuses a specimen code the lab already has or the file repeats', async () => {
    const first = pairImportPreviewSchema.parse(
      (await preview(labs.a, pairsCsv([good({ control_code: 'KEEP-C', treated_code: 'KEEP-T' })])))
        .body,
    );
    expect((await accept(labs.a, first.importId)).status).toBe(200);
    const again = pairImportPreviewSchema.parse(
      (
        await preview(
          labs.a,
          pairsCsv([
            good({ control_code: 'KEEP-C', treated_code: 'NEW-T' }),
            good({ control_code: 'TWICE', treated_code: 'NEW-T2' }),
            good({ control_code: 'TWICE', treated_code: 'NEW-T3' }),
          ]),
        )
      ).body,
    );
    expect(again.rows.map((r) => r.errors)).toEqual([
      [{ field: 'control_code', message: 'KEEP-C is already a specimen of this lab' }],
      [],
      [{ field: 'control_code', message: 'TWICE is also on line 3' }],
    ]);
  });

  it('returns 400 naming the required columns the file lacks', async () => {
    const res = await preview(
      labs.a,
      'held_at,recipe,revision,substrate\n2025-11-03,Drape soak,2,Muslin\n',
    );
    expect(res.status).toBe(400);
    expect(res.body.error.fields.map((f: { path: string }) => f.path)).toEqual([
      'exposure_s',
      'igniter',
      'orientation',
      'draft',
      'control_char_mm',
      'treated_char_mm',
    ]);
  });

  it('returns 415 for a JSON or multipart body, 400 for none, and 413 over 2 MB', async () => {
    const url = `/api/labs/${labs.a.id}/pair-imports/preview`;
    const json = await request(t.app)
      .post(url)
      .set(bearer(labs.a.technician.token))
      .send({ csv: 'held_at' });
    expect(json.status).toBe(415);
    expect(json.body.error.code).toBe('unsupported_media_type');
    const form = await request(t.app)
      .post(url)
      .set(bearer(labs.a.technician.token))
      .attach('file', Buffer.from(pairsCsv([good()])), 'pairs.csv');
    expect(form.status).toBe(415);
    const none = await request(t.app).post(url).set(bearer(labs.a.technician.token));
    expect(none.status).toBe(400);
    expect(none.body.error.fields).toEqual([
      { path: 'file', message: 'Send the CSV as the body, with Content-Type text/csv' },
    ]);
    const big = await preview(labs.a, `${pairsCsv([good()])}\n${'x'.repeat(2 * 1024 * 1024)}`);
    expect(big.status).toBe(413);
    expect(big.body.error.code).toBe('payload_too_large');
  });

  it('returns 400 naming the line when the file is not UTF-8 text, and stores nothing', async () => {
    const file = pairsCsv([good(), good({ substrate: 'Mousseline écrue' })]);
    const sent = (bytes: Buffer) =>
      request(t.app)
        .post(`/api/labs/${labs.a.id}/pair-imports/preview`)
        .set(bearer(labs.a.technician.token))
        .set('Content-Type', 'text/csv')
        .send(bytes);
    const pending = await PairImportModel.count();
    // Windows-1252 (a spreadsheet's "CSV" on many systems), UTF-16 (its "Unicode text"), and a
    // NUL in an otherwise valid row, which PostgreSQL could not store in the pending import.
    const latin1 = await sent(Buffer.from(file, 'latin1'));
    const utf16 = await sent(Buffer.from(`\uFEFF${file}`, 'utf16le'));
    const nul = await sent(Buffer.from(file.replace('Mousseline', 'Mous\u0000seline')));
    expect([latin1.status, utf16.status, nul.status]).toEqual([400, 400, 400]);
    expect(latin1.body.error.fields).toEqual([
      {
        path: 'file',
        message: 'Line 3 has bytes that are not UTF-8 text: save the file as CSV UTF-8',
      },
    ]);
    expect(nul.body.error.fields[0].message).toMatch(/^Line 3 has a NUL byte/);
    expect(await PairImportModel.count()).toBe(pending);
    // The same file in UTF-8, or with its charset named, reads well.
    expect((await sent(Buffer.from(file))).status).toBe(201);
    const named = await request(t.app)
      .post(`/api/labs/${labs.a.id}/pair-imports/preview`)
      .set(bearer(labs.a.technician.token))
      .set('Content-Type', 'text/csv; charset=windows-1252')
      .send(Buffer.from(file, 'latin1'));
    expect(named.status).toBe(201);
    expect(pairImportPreviewSchema.parse(named.body).rows[1]!.values.substrate).toBe(
      'Mousseline écrue',
    );
  });
});

describe('POST /api/labs/:labId/pair-imports/:importId/accept', () => {
  it('writes only the valid rows, as an imported session of pairs waiting for review', async () => {
    const before = await counts();
    const p = pairImportPreviewSchema.parse(
      (
        await preview(
          labs.a,
          pairsCsv([
            good({ treated_burn_time_s: '6.5', add_on_pct: '7,5', treated_mass_loss_pct: '12' }),
            good({ treated_char_mm: '' }),
            good({
              control_afterflame_s: '21',
              control_afterflame_complete: 'false',
              control_burned_to_clamp: 'true',
            }),
          ]),
        )
      ).body,
    );
    const res = await accept(labs.a, p.importId);
    expect(res.status).toBe(200);
    const result = pairImportResultSchema.parse(res.body);
    expect(result.importedPairs).toBe(2);
    expect(result.sessions).toEqual([
      { id: expect.any(String), heldAt: '2025-11-03T12:00:00.000Z', pairs: 2 },
    ]);
    const after = await counts();
    // 2 pairs: 4 specimens, 4 measurements, one session, one imported batch; marks: treated
    // lanes 2 × (applied, removed, out, glow out) + 2 for the longer burn time; one control lane
    // of 3 (applied, removed, clamp). Audit: one event per pair and one for the import.
    expect(Object.fromEntries(TABLES.map((n) => [n, after[n]! - before[n]!]))).toEqual({
      burn_sessions: 1,
      burn_pairs: 2,
      specimens: 4,
      marks: 13,
      measurements: 4,
      batches: 1,
      audit_events: 3,
    });

    const session = await request(t.app)
      .get(`/api/labs/${labs.a.id}/burn-sessions/${result.sessions[0]!.id}`)
      .set(bearer(labs.a.reviewer.token));
    expect(session.body.place).toBe('Imported from old-burns.csv by A technician');
    expect(session.body.notes).toMatch(/^Imported from the file "old-burns.csv" by A technician/);
    expect(session.body.pairs.map((x: { status: string }) => x.status)).toEqual([
      'submitted',
      'submitted',
    ]);
    const queue = await request(t.app)
      .get(`/api/labs/${labs.a.id}/review-queue`)
      .set(bearer(labs.a.reviewer.token));
    expect(queue.body.pairs.map((x: { id: string }) => x.id)).toEqual(
      expect.arrayContaining(session.body.pairs.map((x: { id: string }) => x.id)),
    );

    // The times the timer screen derives from the made-up marks are the file's.
    const pairs: Pair[] = await Promise.all(
      (session.body.pairs as { id: string }[]).map(async (x) =>
        pairSchema.parse(
          (
            await request(t.app)
              .get(`/api/labs/${labs.a.id}/pairs/${x.id}`)
              .set(bearer(labs.a.reviewer.token))
          ).body,
        ),
      ),
    );
    const byLine = (line: number) =>
      pairs.find((x) => x.history.some((h) => h.detail.line === line))!;
    const [, treated] = byLine(2).lanes;
    expect(treated!.derived).toMatchObject({
      exposureMs: 12_000,
      afterflameMs: 800,
      afterflameComplete: true,
      afterglowMs: 4000,
      totalMs: 6500,
      problems: [],
    });
    expect(treated!.specimen.addOnPct).toBe(7.5);
    expect(treated!.measurement).toMatchObject({ charLengthMm: 52, massLossPct: 12 });
    const [control] = byLine(4).lanes;
    expect(control!.derived).toMatchObject({
      afterflameMs: 21_000,
      afterflameComplete: false,
      burnedToClamp: true,
      afterglowMs: null,
    });
    expect(byLine(4).history.map((h) => h.action)).toEqual(['pair_imported']);
  });

  it('writes once when accepted twice, at once or one after the other, and answers the same', async () => {
    const p = pairImportPreviewSchema.parse(
      (await preview(labs.a, pairsCsv([good(), good()]))).body,
    );
    const before = await counts();
    const [one, two] = await Promise.all([accept(labs.a, p.importId), accept(labs.a, p.importId)]);
    const three = await accept(labs.a, p.importId, labs.a.manager);
    expect([one.status, two.status, three.status]).toEqual([200, 200, 200]);
    expect(two.body).toEqual(one.body);
    expect(three.body).toEqual(one.body);
    const after = await counts();
    expect(after.burn_pairs! - before.burn_pairs!).toBe(2);
  });

  it("answers 404 for another lab's import, from that lab's path or one's own", async () => {
    const p = pairImportPreviewSchema.parse((await preview(labs.a, pairsCsv([good()]))).body);
    const stranger = labs.b.technician;
    expect((await accept(labs.a, p.importId, stranger)).status).toBe(404);
    const viaOwn = await accept(labs.b, p.importId, stranger);
    expect(viaOwn.status).toBe(404);
    expect(viaOwn.body.error.code).toBe('not_found');
    expect((await accept(labs.a, p.importId)).status).toBe(200);
  });

  it('answers 409 for an expired preview and for a file without valid rows', async () => {
    const p = pairImportPreviewSchema.parse((await preview(labs.a, pairsCsv([good()]))).body);
    await PairImportModel.update(
      { expiresAt: new Date(Date.now() - 1000) },
      { where: { id: p.importId } },
    );
    const expired = await accept(labs.a, p.importId);
    expect([expired.status, expired.body.error.code]).toEqual([409, 'invalid_transition']);
    const bad = pairImportPreviewSchema.parse(
      (await preview(labs.a, pairsCsv([good({ recipe: 'Nope' })]))).body,
    );
    expect((await accept(labs.a, bad.importId)).status).toBe(409);
  });
});

describe('DELETE /api/labs/:labId/pair-imports/:importId', () => {
  it('discards a pending import, again without complaint, after which it cannot be accepted', async () => {
    const p = pairImportPreviewSchema.parse((await preview(labs.a, pairsCsv([good()]))).body);
    const discard = () =>
      request(t.app)
        .delete(`/api/labs/${labs.a.id}/pair-imports/${p.importId}`)
        .set(bearer(labs.a.technician.token));
    expect((await discard()).status).toBe(204);
    expect((await discard()).status).toBe(204);
    const late = await accept(labs.a, p.importId);
    expect([late.status, late.body.error.code]).toEqual([409, 'invalid_transition']);
  });

  it('answers 409 for an import already accepted', async () => {
    const p = pairImportPreviewSchema.parse((await preview(labs.a, pairsCsv([good()]))).body);
    await accept(labs.a, p.importId);
    const res = await request(t.app)
      .delete(`/api/labs/${labs.a.id}/pair-imports/${p.importId}`)
      .set(bearer(labs.a.manager.token));
    expect(res.status).toBe(409);
  });
});

// Student's sleep data (R datasets::sleep; Cushny & Peebles 1905; Student 1908), shifted by
// 50 mm to serve as char lengths: domain-facts §3.
const g1 = [0.7, -1.6, -0.2, -1.2, -0.1, 3.4, 3.7, 0.8, 0.0, 2.0];
const g2 = [1.9, 0.8, 1.1, 0.1, -0.1, 4.4, 5.5, 1.6, 4.6, 3.4];
const afterflames = [1.2, 0.8, 2.5, 0, 3.1, 1.0, 0.4, 2.2, 1.7, 0.9];

describe('imported pairs in the ranking', () => {
  it("count once signed off, with the file's numbers", async () => {
    const lab = await makeLab('Sleep data lab', 'Sleep soak');
    const rows = g1.map((x, i) =>
      good({
        recipe: 'Sleep soak',
        treated_char_mm: String(50 + x),
        control_char_mm: String(50 + g2[i]!),
        treated_afterflame_s: String(afterflames[i]),
        treated_afterglow_s: '',
        ...(i === 0 ? { treated_afterflame_complete: 'false' } : {}),
      }),
    );
    const p = pairImportPreviewSchema.parse((await preview(lab, pairsCsv(rows))).body);
    const result = pairImportResultSchema.parse((await accept(lab, p.importId)).body);
    const ranking = async () =>
      rankingSchema.parse(
        (await request(t.app).get(`/api/labs/${lab.id}/rankings`).set(bearer(lab.reviewer.token)))
          .body,
      );
    expect((await ranking()).pairsCounted).toBe(0);
    const session = await request(t.app)
      .get(`/api/labs/${lab.id}/burn-sessions/${result.sessions[0]!.id}`)
      .set(bearer(lab.reviewer.token));
    for (const pair of session.body.pairs as { id: string }[]) {
      await signOffPair(lab.id, pair.id, lab.reviewer.userId);
    }
    const r = await ranking();
    expect(r.pairsCounted).toBe(10);
    const soak = r.ranked[0]!;
    // domain-facts §3: paired g2 − g1 mean 1.58, two-sided p = 0.002832890,
    // 95 % CI of g1 − g2 (−2.4598858, −0.7001142), so of control − treated (0.7001142, 2.4598858).
    expect(soak.difference.mean).toBeCloseTo(1.58, 6);
    expect(soak.difference.pairedP).toBeCloseTo(0.00283289, 6);
    expect(soak.difference.ci95![0]).toBeCloseTo(0.7001142, 5);
    expect(soak.difference.ci95![1]).toBeCloseTo(2.4598858, 5);
    // Arithmetic: mean of g1 = 7.5 / 10 = 0.75, so treated mean 50.75 mm.
    expect(soak.treatedChar.mean).toBeCloseTo(50.75, 6);
    // Arithmetic: sorted afterflames 0 0.4 0.8 0.9 1.0 | 1.2 1.7 2.2 2.5 3.1 → median 1.1 s.
    expect(soak.afterflameMedianS).toBeCloseTo(1.1, 6);
    // The first row's flame was still burning when timing ended: 9 of 10 went out by themselves.
    expect(soak.selfExtinguish.count).toBe(9);
  });

  it('give the same statistics in a second lab as in the lab that exported them', async () => {
    await loadDemoData(t.deps);
    const viewer = await signInForToken(t, demoPeople[3]!.email, DEMO_PASSWORD);
    const demoLabId = (await request(t.app).get('/api/me').set(bearer(viewer))).body.labs[0]
      .id as string;
    const exported = await request(t.app)
      .get(`/api/labs/${demoLabId}/pairs.csv`)
      .set(bearer(viewer));
    const rows = Papa.parse<Record<string, string>>(exported.text, {
      header: true,
      skipEmptyLines: true,
    }).data;
    const lead = await signUpPerson(t, 'Second lab');
    const recipes = new Map(rows.map((r) => [r.recipe!, Number(r.revision)]));
    for (const [name, revision] of recipes) {
      await recipeNamed(lead.labId, lead.userId, name, revision);
    }
    const lab = { id: lead.labId, manager: lead, technician: lead, reviewer: lead };
    const p = pairImportPreviewSchema.parse((await preview(lab, exported.text)).body);
    expect(p.rows.filter((r) => !r.ok)).toEqual([]);
    expect(p.ignoredColumns).toEqual([]);
    const result = pairImportResultSchema.parse((await accept(lab, p.importId)).body);
    expect(result.importedPairs).toBe(rows.length);
    for (const s of result.sessions) {
      const session = await request(t.app)
        .get(`/api/labs/${lab.id}/burn-sessions/${s.id}`)
        .set(bearer(lead.token));
      for (const pair of session.body.pairs as { id: string }[]) {
        await signOffPair(lab.id, pair.id, lead.userId);
      }
    }
    const rank = async (labId: string, token: string) =>
      rankingSchema.parse(
        (
          await request(t.app)
            .get(`/api/labs/${labId}/rankings?profile=preset:nfpa-705-field`)
            .set(bearer(token))
        ).body,
      );
    const before = await rank(demoLabId, viewer);
    const after = await rank(lab.id, lead.token);
    const summary = (r: typeof before) =>
      [...r.ranked, ...r.notEnoughPairs].map((x) => ({
        name: `${x.recipeName} rev. ${x.revisionNumber} · ${x.substrate}`,
        rank: x.rank,
        pairs: x.pairs,
        treated: [x.treatedChar.mean, x.treatedChar.sd, x.controlChar.mean],
        difference: [x.difference.mean, ...(x.difference.ci95 ?? []), x.difference.pairedP],
        wilcoxonP: x.difference.wilcoxonP,
        selfExtinguish: x.selfExtinguish.count,
        times: [x.afterflameMedianS, x.afterglowMedianS],
        // The specimens are numbered in the order the database returns them, which may differ.
        verdict: [x.verdict?.pass, x.verdict?.failed.map((f) => f.replace(/\(specimen .*\)/, ''))],
      }));
    // The export rounds times to 0.01 s, which the demo's times already are, and char lengths to
    // 0.1 mm, which the demo's whole millimetres are: these come back to within float noise.
    const near = (value: unknown): unknown =>
      typeof value === 'number'
        ? Math.round(value * 1e6) / 1e6
        : Array.isArray(value)
          ? value.map(near)
          : value && typeof value === 'object'
            ? Object.fromEntries(Object.entries(value).map(([k, v]) => [k, near(v)]))
            : value;
    expect(after.pairsCounted).toBe(before.pairsCounted);
    expect(near(summary(after))).toEqual(near(summary(before)));
    expect(after.leaderStatement).toBe(before.leaderStatement);
    // Percentages are exported to 0.01 %, so a mean of them moves by at most 0.005 % (arithmetic).
    const masses = (r: typeof before) =>
      r.ranked.flatMap((x) => [x.addOnMeanPct ?? NaN, x.massLossMeanPct ?? NaN]);
    masses(after).forEach((m, i) => {
      expect(Math.abs(m - masses(before)[i]!)).toBeLessThanOrEqual(0.005 + 1e-9);
    });
  });
});
