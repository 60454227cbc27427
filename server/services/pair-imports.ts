import { randomUUID } from 'node:crypto';
import { Op, UniqueConstraintError } from 'sequelize';
import type { PairImportPreview, PairImportResult } from '../../shared/schemas/pair-import';
import { AppError } from '../errors';
import { PairImportModel } from '../models';
import { readPairsCsv } from './pair-import-csv';
import { checkRows, resolveRows, type CheckedRow } from './pair-import-resolve';
import { writeImport } from './pair-import-write';

/** How long a previewed file waits to be accepted. */
export const IMPORT_TTL_MS = 24 * 3600 * 1000;

const nullIfUndefined = (values: object) =>
  Object.fromEntries(
    Object.entries(values).map(([k, v]) => [k, (v ?? null) as string | number | boolean | null]),
  );

function valuesOf(row: CheckedRow) {
  const resolved = row.resolved;
  if (!resolved || row.errors.length) return row.cells;
  return {
    ...nullIfUndefined(resolved.values),
    control_code: resolved.controlCode,
    treated_code: resolved.treatedCode,
    batch: resolved.batchCode,
    /** True when the import records the batch; false when it is one of the lab's. */
    batch_new: 'newKey' in resolved.batch,
  };
}

/**
 * Reads and checks a pairs file and keeps its valid rows, resolved against the lab, until someone
 * accepts or discards them. Writes no burn record.
 */
export async function previewImport(
  labId: string,
  userId: string,
  fileName: string,
  text: string,
): Promise<PairImportPreview> {
  const csv = readPairsCsv(text);
  const id = randomUUID();
  const rows = checkRows(csv.rows);
  const pending = await resolveRows(labId, id, rows);
  const expiresAt = new Date(Date.now() + IMPORT_TTL_MS);
  // Housekeeping on the way: previews nobody accepted in time.
  await PairImportModel.destroy({
    where: { labId, status: { [Op.ne]: 'accepted' }, expiresAt: { [Op.lt]: new Date() } },
  });
  const validCount = pending.rows.length;
  await PairImportModel.create({
    id,
    labId,
    createdBy: userId,
    fileName,
    pending,
    validCount,
    errorCount: rows.length - validCount,
    expiresAt,
  });
  return {
    importId: id,
    fileName,
    expiresAt: expiresAt.toISOString(),
    ignoredColumns: csv.ignoredColumns,
    rows: rows.map((r) => ({
      line: r.line,
      ok: !r.errors.length,
      errors: r.errors,
      values: valuesOf(r),
    })),
    validCount,
    errorCount: rows.length - validCount,
  };
}

const gone = (why: string) =>
  new AppError(409, 'invalid_transition', `This import ${why}: upload the file again.`);

/**
 * Writes the valid rows in one transaction. The import row is locked first, so a second accept
 * (a retry, another tab, another server) waits, then finds it accepted and answers the same.
 */
export async function acceptImport(
  labId: string,
  importId: string,
  user: { id: string; displayName: string },
): Promise<PairImportResult> {
  try {
    return await PairImportModel.sequelize!.transaction(async (transaction) => {
      const row = await PairImportModel.findOne({
        where: { id: importId, labId },
        transaction,
        lock: transaction.LOCK.UPDATE,
      });
      if (!row) throw AppError.notFound('No such import in this lab.');
      if (row.status === 'accepted' && row.result) return row.result;
      if (row.status === 'discarded') throw gone('was discarded');
      if (row.expiresAt.getTime() < Date.now()) throw gone('has expired');
      if (!row.pending?.rows.length) {
        throw new AppError(409, 'invalid_transition', 'No row of this file can be imported.');
      }
      const result = await writeImport(
        { labId, importId, fileName: row.fileName, user, pending: row.pending },
        transaction,
      );
      await row.update(
        { status: 'accepted', acceptedAt: new Date(), acceptedBy: user.id, result, pending: null },
        { transaction },
      );
      return result;
    });
  } catch (err) {
    if (!(err instanceof UniqueConstraintError)) throw err;
    throw new AppError(
      409,
      'already_exists',
      'A specimen or batch code of the file has been taken in the lab since the preview: upload the file again.',
    );
  }
}

/** Drops a pending import; discarding it again changes nothing. */
export async function discardImport(labId: string, importId: string): Promise<void> {
  const row = await PairImportModel.findOne({ where: { id: importId, labId } });
  if (!row) throw AppError.notFound('No such import in this lab.');
  if (row.status === 'accepted') {
    throw new AppError(
      409,
      'invalid_transition',
      'This import is already in the lab: its tests go through review like any other.',
    );
  }
  if (row.status === 'pending') await row.update({ status: 'discarded', pending: null });
}
