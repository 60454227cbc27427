import { Op } from 'sequelize';
import type { AcceptInvitationInput } from '../../shared/schemas/auth';
import { passwordIsEmail } from '../../shared/schemas/auth';
import {
  INVITATION_TTL_DAYS,
  type CreateInvitationInput,
  type Invitation,
  type InvitationPreview,
} from '../../shared/schemas/invitation';
import { AppError } from '../errors';
import { invitationMail } from '../mail/templates';
import { InvitationModel, LabModel, MembershipModel, UserModel } from '../models';
import { findUserByEmail } from './accounts';
import { recordAudit } from './audit';
import type { RequestMeta, ServiceDeps } from './deps';
import { openSession, type IssuedTokens } from './sessions';
import { hashToken, randomToken } from './tokens';

const DAY_MS = 24 * 60 * 60 * 1000;

function statusOf(row: InvitationModel): Invitation['status'] {
  if (row.acceptedAt) return 'accepted';
  if (row.revokedAt) return 'revoked';
  return row.expiresAt <= new Date() ? 'expired' : 'pending';
}

function toInvitation(row: InvitationModel): Invitation {
  return {
    id: row.id,
    email: row.email,
    role: row.role,
    invitedBy: row.inviter?.displayName ?? null,
    createdAt: row.createdAt.toISOString(),
    expiresAt: row.expiresAt.toISOString(),
    status: statusOf(row),
  };
}

export async function createInvitation(
  deps: ServiceDeps,
  labId: string,
  input: CreateInvitationInput,
  actor: { id: string; ip: string | null },
): Promise<Invitation> {
  const existing = await findUserByEmail(input.email);
  if (existing && (await MembershipModel.count({ where: { labId, userId: existing.id } }))) {
    throw new AppError(409, 'already_member', 'This person is already a member of the lab.', [
      { path: 'email', message: 'Already a member of this lab' },
    ]);
  }
  const lab = await LabModel.findByPk(labId);
  const inviter = await UserModel.findByPk(actor.id);
  if (!lab || !inviter) throw AppError.notFound();
  const token = randomToken();
  const row = await InvitationModel.create({
    labId,
    email: input.email,
    role: input.role,
    tokenHash: hashToken(token),
    invitedBy: actor.id,
    expiresAt: new Date(Date.now() + INVITATION_TTL_DAYS * DAY_MS),
  });
  await deps.mailer.send({
    to: input.email,
    ...invitationMail({
      labName: lab.name,
      inviterName: inviter.displayName,
      role: input.role,
      link: `${deps.config.publicUrl}/invitations/${encodeURIComponent(token)}`,
      expiresAt: row.expiresAt,
    }),
  });
  await recordAudit({
    action: 'invitation_sent',
    labId,
    actorId: actor.id,
    ip: actor.ip,
    detail: { email: input.email, role: input.role },
  });
  row.inviter = inviter;
  return toInvitation(row);
}

export async function listInvitations(labId: string): Promise<Invitation[]> {
  const rows = await InvitationModel.findAll({
    where: { labId },
    include: [{ model: UserModel, as: 'inviter' }],
    order: [['createdAt', 'DESC']],
    limit: 200,
  });
  return rows.map(toInvitation);
}

export async function revokeInvitation(
  labId: string,
  invitationId: string,
  actor: { id: string; ip: string | null },
): Promise<void> {
  const [count] = await InvitationModel.update(
    { revokedAt: new Date() },
    { where: { id: invitationId, labId, acceptedAt: null, revokedAt: null } },
  );
  if (count !== 1) throw AppError.notFound('No open invitation with this id.');
  await recordAudit({
    action: 'invitation_revoked',
    labId,
    actorId: actor.id,
    ip: actor.ip,
    detail: { invitationId },
  });
}

const invalidLink = () =>
  new AppError(
    400,
    'invalid_link',
    'This invitation link has expired, was already used or was withdrawn. Ask for a new one.',
  );

