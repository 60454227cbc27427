import { createHash, randomUUID } from 'node:crypto';
import { gzipSync } from 'node:zlib';
import { QueryTypes, Transaction } from 'sequelize';
import { deriveLane } from '../../shared/burn/derive';
import type { Mark } from '../../shared/burn/marks';
import { criteriaPresets } from '../../shared/criteria/presets';
import { rankTreatments, type PairRow } from '../../shared/ranking/rank';
import type { RankingOutput, RankingQuery } from '../../shared/schemas/ranking';
import { AppError } from '../errors';
import { BurnPairModel, CriteriaProfileModel } from '../models';
import type { CriteriaProfileInput } from '../../shared/criteria/types';
import { VersionedCache } from './versioned-cache';

type Row = {
  pair_id: string;
  mode: string;
  held_at: Date;
  exposure_s: number;
  igniter: string;
  orientation: string;
  draft: string;
  recipe_id: string;
  recipe_name: string;
  revision_id: string;
  revision_number: number;
  batch_code: string;
  t_id: string;
  t_code: string;
  t_substrate: string;
  t_before: number;
  t_after: number | null;
  c_id: string;
  c_code: string;
  t_char: number | null;
  t_mb: number | null;
  t_ma: number | null;
  t_drips: boolean | null;
  c_char: number | null;
  c_mb: number | null;
  c_ma: number | null;
  c_drips: boolean | null;
  marks: {
    id: string;
    kind: Mark['kind'];
    atMs: number;
    undoes: string | null;
    specimenId: string;
  }[];
};

// One query for every pair the ranking needs, marks included: no query per treatment or pair.
const SQL = `
SELECT p.id AS pair_id, p.mode, s.held_at, s.exposure_s, s.igniter, s.orientation, s.draft,
       r.id AS recipe_id, r.name AS recipe_name,
       rev.id AS revision_id, rev.number AS revision_number, b.code AS batch_code,
       t.id AS t_id, t.code AS t_code, t.substrate AS t_substrate,
       t.dry_mass_before_g AS t_before, t.dry_mass_after_g AS t_after,
       c.id AS c_id, c.code AS c_code,
       mt.char_length_mm AS t_char, mt.mass_before_g AS t_mb, mt.mass_after_g AS t_ma, mt.flaming_drips AS t_drips,
       mc.char_length_mm AS c_char, mc.mass_before_g AS c_mb, mc.mass_after_g AS c_ma, mc.flaming_drips AS c_drips,
       COALESCE((SELECT json_agg(json_build_object('id', k.id, 'kind', k.kind, 'atMs', k.at_ms,
                                                   'undoes', k.undoes, 'specimenId', k.specimen_id))
                 FROM marks k WHERE k.pair_id = p.id), '[]'::json) AS marks
FROM burn_pairs p
JOIN burn_sessions s ON s.id = p.session_id
JOIN specimens t ON t.id = p.treated_specimen_id
JOIN specimens c ON c.id = p.control_specimen_id
JOIN batches b ON b.id = t.batch_id
JOIN recipe_revisions rev ON rev.id = b.revision_id
JOIN recipes r ON r.id = rev.recipe_id
LEFT JOIN measurements mt ON mt.pair_id = p.id AND mt.specimen_id = t.id
LEFT JOIN measurements mc ON mc.pair_id = p.id AND mc.specimen_id = c.id
WHERE p.lab_id = :labId AND p.status IN (:statuses)
  AND (CAST(:substrate AS text) IS NULL OR r.substrate = :substrate)
  AND (CAST(:from AS date) IS NULL OR s.held_at >= CAST(:from AS date))
  AND (CAST(:to AS date) IS NULL OR s.held_at < CAST(:to AS date) + 1)
  AND (CAST(:igniter AS text) IS NULL OR s.igniter = :igniter)
  AND (CAST(:exposure AS double precision) IS NULL OR s.exposure_s = :exposure)
  AND (CAST(:orientation AS text) IS NULL OR s.orientation = :orientation)
  AND (CAST(:revisionId AS uuid) IS NULL OR rev.id = CAST(:revisionId AS uuid))
`;

