import { Op, UniqueConstraintError } from 'sequelize';
import { deriveLane } from '../../shared/burn/derive';
import type { Mark } from '../../shared/burn/marks';
import {
  checklistItems,
  type CreatePairInput,
  type CreateSessionInput,
  type Lane,
  type MeasurementInput,
  type Pair,
  type PostMarksInput,
  type Session,
} from '../../shared/schemas/burn';
import { createPairSchema, createSessionSchema, type PairStatus } from '../../shared/schemas/burn';
import { AppError } from '../errors';
import {
  AuditEventModel,
  BatchModel,
  BurnPairModel,
  BurnSessionModel,
  CriteriaProfileModel,
  MarkModel,
  MeasurementModel,
  PhotoModel,
  RecipeModel,
  RecipeRevisionModel,
  SpecimenModel,
  UserModel,
} from '../models';
import { recordAudit } from './audit';
import { toSpecimen } from './batches';

// Factories, not shared constants: Sequelize annotates include objects in place, and one object
// used for two associations makes it join the wrong alias.
const specimenIncludes = () => [
  {
    model: BatchModel,
    as: 'batch',
    include: [
      {
        model: RecipeRevisionModel,
        as: 'revision',
        include: [{ model: RecipeModel, as: 'recipe' }],
      },
    ],
  },
];
const pairIncludes = () => [
  { model: SpecimenModel, as: 'control', include: specimenIncludes() },
  { model: SpecimenModel, as: 'treated', include: specimenIncludes() },
];

function summary(p: BurnPairModel) {
  return {
    id: p.id,
    status: p.status,
    mode: p.mode as 'simultaneous' | 'sequential',
    controlCode: p.control?.code ?? '',
    treatedCode: p.treated?.code ?? '',
    recipeName: p.treated?.batch?.revision?.recipe?.name ?? null,
    createdAt: p.createdAt.toISOString(),
  };
}

function toSession(row: BurnSessionModel): Session {
  return {
    id: row.id,
    heldAt: row.heldAt.toISOString(),
    place: row.place,
    operator: row.operator?.displayName ?? null,
    secondPerson: row.secondPerson,
    ambientTempC: row.ambientTempC,
    ambientRhPct: row.ambientRhPct,
    draft: row.draft as Session['draft'],
    wind: row.wind,
    igniter: row.igniter as Session['igniter'],
    igniterDetail: row.igniterDetail,
    exposureS: row.exposureS,
    orientation: row.orientation as Session['orientation'],
    checklist: row.checklist,
    checklistCompletedAt: row.checklistCompletedAt?.toISOString() ?? null,
    criteriaProfile: row.criteriaProfile
      ? { id: row.criteriaProfile.id, name: row.criteriaProfile.name }
      : null,
    notes: row.notes,
    pairs: [...(row.pairs ?? [])]
      .sort((a, b) => a.createdAt.getTime() - b.createdAt.getTime())
      .map(summary),
  };
}

async function loadSession(labId: string, sessionId: string): Promise<BurnSessionModel> {
  const row = await BurnSessionModel.findOne({
    where: { id: sessionId, labId },
    include: [
      { model: UserModel, as: 'operator' },
      { model: CriteriaProfileModel, as: 'criteriaProfile' },
      { model: BurnPairModel, as: 'pairs', include: pairIncludes() },
    ],
  });
  if (!row) throw AppError.notFound('No such burn session in this lab.');
  return row;
}

export async function getSession(labId: string, sessionId: string): Promise<Session> {
  return toSession(await loadSession(labId, sessionId));
}

export async function listSessions(labId: string): Promise<Session[]> {
  const rows = await BurnSessionModel.findAll({
    where: { labId },
    include: [
      { model: UserModel, as: 'operator' },
      { model: CriteriaProfileModel, as: 'criteriaProfile' },
      { model: BurnPairModel, as: 'pairs', include: pairIncludes() },
    ],
    order: [['heldAt', 'DESC']],
    limit: 200,
  });
  return rows.map(toSession);
}

