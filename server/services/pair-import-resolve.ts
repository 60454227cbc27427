import type { BatchPlanOutput } from '../../shared/schemas/batch';
import { pairImportRowSchema, type PairImportRow } from '../../shared/schemas/pair-import';
import { AppError } from '../errors';
import { BatchModel, RecipeModel, RecipeRevisionModel, SpecimenModel } from '../models';
import type { PendingBatch, PendingImport, PendingPairRow } from '../models/pair-import';
import { planForRevision } from './batches';
import type { CsvRow } from './pair-import-csv';
import { loadRevision } from './recipes';

export type CheckedRow = {
  line: number;
  cells: Record<string, string>;
  values: PairImportRow | null;
  errors: { field: string; message: string }[];
  resolved?: PendingPairRow;
};

/** Each row against the row schema alone; nothing about the lab yet. */
export function checkRows(rows: CsvRow[]): CheckedRow[] {
  return rows.map((r) => {
    const errors = r.problems.map((message) => ({ field: 'line', message }));
    const parsed = pairImportRowSchema.safeParse(r.cells);
    if (!parsed.success) {
      for (const issue of parsed.error.issues) {
        errors.push({ field: String(issue.path[0] ?? 'line'), message: issue.message });
      }
    }
    return { line: r.line, cells: r.cells, values: parsed.success ? parsed.data : null, errors };
  });
}

const norm = (name: string) => name.trim().toLowerCase();

type Revision = { id: string; label: string; mixingTempC: number };

async function revisionsByName(labId: string) {
  const recipes = await RecipeModel.findAll({
    where: { labId },
    include: [{ model: RecipeRevisionModel, as: 'revisions' }],
  });
  const byName = new Map<string, RecipeModel[]>();
  for (const r of recipes) byName.set(norm(r.name), [...(byName.get(norm(r.name)) ?? []), r]);
  const labels = new Map<string, string>();
  for (const r of recipes) {
    for (const v of r.revisions ?? []) labels.set(v.id, `${r.name} rev. ${v.number}`);
  }
  return { byName, labels };
}

function findRevision(
  byName: Map<string, RecipeModel[]>,
  v: PairImportRow,
): Revision | { field: string; message: string } {
  const found = byName.get(norm(v.recipe)) ?? [];
  if (!found.length)
    return { field: 'recipe', message: `No recipe named "${v.recipe}" in this lab` };
  if (found.length > 1) {
    return { field: 'recipe', message: `Two recipes of this lab are named "${v.recipe}"` };
  }
  const recipe = found[0]!;
  const revisions = [...(recipe.revisions ?? [])].sort((a, b) => a.number - b.number);
  const revision = revisions.find((r) => r.number === v.revision);
  if (!revision) {
    return {
      field: 'revision',
      message: `"${recipe.name}" has no revision ${v.revision} (it has ${revisions.map((r) => r.number).join(', ')})`,
    };
  }
  return {
    id: revision.id,
    label: `${recipe.name} rev. ${revision.number}`,
    mixingTempC: revision.mixingTempC,
  };
}

/** Specimen codes: given or made up, never one the lab or another row of the file already has. */
async function assignCodes(labId: string, prefix: string, rows: CheckedRow[]) {
  const codes = new Map<CheckedRow, { control: string; treated: string }>();
  for (const row of rows) {
    codes.set(row, {
      control: row.values!.control_code ?? `${prefix}-L${row.line}-C`,
      treated: row.values!.treated_code ?? `${prefix}-L${row.line}-T`,
    });
  }
  const all = [...codes.values()].flatMap((c) => [c.control, c.treated]);
  const taken = new Set(
    (await SpecimenModel.findAll({ where: { labId, code: all }, attributes: ['code'] })).map(
      (s) => s.code,
    ),
  );
  const firstLine = new Map<string, number>();
  for (const row of rows) {
    const own = codes.get(row)!;
    for (const who of ['control', 'treated'] as const) {
      const code = own[who];
      const seen = firstLine.get(code);
      if (taken.has(code)) {
        row.errors.push({
          field: `${who}_code`,
          message: `${code} is already a specimen of this lab`,
        });
      } else if (seen !== undefined && seen !== row.line) {
        row.errors.push({ field: `${who}_code`, message: `${code} is also on line ${seen}` });
      }
      if (seen === undefined) firstLine.set(code, row.line);
    }
  }
  return codes;
}

// Batch codes are numbered per lab and day, so another lab's code is often taken here already.
const importedCode = (code: string) => `${code} (imported)`;

/**
 * The lab's batch of this code and revision (or of its imported twin), or the code a new
 * imported batch takes: the file's own, else its imported twin, else none free.
 */
