import { Op } from 'sequelize';
import type { Config } from '../config';
import { AppError } from '../errors';
import { SessionModel, UserModel } from '../models';
import type { RequestMeta } from './deps';
import { hashToken, randomToken, signAccessToken } from './tokens';

export type IssuedTokens = { sessionId: string; accessToken: string; refreshToken: string };

const DAY_MS = 24 * 60 * 60 * 1000;

export async function openSession(
  config: Config,
  userId: string,
  meta: RequestMeta,
): Promise<IssuedTokens> {
  const refreshToken = randomToken();
  const session = await SessionModel.create({
    userId,
    refreshTokenHash: hashToken(refreshToken),
    userAgent: meta.userAgent?.slice(0, 300) ?? null,
    ip: meta.ip,
    expiresAt: new Date(Date.now() + config.auth.refreshTtlDays * DAY_MS),
  });
  return {
    sessionId: session.id,
    accessToken: signAccessToken(config, { userId, sessionId: session.id }),
    refreshToken,
  };
}

const expiredLink = () =>
  new AppError(401, 'unauthenticated', 'Your sign-in has ended. Please sign in again.');

/** Swaps a refresh token for a new pair; the old refresh token stops working at once. */
export async function rotateSession(
  config: Config,
  refreshToken: string,
): Promise<IssuedTokens & { userId: string }> {
  const next = randomToken();
  const [count, rows] = await SessionModel.update(
    { refreshTokenHash: hashToken(next), lastUsedAt: new Date() },
    {
      where: {
        refreshTokenHash: hashToken(refreshToken),
        revokedAt: null,
        expiresAt: { [Op.gt]: new Date() },
      },
      returning: true,
    },
  );
  const session = rows[0];
  if (count !== 1 || !session) throw expiredLink();
  return {
    userId: session.userId,
    sessionId: session.id,
    accessToken: signAccessToken(config, { userId: session.userId, sessionId: session.id }),
    refreshToken: next,
  };
}

/** The signed-in user behind a session that is still open, or a 401. */
export async function activeSessionUser(sessionId: string, userId: string): Promise<UserModel> {
  const session = await SessionModel.findOne({
    where: { id: sessionId, userId, revokedAt: null, expiresAt: { [Op.gt]: new Date() } },
  });
  const user = session ? await UserModel.findByPk(userId) : null;
  if (!user) throw expiredLink();
  return user;
}

export async function revokeSession(sessionId: string): Promise<void> {
  await SessionModel.update(
    { revokedAt: new Date() },
    { where: { id: sessionId, revokedAt: null } },
  );
}

export async function revokeAllSessions(
  userId: string,
  options: { except?: string } = {},
): Promise<number> {
  const [count] = await SessionModel.update(
    { revokedAt: new Date() },
    {
      where: {
        userId,
        revokedAt: null,
        ...(options.except ? { id: { [Op.ne]: options.except } } : {}),
      },
    },
  );
  return count;
}