/** Opens a burn session; the same clientId again returns the session already made. */
export async function createSession(
  labId: string,
  operatorId: string,
  input: CreateSessionInput,
): Promise<{ session: Session; created: boolean }> {
  const v = createSessionSchema.parse(input);
  const existing = await BurnSessionModel.findOne({ where: { labId, clientId: v.clientId } });
  if (existing) return { session: await getSession(labId, existing.id), created: false };
  if (
    v.criteriaProfileId &&
    !(await CriteriaProfileModel.count({ where: { id: v.criteriaProfileId, labId } }))
  ) {
    throw new AppError(400, 'invalid_request', 'Some fields are not valid.', [
      { path: 'criteriaProfileId', message: 'No such criteria profile in this lab' },
    ]);
  }
  try {
    const row = await BurnSessionModel.create({
      labId,
      clientId: v.clientId,
      heldAt: new Date(v.heldAt),
      place: v.place,
      operatorId,
      secondPerson: v.secondPerson ?? null,
      ambientTempC: v.ambientTempC ?? null,
      ambientRhPct: v.ambientRhPct ?? null,
      draft: v.draft,
      wind: v.wind ?? null,
      igniter: v.igniter,
      igniterDetail: v.igniterDetail ?? null,
      exposureS: v.exposureS,
      orientation: v.orientation,
      checklistCompletedAt: null,
      checklistCompletedBy: null,
      criteriaProfileId: v.criteriaProfileId ?? null,
      notes: v.notes ?? null,
    });
    return { session: await getSession(labId, row.id), created: true };
  } catch (err) {
    if (!(err instanceof UniqueConstraintError)) throw err;
    const twin = await BurnSessionModel.findOne({ where: { labId, clientId: v.clientId } });
    return { session: await getSession(labId, twin!.id), created: false };
  }
}

/** Ticks on the safety checklist; when all are ticked the session may start burning. */
export async function updateSession(
  labId: string,
  sessionId: string,
  userId: string,
  input: { checklist?: Partial<Record<string, boolean>>; notes?: string },
): Promise<Session> {
  const row = await loadSession(labId, sessionId);
  const checklist = { ...row.checklist };
  for (const [key, value] of Object.entries(input.checklist ?? {})) {
    if (value !== undefined) checklist[key] = value;
  }
  const complete = checklistItems.every((i) => checklist[i.key] === true);
  const changes: Partial<BurnSessionModel> = { checklist };
  const completing = complete && !row.checklistCompletedAt;
  if (completing) {
    changes.checklistCompletedAt = new Date();
    changes.checklistCompletedBy = userId;
  }
  if (!complete && row.checklistCompletedAt) {
    const burned = await MarkModel.count({ where: { pairId: (row.pairs ?? []).map((p) => p.id) } });
    if (burned)
      throw new AppError(
        409,
        'locked',
        'Burning has started: the checklist as ticked is part of the record.',
      );
    changes.checklistCompletedAt = null;
    changes.checklistCompletedBy = null;
  }
  if (input.notes !== undefined) changes.notes = input.notes;
  // The completed checklist and its audit event are stored together or not at all.
  await BurnSessionModel.sequelize!.transaction(async (transaction) => {
    await row.update(changes, { transaction });
    if (completing) {
      await recordAudit(
        { action: 'checklist_completed', labId, actorId: userId, detail: { sessionId, checklist } },
        transaction,
      );
    }
  });
  return getSession(labId, sessionId);
}