function batchFor(
  code: string | undefined,
  revisionId: string,
  existing: Map<string, BatchModel>,
): { id: string; code: string } | { code: string | undefined } | { message: string } {
  if (!code) return { code: undefined };
  const own = existing.get(code);
  const twin = existing.get(importedCode(code));
  if (own?.revisionId === revisionId) return { id: own.id, code: own.code };
  if (twin?.revisionId === revisionId) return { id: twin.id, code: twin.code };
  if (!own) return { code };
  if (!twin) return { code: importedCode(code) };
  return {
    message: `Batch codes ${code} and ${importedCode(code)} are both taken by other recipes`,
  };
}

const IMPORTED_PLAN_NOTE =
  'Imported batch: the plan is the recipe per 100 g of water; the batch size and what was weighed are not known.';

/** Plans once per revision; a recipe the calculator refuses cannot take an imported batch. */
async function planFor(
  labId: string,
  revisionId: string,
  cache: Map<string, BatchPlanOutput | string>,
) {
  if (!cache.has(revisionId)) {
    try {
      const revision = await loadRevision(labId, revisionId);
      const plan = planForRevision(
        revision,
        { basis: 'water_mass', grams: 100 },
        revision.mixingTempC,
      );
      cache.set(revisionId, { ...plan, assumptions: [...plan.assumptions, IMPORTED_PLAN_NOTE] });
    } catch (err) {
      if (!(err instanceof AppError)) throw err;
      cache.set(revisionId, err.fields?.[0]?.message ?? err.message);
    }
  }
  return cache.get(revisionId)!;
}

/**
 * Resolves the rows that passed the schema against the lab: recipe revisions, specimen codes, and
 * batches (one of the lab's own by its code, or one this import records). Adds the errors found to
 * the rows; the rows left without errors come back ready to write.
 */
export async function resolveRows(
  labId: string,
  importId: string,
  rows: CheckedRow[],
): Promise<PendingImport> {
  const prefix = `IMP-${importId.slice(0, 8).toUpperCase()}`;
  const { byName, labels } = await revisionsByName(labId);
  const candidates = rows.filter((r) => r.values);
  const revisionOf = new Map<CheckedRow, Revision>();
  for (const row of candidates) {
    const found = findRevision(byName, row.values!);
    if ('field' in found) row.errors.push(found);
    else revisionOf.set(row, found);
  }
  const codes = await assignCodes(labId, prefix, candidates);

  const given = [...new Set(candidates.flatMap((r) => (r.values!.batch ? [r.values!.batch] : [])))];
  const existing = new Map(
    (
      await BatchModel.findAll({ where: { labId, code: [...given, ...given.map(importedCode)] } })
    ).map((b) => [b.code, b]),
  );
  const batches = new Map<string, PendingBatch & { line: number }>();
  const plans = new Map<string, BatchPlanOutput | string>();
  const pending: PendingPairRow[] = [];
  for (const row of candidates) {
    const v = row.values!;
    const revision = revisionOf.get(row);
    if (row.errors.length || !revision) continue;
    const choice = batchFor(v.batch, revision.id, existing);
    if ('message' in choice) {
      row.errors.push({ field: 'batch', message: choice.message });
      continue;
    }
    let batch: PendingPairRow['batch'];
    let batchCode: string;
    if ('id' in choice) {
      batch = { id: choice.id };
      batchCode = choice.code;
    } else {
      const key = v.batch ? `code:${choice.code}` : `auto:${revision.id}`;
      const known = batches.get(key);
      if (known && known.revisionId !== revision.id) {
        row.errors.push({
          field: 'batch',
          message: `Batch ${v.batch} is given for ${labels.get(known.revisionId)} on line ${known.line}`,
        });
        continue;
      }
      const plan = await planFor(labId, revision.id, plans);
      if (typeof plan === 'string') {
        row.errors.push({ field: 'recipe', message: `Cannot record a batch of it: ${plan}` });
        continue;
      }
      if (!known) {
        const autoCount = [...batches.keys()].filter((k) => k.startsWith('auto:')).length;
        batches.set(key, {
          key,
          code: choice.code ?? `${prefix}-B${autoCount + 1}`,
          revisionId: revision.id,
          preparedAt: v.held_at,
          // Not known; the mixing temperature keeps the plan free of invented crystallisation.
          storageTempC: revision.mixingTempC,
          plan,
          line: row.line,
        });
      } else if (v.held_at < known.preparedAt) {
        known.preparedAt = v.held_at;
      }
      batch = { newKey: key };
      batchCode = batches.get(key)!.code;
    }
    const { control, treated } = codes.get(row)!;
    row.resolved = {
      line: row.line,
      values: v,
      revisionId: revision.id,
      batch,
      batchCode,
      controlCode: control,
      treatedCode: treated,
    };
    pending.push(row.resolved);
  }
  return {
    rows: pending,
    batches: [...batches.values()].map(({ line: _line, ...b }) => b),
  };
}
