import { UniqueConstraintError } from 'sequelize';
import { criteriaPresets } from '../../shared/criteria/presets';
import type { CriteriaProfile } from '../../shared/criteria/types';
import type { CriteriaProfileOutput } from '../../shared/schemas/criteria';
import { AppError } from '../errors';
import { CriteriaProfileModel } from '../models';

function toProfile(row: CriteriaProfileModel): CriteriaProfileOutput {
  return {
    id: row.id,
    name: row.name,
    description: row.description,
    source: row.source,
    presetKey: row.presetKey,
    minSpecimens: row.minSpecimens,
    exposureS: row.exposureS,
    rules: row.rules,
    updatedAt: row.updatedAt.toISOString(),
  };
}

const nameTaken = () =>
  new AppError(409, 'already_exists', 'The lab already has a criteria profile with this name.', [
    { path: 'name', message: 'Already used in this lab' },
  ]);

async function saving<T>(run: () => Promise<T>): Promise<T> {
  try {
    return await run();
  } catch (err) {
    if (err instanceof UniqueConstraintError) throw nameTaken();
    throw err;
  }
}

export async function listProfiles(labId: string): Promise<CriteriaProfileOutput[]> {
  const rows = await CriteriaProfileModel.findAll({ where: { labId }, order: [['name', 'ASC']] });
  return rows.map(toProfile);
}

export async function findProfile(labId: string, profileId: string): Promise<CriteriaProfileModel> {
  const row = await CriteriaProfileModel.findOne({ where: { id: profileId, labId } });
  if (!row) throw AppError.notFound('No such criteria profile in this lab.');
  return row;
}

export async function createProfile(
  labId: string,
  input: CriteriaProfile,
  presetKey: string | null = null,
): Promise<CriteriaProfileOutput> {
  return saving(async () =>
    toProfile(
      await CriteriaProfileModel.create({
        labId,
        name: input.name,
        description: input.description ?? null,
        source: input.source ?? null,
        presetKey,
        minSpecimens: input.minSpecimens,
        exposureS: input.exposureS ?? null,
        rules: input.rules,
      }),
    ),
  );
}

/** Copies a preset into the lab, where it can then be edited; a second copy gets a new name. */
export async function copyPreset(labId: string, presetKey: string): Promise<CriteriaProfileOutput> {
  const preset = criteriaPresets.find((p) => p.key === presetKey);
  if (!preset) {
    throw new AppError(400, 'invalid_request', 'Some fields are not valid.', [
      { path: 'presetKey', message: 'No such preset' },
    ]);
  }
  const taken = new Set((await listProfiles(labId)).map((p) => p.name.toLowerCase()));
  let name = preset.name;
  for (let n = 2; taken.has(name.toLowerCase()); n++) name = `${preset.name} (${n})`;
  return createProfile(
    labId,
    {
      name,
      description: [preset.description, preset.caution].filter(Boolean).join(' '),
      source: preset.source,
      minSpecimens: preset.minSpecimens,
      exposureS: preset.exposureS,
      rules: preset.rules.map((r) => ({ ...r })),
    } as CriteriaProfile,
    preset.key,
  );
}

export async function updateProfile(
  labId: string,
  profileId: string,
  input: CriteriaProfile,
): Promise<CriteriaProfileOutput> {
  const row = await findProfile(labId, profileId);
  return saving(async () =>
    toProfile(
      await row.update({
        name: input.name,
        description: input.description ?? null,
        source: input.source ?? null,
        minSpecimens: input.minSpecimens,
        exposureS: input.exposureS ?? null,
        rules: input.rules,
      }),
    ),
  );
}

export async function deleteProfile(labId: string, profileId: string): Promise<void> {
  const row = await findProfile(labId, profileId);
  await row.destroy();
}