/** Adds a pair: the treated specimen from a batch's log, and its untreated control, made here. */
export async function createPair(
  labId: string,
  sessionId: string,
  input: CreatePairInput,
): Promise<{ pair: Pair; created: boolean }> {
  const v = createPairSchema.parse(input);
  await loadSession(labId, sessionId);
  const existing = await BurnPairModel.findOne({ where: { labId, clientId: v.clientId } });
  if (existing) return { pair: await getPair(labId, existing.id), created: false };
  const treated = await SpecimenModel.findOne({
    where: { id: v.treatedSpecimenId, labId, batchId: { [Op.ne]: null } },
  });
  if (!treated) {
    throw new AppError(400, 'invalid_request', 'Some fields are not valid.', [
      { path: 'treatedSpecimenId', message: 'Choose a treated specimen from a batch of this lab' },
    ]);
  }
  if (await BurnPairModel.count({ where: { treatedSpecimenId: treated.id } })) {
    throw new AppError(
      409,
      'already_exists',
      'This specimen is already in a pair: a specimen burns once.',
      [{ path: 'treatedSpecimenId', message: 'Already burned in another pair' }],
    );
  }
  try {
    const id = await BurnPairModel.sequelize!.transaction(async (transaction) => {
      const control = await SpecimenModel.create(
        {
          labId,
          batchId: null,
          clientId: v.control.clientId,
          code: v.control.code,
          substrate: v.control.substrate,
          lengthMm: v.control.lengthMm ?? null,
          widthMm: v.control.widthMm ?? null,
          thicknessMm: v.control.thicknessMm ?? null,
          dryMassBeforeG: v.control.dryMassG,
          wetMassG: null,
          dryMassAfterG: null,
          notes: null,
          conditioning: v.control.conditioning ?? null,
        },
        { transaction },
      );
      const pair = await BurnPairModel.create(
        {
          labId,
          sessionId,
          clientId: v.clientId,
          controlSpecimenId: control.id,
          treatedSpecimenId: treated.id,
          mode: v.mode,
          reviewComment: null,
          submittedAt: null,
          submittedBy: null,
          signedOffAt: null,
          signedOffBy: null,
        },
        { transaction },
      );
      return pair.id;
    });
    return { pair: await getPair(labId, id), created: true };
  } catch (err) {
    if (!(err instanceof UniqueConstraintError)) throw err;
    const twin = await BurnPairModel.findOne({ where: { labId, clientId: v.clientId } });
    if (twin) return { pair: await getPair(labId, twin.id), created: false };
    throw new AppError(
      409,
      'already_exists',
      'A specimen with this code already exists in the lab.',
      [{ path: 'control.code', message: 'Already used in this lab' }],
    );
  }
}

async function loadPair(labId: string, pairId: string): Promise<BurnPairModel> {
  const row = await BurnPairModel.findOne({
    where: { id: pairId, labId },
    include: [...pairIncludes(), { model: BurnSessionModel, as: 'session' }],
  });
  if (!row) throw AppError.notFound('No such burn test in this lab.');
  return row;
}

const massLoss = (m: MeasurementModel) =>
  m.massBeforeG && m.massAfterG !== null
    ? Math.round(((m.massBeforeG - m.massAfterG) / m.massBeforeG) * 10000) / 100
    : null;

function lane(
  role: 'control' | 'treated',
  specimen: SpecimenModel,
  marks: MarkModel[],
  measurements: MeasurementModel[],
  photos: PhotoModel[],
): Lane {
  const own: Mark[] = marks
    .filter((m) => m.specimenId === specimen.id)
    .map((m) => ({
      id: m.id,
      kind: m.kind as Mark['kind'],
      atMs: m.atMs,
      ...(m.undoes ? { undoes: m.undoes } : {}),
    }));
  const { effective: _effective, ...derived } = deriveLane(own);
  const m = measurements.find((x) => x.specimenId === specimen.id);
  const batch = specimen.batch;
  return {
    role,
    specimen: {
      id: specimen.id,
      code: specimen.code,
      substrate: specimen.substrate,
      lengthMm: specimen.lengthMm,
      widthMm: specimen.widthMm,
      dryMassBeforeG: specimen.dryMassBeforeG,
      addOnPct: toSpecimen(specimen).addOnPct,
      conditioning: specimen.conditioning ?? null,
      batch: batch
        ? {
            id: batch.id,
            code: batch.code,
            recipeName: batch.revision?.recipe?.name ?? '',
            revisionNumber: batch.revision?.number ?? 0,
          }
        : null,
    },
    marks: own,
    derived,
    measurement: m
      ? {
          charLengthMm: m.charLengthMm,
          charWidthMm: m.charWidthMm,
          massBeforeG: m.massBeforeG,
          massAfterG: m.massAfterG,
          massLossPct: massLoss(m),
          flamingDrips: m.flamingDrips,
          notes: m.notes,
          updatedAt: m.updatedAt.toISOString(),
        }
      : null,
    photos: photos
      .filter((p) => p.specimenId === specimen.id)
      .map((p) => ({ id: p.id, stage: p.stage, width: p.width, height: p.height })),
  };
}

