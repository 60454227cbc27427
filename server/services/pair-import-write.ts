import { randomUUID } from 'node:crypto';
import type { CreationAttributes, Model, ModelStatic, Transaction } from 'sequelize';
import { marksForLane, msFromSeconds, type LaneTimes } from '../../shared/burn/synthesize';
import type { PairImportResult, PairImportRow } from '../../shared/schemas/pair-import';
import {
  AuditEventModel,
  BatchModel,
  BurnPairModel,
  BurnSessionModel,
  LabModel,
  MarkModel,
  MeasurementModel,
  SpecimenModel,
} from '../models';
import type { PendingImport, PendingPairRow } from '../models/pair-import';

/** Imported specimens carry percentages only; their masses are on this basis. */
export const NOMINAL_MASS_G = 100;

const CHUNK = 1000;

async function insert<M extends Model>(
  model: ModelStatic<M>,
  rows: CreationAttributes<M>[],
  transaction: Transaction,
): Promise<void> {
  for (let i = 0; i < rows.length; i += CHUNK) {
    await model.bulkCreate(rows.slice(i, i + CHUNK), { transaction });
  }
}

function laneTimes(v: PairImportRow, who: 'control' | 'treated'): LaneTimes {
  const ms = (s: number | undefined) => (s === undefined ? null : msFromSeconds(s));
  return {
    exposureMs: msFromSeconds(v.exposure_s),
    afterflameMs: ms(v[`${who}_afterflame_s`]),
    afterflameComplete: v[`${who}_afterflame_complete`] ?? true,
    afterglowMs: ms(v[`${who}_afterglow_s`]),
    totalMs: ms(v[`${who}_burn_time_s`]),
    burnedToClamp: v[`${who}_burned_to_clamp`] ?? false,
  };
}

// Rows burned on the same day under the same conditions were one sitting: one session each.
const sittingOf = (v: PairImportRow) =>
  [v.held_at, v.exposure_s, v.igniter, v.orientation, v.draft].join('|');

type Input = {
  labId: string;
  importId: string;
  fileName: string;
  user: { id: string; displayName: string };
  pending: PendingImport;
};

