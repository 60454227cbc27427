import { Op, type Transaction } from 'sequelize';
import type { AuditAction, AuditEvent, AuditPage } from '../../shared/schemas/audit';
import { AuditEventModel, MembershipModel, UserModel } from '../models';

export type AuditInput = {
  action: AuditAction;
  labId?: string | null;
  actorId?: string | null;
  targetUserId?: string | null;
  ip?: string | null;
  detail?: Record<string, unknown>;
};

export async function recordAudit(input: AuditInput, transaction?: Transaction): Promise<void> {
  await AuditEventModel.create(
    {
      action: input.action,
      labId: input.labId ?? null,
      actorId: input.actorId ?? null,
      targetUserId: input.targetUserId ?? null,
      ip: input.ip ?? null,
      detail: input.detail ?? {},
    },
    { transaction },
  );
}

const person = (u: UserModel | null | undefined) =>
  u ? { id: u.id, displayName: u.displayName, email: u.email } : null;

/**
 * A lab's log: its own events, plus account events (sign-in, password…) of people who are
 * members now, since those carry no lab.
 */
export async function listLabAudit(
  labId: string,
  page: number,
  pageSize: number,
): Promise<AuditPage> {
  const members = MembershipModel.sequelize!.literal(
    `(SELECT user_id FROM memberships WHERE lab_id = ${MembershipModel.sequelize!.escape(labId)})`,
  );
  const where = {
    [Op.or]: [
      { labId },
      {
        labId: null,
        [Op.or]: [{ actorId: { [Op.in]: members } }, { targetUserId: { [Op.in]: members } }],
      },
    ],
  };
  const { rows, count } = await AuditEventModel.findAndCountAll({
    where,
    include: [
      { model: UserModel, as: 'actor' },
      { model: UserModel, as: 'target' },
    ],
    order: [
      ['createdAt', 'DESC'],
      ['id', 'DESC'],
    ],
    limit: pageSize,
    offset: (page - 1) * pageSize,
  });
  const events: AuditEvent[] = rows.map((r) => ({
    id: String(r.id),
    at: r.createdAt.toISOString(),
    action: r.action,
    actor: person(r.actor),
    target: person(r.target),
    ip: r.ip,
    detail: r.detail,
  }));
  return { events, page, pageSize, total: count };
}