/** Every pair the ranking counts under these filters; `revisionId` narrows to one revision. */
export async function fetchPairRows(
  labId: string,
  q: RankingQuery & { revisionId?: string },
  transaction?: Transaction,
): Promise<Row[]> {
  return BurnPairModel.sequelize!.query<Row>(SQL, {
    type: QueryTypes.SELECT,
    ...(transaction ? { transaction } : {}),
    replacements: {
      labId,
      statuses: q.unreviewed ? ['signed_off', 'submitted'] : ['signed_off'],
      substrate: q.substrate ?? null,
      from: q.from ?? null,
      to: q.to ?? null,
      igniter: q.igniter ?? null,
      exposure: q.exposureS ?? null,
      orientation: q.orientation ?? null,
      revisionId: q.revisionId ?? null,
    },
  });
}

function outcome(row: Row, role: 't' | 'c') {
  const specimenId = role === 't' ? row.t_id : row.c_id;
  const marks: Mark[] = row.marks
    .filter((m) => m.specimenId === specimenId)
    .map((m) => ({
      id: m.id,
      kind: m.kind,
      atMs: m.atMs,
      ...(m.undoes ? { undoes: m.undoes } : {}),
    }));
  const d = deriveLane(marks);
  const before = role === 't' ? row.t_mb : row.c_mb;
  const after = role === 't' ? row.t_ma : row.c_ma;
  return {
    code: role === 't' ? row.t_code : row.c_code,
    charLengthMm: role === 't' ? row.t_char : row.c_char,
    afterflameS: d.afterflameMs === null ? null : d.afterflameMs / 1000,
    afterflameComplete: d.afterflameComplete,
    afterglowS: d.afterglowMs === null ? null : d.afterglowMs / 1000,
    flamingDrips: role === 't' ? row.t_drips : row.c_drips,
    massLossPct: before && after !== null ? ((before - after) / before) * 100 : null,
    burnedToClamp: d.burnedToClamp,
    burnTimeS: d.totalMs === null ? null : d.totalMs / 1000,
  };
}

export function toPairRow(row: Row): PairRow {
  const substrate = row.t_substrate.trim();
  return {
    pairId: row.pair_id,
    heldAt: new Date(row.held_at).toISOString(),
    treatmentKey: `${row.revision_id}|${substrate.toLowerCase()}`,
    recipeId: row.recipe_id,
    recipeName: row.recipe_name,
    revisionId: row.revision_id,
    revisionNumber: row.revision_number,
    substrate,
    batchCode: row.batch_code,
    addOnPct: row.t_after === null ? null : ((row.t_after - row.t_before) / row.t_before) * 100,
    treated: outcome(row, 't'),
    control: outcome(row, 'c'),
  };
}

/** NaN and infinities are not JSON: an undefined statistic travels as null. */
function clean<T>(value: T): T {
  return JSON.parse(
    JSON.stringify(value, (_k, v: unknown) =>
      typeof v === 'number' && !Number.isFinite(v) ? null : v,
    ),
  ) as T;
}

const noProfile = () =>
  new AppError(400, 'invalid_request', 'Some fields are not valid.', [
    { path: 'profile', message: 'No such criteria profile' },
  ]);

const OWN_PROFILE_CAUTION =
  'A bench test judged against these rules is not a certification: local fire codes and the Authority Having Jurisdiction decide.';

/** The profile to judge against: `preset:<key>`, or the id of one of the lab's own profiles. */
export async function profileFor(
  labId: string,
  key: string | undefined,
  transaction?: Transaction,
) {
  if (!key) return undefined;
  if (key.startsWith('preset:')) {
    const preset = criteriaPresets.find((p) => `preset:${p.key}` === key);
    if (!preset) throw noProfile();
    return {
      key,
      profile: preset as CriteriaProfileInput,
      name: preset.name,
      source: preset.source ?? null,
      caution: preset.caution,
    };
  }
  if (!/^[0-9a-f-]{36}$/i.test(key)) throw noProfile();
  const row = await CriteriaProfileModel.findOne({
    where: { id: key, labId },
    ...(transaction ? { transaction } : {}),
  });
  if (!row) throw noProfile();
  const profile: CriteriaProfileInput = {
    name: row.name,
    minSpecimens: row.minSpecimens,
    rules: row.rules,
    ...(row.source ? { source: row.source } : {}),
  };
  return { key, profile, name: row.name, source: row.source, caution: OWN_PROFILE_CAUTION };
}

