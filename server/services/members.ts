import type { Transaction } from 'sequelize';
import type { Member } from '../../shared/schemas/lab';
import type { Role } from '../../shared/schemas/roles';
import { AppError } from '../errors';
import { MembershipModel, UserModel } from '../models';
import { recordAudit } from './audit';

export async function listMembers(labId: string): Promise<Member[]> {
  const rows = await MembershipModel.findAll({
    where: { labId },
    include: [{ model: UserModel, as: 'user' }],
    order: [['createdAt', 'ASC']],
  });
  return rows.map((m) => ({
    userId: m.userId,
    email: m.user!.email,
    displayName: m.user!.displayName,
    role: m.role,
    joinedAt: m.createdAt.toISOString(),
  }));
}

const notMember = () => AppError.notFound('This person is not a member of the lab.');

/**
 * Locks the lab's manager rows so that two managers demoting each other at the same time
 * cannot leave the lab without one.
 */
async function assertAnotherManager(
  labId: string,
  userId: string,
  transaction: Transaction,
): Promise<void> {
  const managers = await MembershipModel.findAll({
    where: { labId, role: 'manager' },
    lock: transaction.LOCK.UPDATE,
    transaction,
  });
  if (!managers.some((m) => m.userId !== userId)) {
    throw new AppError(
      409,
      'last_manager',
      'A lab needs at least one manager. Make someone else a manager first.',
    );
  }
}

export async function changeRole(
  labId: string,
  userId: string,
  role: Role,
  actor: { id: string; ip: string | null },
): Promise<Member> {
  await MembershipModel.sequelize!.transaction(async (transaction) => {
    const membership = await MembershipModel.findOne({ where: { labId, userId }, transaction });
    if (!membership) throw notMember();
    if (membership.role === role) return;
    if (membership.role === 'manager') await assertAnotherManager(labId, userId, transaction);
    const from = membership.role;
    await membership.update({ role }, { transaction });
    await recordAudit(
      {
        action: 'role_changed',
        labId,
        actorId: actor.id,
        targetUserId: userId,
        ip: actor.ip,
        detail: { from, to: role },
      },
      transaction,
    );
  });
  const member = (await listMembers(labId)).find((m) => m.userId === userId);
  if (!member) throw notMember();
  return member;
}

/** Removes a member; their very next request to this lab is refused, whatever token they hold. */
export async function removeMember(
  labId: string,
  userId: string,
  actor: { id: string; ip: string | null },
): Promise<void> {
  await MembershipModel.sequelize!.transaction(async (transaction) => {
    const membership = await MembershipModel.findOne({ where: { labId, userId }, transaction });
    if (!membership) throw notMember();
    if (membership.role === 'manager') await assertAnotherManager(labId, userId, transaction);
    await membership.destroy({ transaction });
    await recordAudit(
      {
        action: 'member_removed',
        labId,
        actorId: actor.id,
        targetUserId: userId,
        ip: actor.ip,
        detail: { role: membership.role },
      },
      transaction,
    );
  });
}

/** Adds an existing user to a lab directly (demo data and lab creation; people join by invitation). */
export async function addMember(labId: string, userId: string, role: Role): Promise<void> {
  await MembershipModel.create({ labId, userId, role });
}