async function openInvitation(token: string): Promise<InvitationModel> {
  const row = await InvitationModel.findOne({
    where: { tokenHash: hashToken(token) },
    include: [
      { model: LabModel, as: 'lab' },
      { model: UserModel, as: 'inviter' },
    ],
  });
  if (!row || statusOf(row) !== 'pending' || !row.lab) throw invalidLink();
  return row;
}

export async function previewInvitation(token: string): Promise<InvitationPreview> {
  const row = await openInvitation(token);
  return {
    labName: row.lab!.name,
    email: row.email,
    role: row.role,
    inviterName: row.inviter?.displayName ?? null,
    expiresAt: row.expiresAt.toISOString(),
    accountExists: Boolean(await findUserByEmail(row.email)),
  };
}

/**
 * Someone signed in as the invited address joins the lab. Someone new gives a name and a
 * password, gets an account for the invited address, joins, and is signed in.
 */
export async function acceptInvitation(
  deps: ServiceDeps,
  token: string,
  input: AcceptInvitationInput,
  signedInUserId: string | undefined,
  meta: RequestMeta,
): Promise<{ labId: string; tokens?: IssuedTokens & { userId: string } }> {
  const invitation = await openInvitation(token);
  const existing = await findUserByEmail(invitation.email);
  let userId: string;
  let newPasswordHash: string | undefined;

  if (existing) {
    if (!signedInUserId) {
      throw new AppError(
        401,
        'sign_in_required',
        'You already have an account: sign in, then open the link again.',
      );
    }
    if (signedInUserId !== existing.id) {
      throw new AppError(
        403,
        'wrong_account',
        `This invitation is for ${invitation.email}. Sign in with that address to accept it.`,
      );
    }
    userId = existing.id;
  } else {
    const fields = [];
    if (!input.displayName) fields.push({ path: 'displayName', message: 'Enter your name' });
    if (!input.password) fields.push({ path: 'password', message: 'Choose a password' });
    else if (passwordIsEmail(input.password, invitation.email)) {
      fields.push({ path: 'password', message: 'Your password must not be your e-mail address' });
    }
    if (fields.length)
      throw new AppError(400, 'invalid_request', 'Some fields are not valid.', fields);
    newPasswordHash = await deps.hasher.hash(input.password!);
    userId = '';
  }

  await InvitationModel.sequelize!.transaction(async (transaction) => {
    // Claim the invitation first: the link works once even when opened twice at the same moment.
    const [claimed] = await InvitationModel.update(
      { acceptedAt: new Date() },
      {
        where: {
          id: invitation.id,
          acceptedAt: null,
          revokedAt: null,
          expiresAt: { [Op.gt]: new Date() },
        },
        transaction,
      },
    );
    if (claimed !== 1) throw invalidLink();
    if (newPasswordHash) {
      if (await findUserByEmail(invitation.email, transaction)) {
        throw new AppError(
          409,
          'email_taken',
          'An account with this e-mail address already exists. Sign in instead.',
        );
      }
      const user = await UserModel.create(
        { email: invitation.email, displayName: input.displayName!, passwordHash: newPasswordHash },
        { transaction },
      );
      userId = user.id;
    }
    const already = await MembershipModel.findOne({
      where: { labId: invitation.labId, userId },
      transaction,
    });
    if (!already) {
      await MembershipModel.create(
        { labId: invitation.labId, userId, role: invitation.role },
        { transaction },
      );
    }
    await recordAudit(
      {
        action: 'invitation_accepted',
        labId: invitation.labId,
        actorId: userId,
        ip: meta.ip,
        detail: { role: invitation.role },
      },
      transaction,
    );
  });

  if (!newPasswordHash) return { labId: invitation.labId };
  const tokens = await openSession(deps.config, userId, meta);
  await recordAudit({
    action: 'sign_in',
    actorId: userId,
    ip: meta.ip,
    detail: { via: 'invitation' },
  });
  return { labId: invitation.labId, tokens: { ...tokens, userId } };
}