export async function getPair(labId: string, pairId: string): Promise<Pair> {
  const row = await loadPair(labId, pairId);
  const [marks, measurements, photos, history] = await Promise.all([
    MarkModel.findAll({ where: { pairId }, order: [['atMs', 'ASC']] }),
    MeasurementModel.findAll({ where: { pairId } }),
    PhotoModel.findAll({ where: { pairId }, order: [['createdAt', 'ASC']] }),
    AuditEventModel.findAll({
      where: { labId, detail: { pairId } },
      include: [{ model: UserModel, as: 'actor' }],
      order: [
        ['createdAt', 'ASC'],
        ['id', 'ASC'],
      ],
    }),
  ]);
  return {
    id: row.id,
    sessionId: row.sessionId,
    status: row.status,
    mode: row.mode as Pair['mode'],
    exposureS: row.session?.exposureS ?? 12,
    checklistComplete: Boolean(row.session?.checklistCompletedAt),
    reviewComment: row.reviewComment,
    submittedAt: row.submittedAt?.toISOString() ?? null,
    signedOffAt: row.signedOffAt?.toISOString() ?? null,
    lanes: [
      lane('control', row.control!, marks, measurements, photos),
      lane('treated', row.treated!, marks, measurements, photos),
    ],
    history: history.map((h) => ({
      at: h.createdAt.toISOString(),
      who: h.actor?.displayName ?? null,
      action: h.action,
      detail: h.detail,
    })),
  };
}

const editable = (row: BurnPairModel) => row.status === 'draft' || row.status === 'returned';

function assertEditable(row: BurnPairModel): void {
  if (!editable(row)) {
    throw new AppError(
      409,
      'locked',
      row.status === 'signed_off'
        ? 'This test is signed off: a reviewer can correct it, with a reason.'
        : 'This test is waiting for review: it changes only if the reviewer returns it.',
    );
  }
}

/**
 * Stores timer marks. Each mark's id is the client's: a mark sent again (a retry after the
 * connection dropped) is stored once, and the answer is the same.
 */
