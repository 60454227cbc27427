import { Op, type Transaction } from 'sequelize';
import type {
  ChangePasswordInput,
  Me,
  ResetConfirmInput,
  SignUpInput,
  UpdateMeInput,
  User,
} from '../../shared/schemas/auth';
import { passwordIsEmail } from '../../shared/schemas/auth';
import { AppError } from '../errors';
import { passwordResetMail } from '../mail/templates';
import { LabModel, MembershipModel, PasswordResetModel, UserModel } from '../models';
import { recordAudit } from './audit';
import { createLab } from './labs';
import type { RequestMeta, ServiceDeps } from './deps';
import { openSession, revokeAllSessions, type IssuedTokens } from './sessions';
import { csrfTokenFor, hashToken, randomToken } from './tokens';

export const RESET_TTL_MINUTES = 30;

export function toUser(row: UserModel): User {
  return { id: row.id, email: row.email, displayName: row.displayName, units: row.units };
}

export async function findUserByEmail(
  email: string,
  transaction?: Transaction,
): Promise<UserModel | null> {
  return UserModel.findOne({
    where: UserModel.sequelize!.where(
      UserModel.sequelize!.fn('lower', UserModel.sequelize!.col('email')),
      email.toLowerCase(),
    ),
    transaction,
  });
}

export async function describeMe(
  deps: ServiceDeps,
  userId: string,
  sessionId: string,
): Promise<Me> {
  const user = await UserModel.findByPk(userId);
  if (!user) throw new AppError(401, 'unauthenticated', 'Please sign in.');
  const memberships = await MembershipModel.findAll({
    where: { userId },
    include: [{ model: LabModel, as: 'lab' }],
  });
  const labs = memberships
    .filter((m) => m.lab)
    .map((m) => ({ id: m.labId, name: m.lab!.name, role: m.role }))
    .sort((a, b) => a.name.localeCompare(b.name));
  return { user: toUser(user), labs, csrfToken: csrfTokenFor(deps.config, sessionId) };
}

function refuseEmailAsPassword(password: string, email: string): void {
  if (passwordIsEmail(password, email)) {
    throw new AppError(400, 'invalid_request', 'Some fields are not valid.', [
      { path: 'password', message: 'Your password must not be your e-mail address' },
    ]);
  }
}

/** An account without a lab (demo data; people sign up or accept an invitation). */
export async function createAccount(
  deps: ServiceDeps,
  input: { email: string; displayName: string; password: string },
): Promise<User> {
  refuseEmailAsPassword(input.password, input.email);
  if (await findUserByEmail(input.email)) {
    throw new AppError(409, 'email_taken', 'An account with this e-mail address already exists.');
  }
  const passwordHash = await deps.hasher.hash(input.password);
  return toUser(
    await UserModel.create({
      email: input.email.toLowerCase(),
      displayName: input.displayName,
      passwordHash,
    }),
  );
}

/** Creates the person's account and their first lab, with them as its manager. */
export async function signUp(
  deps: ServiceDeps,
  input: SignUpInput,
  meta: RequestMeta,
): Promise<IssuedTokens & { userId: string }> {
  refuseEmailAsPassword(input.password, input.email);
  const passwordHash = await deps.hasher.hash(input.password);
  const sequelize = UserModel.sequelize!;
  const user = await sequelize.transaction(async (transaction) => {
    if (await findUserByEmail(input.email, transaction)) {
      throw new AppError(
        409,
        'email_taken',
        'An account with this e-mail address already exists. Sign in instead.',
      );
    }
    const created = await UserModel.create(
      { email: input.email, displayName: input.displayName, passwordHash },
      { transaction },
    );
    await createLab({ name: input.labName, creatorId: created.id, ip: meta.ip }, transaction);
    return created;
  });
  const tokens = await openSession(deps.config, user.id, meta);
  await recordAudit({
    action: 'sign_in',
    actorId: user.id,
    ip: meta.ip,
    detail: { via: 'sign-up' },
  });
  return { ...tokens, userId: user.id };
}

// Verifying against a fixed hash for unknown addresses keeps the answer time the same, so
// timing does not tell which addresses have accounts.
let decoyHash: Promise<string> | undefined;

