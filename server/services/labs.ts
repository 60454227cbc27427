import { labNameSchema, type Lab } from '../../shared/schemas/lab';
import { LabModel } from '../models';

function toLab(row: LabModel): Lab {
  return { id: row.id, name: row.name, createdAt: row.createdAt.toISOString() };
}

export async function createLab(input: { name: string }): Promise<Lab> {
  const row = await LabModel.create({ name: labNameSchema.parse(input.name) });
  return toLab(row);
}

export async function findLabByName(name: string): Promise<Lab | undefined> {
  const row = await LabModel.findOne({ where: { name } });
  return row ? toLab(row) : undefined;
}
