import type { Transaction } from 'sequelize';
import type { Lab } from '../../shared/schemas/lab';
import type { Role } from '../../shared/schemas/roles';
import { LabModel, MembershipModel } from '../models';
import { recordAudit } from './audit';

function toLab(row: LabModel, role: Role): Lab {
  return {
    id: row.id,
    name: row.name,
    createdAt: row.createdAt.toISOString(),
    role,
    weighTolerancePct: row.weighTolerancePct,
  };
}

/** A new lab with its creator as manager (inside the caller's transaction when given). */
export async function createLab(
  input: { name: string; creatorId: string; ip?: string | null },
  transaction?: Transaction,
): Promise<Lab> {
  const run = async (t: Transaction) => {
    const lab = await LabModel.create({ name: input.name }, { transaction: t });
    await MembershipModel.create(
      { labId: lab.id, userId: input.creatorId, role: 'manager' },
      { transaction: t },
    );
    await recordAudit(
      {
        action: 'lab_created',
        labId: lab.id,
        actorId: input.creatorId,
        ip: input.ip,
        detail: { name: lab.name },
      },
      t,
    );
    return toLab(lab, 'manager');
  };
  return transaction ? run(transaction) : LabModel.sequelize!.transaction(run);
}

export async function getLab(labId: string, role: Role): Promise<Lab> {
  const lab = await LabModel.findByPk(labId);
  // Membership was checked before this; a vanished lab is simply not found.
  if (!lab) throw new Error(`lab ${labId} vanished`);
  return toLab(lab, role);
}

/** The caller's role in a lab, or undefined when they are not a member (or the lab does not exist). */
export async function roleIn(labId: string, userId: string): Promise<Role | undefined> {
  const membership = await MembershipModel.findOne({ where: { labId, userId } });
  return membership?.role;
}

export async function findLabByName(
  name: string,
): Promise<{ id: string; name: string } | undefined> {
  const row = await LabModel.findOne({ where: { name } });
  return row ? { id: row.id, name: row.name } : undefined;
}