export async function addMarks(
  labId: string,
  pairId: string,
  userId: string,
  input: PostMarksInput,
): Promise<Pair> {
  const row = await loadPair(labId, pairId);
  const lanes = new Set([row.controlSpecimenId, row.treatedSpecimenId]);
  // An undo names a mark of this test: one stored before, or one sent with it.
  const undone = input.marks.flatMap((m) => (m.undoes ? [m.undoes] : []));
  const stored = new Set(
    (await MarkModel.findAll({ where: { id: undone, pairId }, attributes: ['id'] })).map(
      (m) => m.id,
    ),
  );
  const sent = new Set(input.marks.map((m) => m.id));
  const fields = input.marks.flatMap((m, i) => [
    ...(lanes.has(m.specimenId)
      ? []
      : [{ path: `marks.${i}.specimenId`, message: 'Not a specimen of this pair' }]),
    ...(m.undoes && !stored.has(m.undoes) && !sent.has(m.undoes)
      ? [{ path: `marks.${i}.undoes`, message: 'Names no mark of this test' }]
      : []),
  ]);
  if (fields.length)
    throw new AppError(400, 'invalid_request', 'Some fields are not valid.', fields);
  const known = await MarkModel.findAll({
    where: { id: input.marks.map((m) => m.id) },
    attributes: ['id', 'pairId'],
  });
  const fresh = input.marks.filter((m) => !known.some((k) => k.id === m.id));
  if (known.some((k) => k.pairId !== pairId))
    throw new AppError(409, 'already_exists', 'A mark with this id belongs to another test.');
  if (fresh.length) {
    assertEditable(row);
    if (!row.session?.checklistCompletedAt) {
      throw new AppError(
        409,
        'checklist_required',
        'Tick every item of the safety checklist before the first flame.',
      );
    }
    await MarkModel.bulkCreate(
      fresh.map((m) => ({
        id: m.id,
        labId,
        pairId,
        specimenId: m.specimenId,
        kind: m.kind,
        atMs: m.atMs,
        undoes: m.undoes ?? null,
        recordedBy: userId,
      })),
      { ignoreDuplicates: true },
    );
  }
  return getPair(labId, pairId);
}

function measurementValues(input: MeasurementInput) {
  const out: Partial<Record<keyof MeasurementInput, unknown>> = {};
  for (const key of [
    'charLengthMm',
    'charWidthMm',
    'massBeforeG',
    'massAfterG',
    'flamingDrips',
    'notes',
  ] as const) {
    if (input[key] !== undefined) out[key] = input[key];
  }
  return out as Partial<MeasurementModel>;
}

/** Saves what was measured after the burn; saving the same values again changes nothing. */
export async function putMeasurement(
  labId: string,
  pairId: string,
  specimenId: string,
  input: MeasurementInput,
): Promise<Pair> {
  const row = await loadPair(labId, pairId);
  if (specimenId !== row.controlSpecimenId && specimenId !== row.treatedSpecimenId)
    throw AppError.notFound('No such specimen in this test.');
  assertEditable(row);
  const existing = await MeasurementModel.findOne({ where: { pairId, specimenId } });
  if (existing) await existing.update(measurementValues(input));
  else {
    await MeasurementModel.create({
      labId,
      pairId,
      specimenId,
      charLengthMm: null,
      charWidthMm: null,
      massBeforeG: null,
      massAfterG: null,
      flamingDrips: null,
      notes: null,
      ...measurementValues(input),
    });
  }
  return getPair(labId, pairId);
}

/**
 * Moves a test to its next review state with its audit event, in one transaction: the history
 * never misses a step that happened, and of two reviewers acting at once only one moves it.
 */
async function movePair(
  labId: string,
  pairId: string,
  from: (status: PairStatus) => boolean,
  refusal: string,
  changes: Partial<BurnPairModel>,
  audit: Parameters<typeof recordAudit>[0],
): Promise<Pair> {
  await BurnPairModel.sequelize!.transaction(async (transaction) => {
    const row = await BurnPairModel.findOne({
      where: { id: pairId, labId },
      lock: transaction.LOCK.UPDATE,
      transaction,
    });
    if (!row) throw AppError.notFound('No such burn test in this lab.');
    if (!from(row.status)) throw new AppError(409, 'invalid_transition', refusal);
    await row.update(changes, { transaction });
    await recordAudit(audit, transaction);
  });
  return getPair(labId, pairId);
}

export function submitPair(labId: string, pairId: string, userId: string): Promise<Pair> {
  return movePair(
    labId,
    pairId,
    (status) => status === 'draft' || status === 'returned',
    'Only a draft or returned test can be submitted.',
    { status: 'submitted', submittedAt: new Date(), submittedBy: userId },
    { action: 'pair_submitted', labId, actorId: userId, detail: { pairId } },
  );
}