/** Writes every pending row inside the caller's transaction: all of them or, on failure, none. */
export async function writeImport(
  { labId, importId, fileName, user, pending }: Input,
  transaction: Transaction,
): Promise<PairImportResult> {
  const now = new Date();
  const origin = `Imported from the file "${fileName}" by ${user.displayName} on ${now.toISOString().slice(0, 10)}`;
  const basis = `Masses are on a nominal ${NOMINAL_MASS_G} g basis: the file gives the add-on and the mass loss as percentages only.`;
  const lab = await LabModel.findByPk(labId, { transaction });

  const batchIds = new Map(pending.batches.map((b) => [b.key, randomUUID()]));
  await insert(
    BatchModel,
    pending.batches.map((b) => ({
      id: batchIds.get(b.key)!,
      labId,
      revisionId: b.revisionId,
      code: b.code,
      clientId: randomUUID(),
      operatorId: null,
      preparedAt: new Date(b.preparedAt),
      target: { basis: 'water_mass' as const, grams: 100 },
      storageTempC: b.storageTempC,
      waterTempC: null,
      ph: null,
      densityGMl: null,
      tolerancePct: lab?.weighTolerancePct ?? 2,
      status: 'used_up' as const,
      discardReason: null,
      // A past batch: nobody read the cautions in this app; the import is the acknowledgement.
      cautionsAcknowledgedAt: now,
      soakStartedAt: null,
      plan: b.plan,
      notes: `${origin}. Made elsewhere, on or before ${b.preparedAt.slice(0, 10)}; what was weighed is not known.`,
    })),
    transaction,
  );

  const sittings = new Map<string, { id: string; rows: PendingPairRow[] }>();
  for (const row of pending.rows) {
    const key = sittingOf(row.values);
    const sitting = sittings.get(key) ?? { id: randomUUID(), rows: [] };
    sitting.rows.push(row);
    sittings.set(key, sitting);
  }
  await insert(
    BurnSessionModel,
    [...sittings.values()].map(({ id, rows }) => {
      const v = rows[0]!.values;
      const lines = rows.map((r) => r.line);
      return {
        id,
        labId,
        clientId: randomUUID(),
        heldAt: new Date(v.held_at),
        place: `Imported from ${fileName.slice(0, 120)} by ${user.displayName}`,
        operatorId: null,
        secondPerson: null,
        ambientTempC: null,
        ambientRhPct: null,
        draft: v.draft,
        wind: null,
        igniter: v.igniter,
        igniterDetail: null,
        exposureS: v.exposure_s,
        orientation: v.orientation,
        checklistCompletedAt: null,
        checklistCompletedBy: null,
        notes: `${origin}: ${rows.length} pairs from lines ${Math.min(...lines)}–${Math.max(...lines)}. The times are the file's; the timer marks were made from them. The safety checklist of the day was not recorded in this app.`,
        importId,
      };
    }),
    transaction,
  );

  const specimens: CreationAttributes<SpecimenModel>[] = [];
  const pairs: CreationAttributes<BurnPairModel>[] = [];
  const measurements: CreationAttributes<MeasurementModel>[] = [];
  const marks: CreationAttributes<MarkModel>[] = [];
  const events: CreationAttributes<AuditEventModel>[] = [];
  for (const sitting of sittings.values()) {
    for (const row of sitting.rows) {
      const v = row.values;
      const ids = { control: randomUUID(), treated: randomUUID(), pair: randomUUID() };
      const note = `${origin}, line ${row.line}. ${basis}`;
      const specimen = (who: 'control' | 'treated') => ({
        id: ids[who],
        labId,
        batchId:
          who === 'control'
            ? null
            : 'id' in row.batch
              ? row.batch.id
              : batchIds.get(row.batch.newKey)!,
        clientId: randomUUID(),
        code: who === 'control' ? row.controlCode : row.treatedCode,
        substrate: v.substrate,
        lengthMm: null,
        widthMm: null,
        thicknessMm: null,
        dryMassBeforeG: NOMINAL_MASS_G,
        wetMassG: null,
        dryMassAfterG:
          who === 'treated' && v.add_on_pct !== undefined
            ? NOMINAL_MASS_G * (1 + v.add_on_pct / 100)
            : null,
        notes: note,
      });
      specimens.push(specimen('control'), specimen('treated'));
      pairs.push({
        id: ids.pair,
        labId,
        sessionId: sitting.id,
        clientId: randomUUID(),
        controlSpecimenId: ids.control,
        treatedSpecimenId: ids.treated,
        mode: v.mode,
        status: 'submitted',
        reviewComment: null,
        submittedAt: now,
        submittedBy: user.id,
        signedOffAt: null,
        signedOffBy: null,
      });
      const loss = v.treated_mass_loss_pct;
      for (const who of ['control', 'treated'] as const) {
        measurements.push({
          labId,
          pairId: ids.pair,
          specimenId: ids[who],
          charLengthMm: v[`${who}_char_mm`],
          charWidthMm: null,
          massBeforeG: who === 'treated' && loss !== undefined ? NOMINAL_MASS_G : null,
          massAfterG: who === 'treated' && loss !== undefined ? NOMINAL_MASS_G - loss : null,
          flamingDrips: v[`${who}_flaming_drips`] ?? null,
          notes: null,
        });
        for (const m of marksForLane(laneTimes(v, who), randomUUID)) {
          marks.push({
            id: m.id,
            labId,
            pairId: ids.pair,
            specimenId: ids[who],
            kind: m.kind,
            atMs: m.atMs,
            undoes: null,
            recordedBy: user.id,
          });
        }
      }
      events.push({
        action: 'pair_imported',
        labId,
        actorId: user.id,
        targetUserId: null,
        ip: null,
        detail: { pairId: ids.pair, importId, fileName, line: row.line },
      });
    }
  }
  await insert(SpecimenModel, specimens, transaction);
  await insert(BurnPairModel, pairs, transaction);
  await insert(MeasurementModel, measurements, transaction);
  await insert(MarkModel, marks, transaction);
  const sessions = [...sittings.values()]
    .map((s) => ({ id: s.id, heldAt: s.rows[0]!.values.held_at, pairs: s.rows.length }))
    .sort((a, b) => a.heldAt.localeCompare(b.heldAt));
  events.push({
    action: 'pairs_imported',
    labId,
    actorId: user.id,
    targetUserId: null,
    ip: null,
    detail: { importId, fileName, pairs: pairs.length, sessionIds: sessions.map((s) => s.id) },
  });
  await insert(AuditEventModel, events, transaction);
  return { importId, fileName, status: 'accepted', importedPairs: pairs.length, sessions };
}