export async function signIn(
  deps: ServiceDeps,
  email: string,
  password: string,
  meta: RequestMeta,
): Promise<IssuedTokens & { userId: string }> {
  const user = await findUserByEmail(email);
  decoyHash ??= deps.hasher.hash('decoy password that matches nothing');
  const ok = await deps.hasher.verify(password, user ? user.passwordHash : await decoyHash);
  if (!user || !ok) {
    await recordAudit({
      action: 'sign_in_failed',
      targetUserId: user?.id ?? null,
      ip: meta.ip,
      detail: { email },
    });
    throw new AppError(
      401,
      'invalid_credentials',
      'That e-mail address and password do not match an account.',
    );
  }
  if (deps.hasher.needsRehash(user.passwordHash)) {
    await user.update({ passwordHash: await deps.hasher.hash(password) });
  }
  const tokens = await openSession(deps.config, user.id, meta);
  await recordAudit({ action: 'sign_in', actorId: user.id, ip: meta.ip });
  return { ...tokens, userId: user.id };
}

export async function changePassword(
  deps: ServiceDeps,
  userId: string,
  sessionId: string,
  input: ChangePasswordInput,
  meta: RequestMeta,
): Promise<void> {
  const user = await UserModel.findByPk(userId);
  if (!user) throw new AppError(401, 'unauthenticated', 'Please sign in.');
  if (!(await deps.hasher.verify(input.currentPassword, user.passwordHash))) {
    throw new AppError(400, 'invalid_request', 'Some fields are not valid.', [
      { path: 'currentPassword', message: 'This is not your current password' },
    ]);
  }
  refuseEmailAsPassword(input.newPassword, user.email);
  await user.update({ passwordHash: await deps.hasher.hash(input.newPassword) });
  // Other devices must sign in again with the new password; this one stays signed in.
  const revoked = await revokeAllSessions(userId, { except: sessionId });
  await recordAudit({
    action: 'password_changed',
    actorId: userId,
    ip: meta.ip,
    detail: { otherSessionsEnded: revoked },
  });
}

/** Sends a reset link when the address has an account; answers the same either way. */
export async function requestPasswordReset(
  deps: ServiceDeps,
  email: string,
  meta: RequestMeta,
): Promise<void> {
  const user = await findUserByEmail(email);
  if (!user) return;
  const token = randomToken();
  await PasswordResetModel.create({
    userId: user.id,
    tokenHash: hashToken(token),
    expiresAt: new Date(Date.now() + RESET_TTL_MINUTES * 60_000),
  });
  await recordAudit({ action: 'password_reset_requested', targetUserId: user.id, ip: meta.ip });
  const link = `${deps.config.publicUrl}/reset-password?token=${encodeURIComponent(token)}`;
  await deps.mailer.send({
    to: user.email,
    ...passwordResetMail({
      displayName: user.displayName,
      link,
      expiresInMinutes: RESET_TTL_MINUTES,
    }),
  });
}

export async function confirmPasswordReset(
  deps: ServiceDeps,
  input: ResetConfirmInput,
  meta: RequestMeta,
): Promise<void> {
  const passwordHashFor = (user: UserModel) => {
    refuseEmailAsPassword(input.newPassword, user.email);
    return deps.hasher.hash(input.newPassword);
  };
  const sequelize = UserModel.sequelize!;
  const reset = await PasswordResetModel.findOne({ where: { tokenHash: hashToken(input.token) } });
  const user = reset ? await UserModel.findByPk(reset.userId) : null;
  if (!reset || !user || reset.usedAt || reset.expiresAt <= new Date()) {
    throw new AppError(
      400,
      'invalid_link',
      'This reset link has expired or was already used. Ask for a new one.',
    );
  }
  const passwordHash = await passwordHashFor(user);
  await sequelize.transaction(async (transaction) => {
    // Claiming the token in the same statement that checks it makes it single-use under races.
    const [claimed] = await PasswordResetModel.update(
      { usedAt: new Date() },
      { where: { id: reset.id, usedAt: null, expiresAt: { [Op.gt]: new Date() } }, transaction },
    );
    if (claimed !== 1) {
      throw new AppError(
        400,
        'invalid_link',
        'This reset link has expired or was already used. Ask for a new one.',
      );
    }
    await user.update({ passwordHash }, { transaction });
  });
  await revokeAllSessions(user.id);
  await recordAudit({ action: 'password_reset', actorId: user.id, ip: meta.ip });
}

export async function updateMe(userId: string, input: UpdateMeInput): Promise<User> {
  const user = await UserModel.findByPk(userId);
  if (!user) throw new AppError(401, 'unauthenticated', 'Please sign in.');
  await user.update(input);
  return toUser(user);
}