export function signOffPair(labId: string, pairId: string, userId: string): Promise<Pair> {
  return movePair(
    labId,
    pairId,
    (status) => status === 'submitted',
    'Only a submitted test can be signed off.',
    { status: 'signed_off', signedOffAt: new Date(), signedOffBy: userId, reviewComment: null },
    { action: 'pair_signed_off', labId, actorId: userId, detail: { pairId } },
  );
}

export function returnPair(
  labId: string,
  pairId: string,
  userId: string,
  comment: string,
): Promise<Pair> {
  return movePair(
    labId,
    pairId,
    (status) => status === 'submitted',
    'Only a submitted test can be returned.',
    { status: 'returned', reviewComment: comment },
    { action: 'pair_returned', labId, actorId: userId, detail: { pairId, comment } },
  );
}

/** Changes a signed-off measurement: the reason and the old and new values go into the history. */
export async function correctMeasurement(
  labId: string,
  pairId: string,
  userId: string,
  input: { specimenId: string; changes: MeasurementInput; reason: string },
): Promise<Pair> {
  const row = await loadPair(labId, pairId);
  if (row.status !== 'signed_off') {
    throw new AppError(
      409,
      'invalid_transition',
      'Corrections are for signed-off tests; edit a draft directly.',
    );
  }
  if (input.specimenId !== row.controlSpecimenId && input.specimenId !== row.treatedSpecimenId) {
    throw AppError.notFound('No such specimen in this test.');
  }
  await MeasurementModel.sequelize!.transaction(async (transaction) => {
    const m = await MeasurementModel.findOne({
      where: { pairId, specimenId: input.specimenId },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    const values = measurementValues(input.changes);
    const before: Record<string, unknown> = {};
    const after: Record<string, unknown> = {};
    for (const [key, value] of Object.entries(values)) {
      const old = m ? (m.get(key as keyof MeasurementModel) as unknown) : null;
      if (old !== value) {
        before[key] = old ?? null;
        after[key] = value;
      }
    }
    if (!Object.keys(after).length)
      throw new AppError(400, 'invalid_request', 'The correction changes nothing.');
    if (m) await m.update(values, { transaction });
    else {
      await MeasurementModel.create(
        {
          labId,
          pairId,
          specimenId: input.specimenId,
          charLengthMm: null,
          charWidthMm: null,
          massBeforeG: null,
          massAfterG: null,
          flamingDrips: null,
          notes: null,
          ...values,
        },
        { transaction },
      );
    }
    await recordAudit(
      {
        action: 'measurement_corrected',
        labId,
        actorId: userId,
        detail: { pairId, specimenId: input.specimenId, reason: input.reason, before, after },
      },
      transaction,
    );
  });
  return getPair(labId, pairId);
}

export async function reviewQueue(labId: string) {
  const rows = await BurnPairModel.findAll({
    where: { labId, status: 'submitted' },
    include: pairIncludes(),
    order: [['submittedAt', 'ASC']],
  });
  return rows.map((p) => ({
    ...summary(p),
    sessionId: p.sessionId,
    submittedAt: p.submittedAt?.toISOString() ?? null,
  }));
}

/** Treated specimens of the lab not yet burned, for choosing a pair. */
export async function unburnedSpecimens(labId: string) {
  const used = await BurnPairModel.findAll({ where: { labId }, attributes: ['treatedSpecimenId'] });
  const rows = await SpecimenModel.findAll({
    where: {
      labId,
      batchId: { [Op.ne]: null },
      id: { [Op.notIn]: used.map((u) => u.treatedSpecimenId) },
    },
    include: specimenIncludes(),
    order: [['createdAt', 'DESC']],
    limit: 500,
  });
  return rows.map((s) => ({
    id: s.id,
    code: s.code,
    substrate: s.substrate,
    addOnPct: toSpecimen(s).addOnPct,
    lengthMm: s.lengthMm,
    widthMm: s.widthMm,
    dryMassBeforeG: s.dryMassBeforeG,
    batchCode: s.batch?.code ?? '',
    recipeName: s.batch?.revision?.recipe?.name ?? '',
  }));
}