/** The ranking computed from the database, every time (the cache below serves repeats). */
export async function computeRankings(
  labId: string,
  q: RankingQuery,
  transaction?: Transaction,
): Promise<RankingOutput> {
  const chosen = await profileFor(labId, q.profile, transaction);
  const rows = (await fetchPairRows(labId, q, transaction)).map(toPairRow);
  const result = rankTreatments(rows, {
    sort: q.sort,
    ...(chosen ? { profile: chosen.profile } : {}),
    ...(q.detectMm ? { detectMm: q.detectMm } : {}),
  });
  return clean({
    ...result,
    profile: chosen
      ? { key: chosen.key, name: chosen.name, source: chosen.source, caution: chosen.caution }
      : null,
    pairsCounted: rows.length,
    onlySignedOff: !q.unreviewed,
  }) as RankingOutput;
}

type CachedRanking = { body: RankingOutput; json: Buffer; gzipped: Buffer; etag: string };

function encoded(body: RankingOutput, etag: string): CachedRanking {
  const json = Buffer.from(JSON.stringify(body));
  // Compressed once per data version: ~450 kB of JSON for 500 treatments is ~60 kB on a phone.
  return { body, json, gzipped: gzipSync(json), etag };
}

// 10,000 pairs cost ~0.5 s of CPU to rank and ~0.3 MB as JSON: keep a few dozen rankings.
const cache = new VersionedCache<CachedRanking>(64 * 1024 * 1024);

async function labDataVersion(labId: string, transaction?: Transaction): Promise<string | null> {
  const [row] = await BurnPairModel.sequelize!.query<{ version: string }>(
    'SELECT version FROM lab_data_versions WHERE lab_id = :labId',
    { type: QueryTypes.SELECT, replacements: { labId }, ...(transaction ? { transaction } : {}) },
  );
  return row ? String(row.version) : null;
}

const cacheKey = (labId: string, q: RankingQuery) =>
  `${labId}|${JSON.stringify(Object.entries(q).sort(([a], [b]) => a.localeCompare(b)))}`;

/**
 * The ranking, computed again only when the lab's data version has moved since. On a miss the
 * version and the rows are read in one repeatable-read snapshot, so an answer is never filed
 * under a version whose writes it did not see.
 */
async function cachedRanking(labId: string, q: RankingQuery): Promise<CachedRanking> {
  const key = cacheKey(labId, q);
  const seen = await labDataVersion(labId);
  if (seen === null) {
    const body = await computeRankings(labId, q);
    return encoded(body, `"ranking-${randomUUID()}"`);
  }
  const hit = cache.get(key, seen);
  if (hit) return hit;
  return cache.compute(key, seen, () =>
    BurnPairModel.sequelize!.transaction(
      { isolationLevel: Transaction.ISOLATION_LEVELS.REPEATABLE_READ },
      async (transaction) => {
        const version = (await labDataVersion(labId, transaction)) ?? seen;
        const body = await computeRankings(labId, q, transaction);
        const etag = `"ranking-${version}-${createHash('sha1').update(key).digest('hex').slice(0, 16)}"`;
        const value = encoded(body, etag);
        return { version, value, bytes: value.json.length + value.gzipped.length };
      },
    ),
  );
}

export async function rankings(labId: string, q: RankingQuery): Promise<RankingOutput> {
  return (await cachedRanking(labId, q)).body;
}

/** The ranking as the JSON the API sends, with an entity tag that changes with the data. */
export async function rankingsJson(
  labId: string,
  q: RankingQuery,
): Promise<Pick<CachedRanking, 'json' | 'gzipped' | 'etag'>> {
  return cachedRanking(labId, q);
}

/** The pairs with their session's conditions: what a pairs file needs to import elsewhere. */
export async function pairRowsForCsv(labId: string, q: RankingQuery) {
  return (await fetchPairRows(labId, q)).map((row) => ({
    ...toPairRow(row),
    mode: row.mode,
    exposureS: row.exposure_s,
    igniter: row.igniter,
    orientation: row.orientation,
    draft: row.draft,
  }));
}
