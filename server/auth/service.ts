import { and, eq, sql } from 'drizzle-orm';
import type { z } from 'zod';
import type { Db } from '../../db/client';
import { sessions, shops, users } from '../../db/schema';
import type { loginSchema, signupSchema } from '../../shared/schemas/auth';
import type { AppContext } from '../context';
import { HttpError } from '../http/errors';
import { accountExistsMail, confirmSignupMail, resetMail } from '../mail/templates';
import { dummyVerify, hashPassword, verifyPassword } from './passwords';
import type { SessionUser } from './session-user';
import { consumeToken, issueToken, revokeTokensOf } from './tokens';

// One answer for a wrong password, an unknown e-mail, a disabled account and a paused one, so
// sign-in tells nobody which addresses have accounts.
export const GENERIC_LOGIN_FAILURE =
  'That e-mail and password do not match an active account. After several failed tries sign-in pauses for a while; reset the password if you are stuck.';

// Account back-off: free attempts, then a lock that doubles per failure up to an hour.
// That keeps failures far below ASVS 2.2.1's 100 per hour per account.
const FREE_FAILURES = 5;
const MAX_LOCK_MS = 60 * 60_000;
export const lockDurationMs = (failures: number) =>
  failures < FREE_FAILURES ? 0 : Math.min(MAX_LOCK_MS, 30_000 * 2 ** (failures - FREE_FAILURES));

export async function loadSessionUser(db: Db, userId: number): Promise<(SessionUser & { disabled: boolean; passwordChangedAt: Date | null }) | null> {
  const [row] = await db
    .select({
      id: users.id,
      name: users.name,
      email: users.email,
      role: users.role,
      shopId: users.shopId,
      shopName: shops.name,
      shopCountry: shops.country,
      shopTimeZone: shops.timeZone,
      disabled: users.disabled,
      passwordChangedAt: users.passwordChangedAt,
    })
    .from(users)
    .innerJoin(shops, eq(shops.id, users.shopId))
    .where(eq(users.id, userId));
  return row ?? null;
}

export const toSessionUser = ({ id, name, email, role, shopId, shopName, shopCountry, shopTimeZone }: SessionUser): SessionUser => ({
  id,
  name,
  email,
  role,
  shopId,
  shopName,
  shopCountry,
  shopTimeZone,
});

/**
 * Starts a sign-up. Answered the same whether or not the address has an account (no probing):
 * a new address gets a shop whose manager has no password yet and a link that sets it (the
 * invite flow), proving the address; a taken one gets a mail telling its owner, with a reset link.
 */
export async function signUp(ctx: AppContext, input: z.infer<typeof signupSchema>): Promise<void> {
  const [existing] = await ctx.db.select({ id: users.id }).from(users).where(eq(users.email, input.email));
  if (existing) return mailAccountExists(ctx, input.email);
  let userId: number;
  try {
    userId = await ctx.db.transaction(async (tx) => {
      const [shop] = await tx.insert(shops).values({ name: input.shopName }).$returningId();
      const [user] = await tx.insert(users).values({ shopId: shop!.id, name: input.name, email: input.email, role: 'manager' }).$returningId();
      return user!.id;
    });
  } catch (err) {
    // two sign-ups with one address at once: the loser is told like any taken address
    if (isDuplicate(err)) return mailAccountExists(ctx, input.email);
    throw err;
  }
  const token = await issueToken(ctx.db, userId, 'invite');
  await ctx.mailer.send(confirmSignupMail(input.email, input.name, input.shopName, `${ctx.config.publicUrl}/set-password?token=${token}&kind=invite`));
}

async function mailAccountExists(ctx: AppContext, email: string) {
  const [user] = await ctx.db.select({ id: users.id, name: users.name, disabled: users.disabled }).from(users).where(eq(users.email, email));
  if (!user) return;
  const resetUrl = user.disabled ? null : `${ctx.config.publicUrl}/set-password?token=${await issueToken(ctx.db, user.id, 'reset')}&kind=reset`;
  await ctx.mailer.send(accountExistsMail(email, user.name, resetUrl));
}

export function isDuplicate(err: unknown): boolean {
  const cause = (err as { cause?: { code?: string } })?.cause ?? (err as { code?: string });
  return cause?.code === 'ER_DUP_ENTRY';
}

/** Checks a sign-in; throws 401 with one generic message, also while the account is backed off. */
export async function authenticate(db: Db, input: z.infer<typeof loginSchema>): Promise<SessionUser> {
  const [user] = await db.select().from(users).where(eq(users.email, input.email));
  if (!user || !user.passwordHash) {
    await dummyVerify(input.password);
    throw new HttpError(401, 'bad_credentials', GENERIC_LOGIN_FAILURE);
  }
  if (user.lockedUntil && user.lockedUntil.getTime() > Date.now()) {
    // the password is not even checked while paused; the dummy hash keeps the timing of a check
    await dummyVerify(input.password);
    throw new HttpError(401, 'bad_credentials', GENERIC_LOGIN_FAILURE);
  }
  const ok = await verifyPassword(user.passwordHash, input.password);
  if (!ok || user.disabled) {
    const failures = user.failedLogins + 1;
    const lock = lockDurationMs(failures);
    await db
      .update(users)
      .set({ failedLogins: failures, lockedUntil: lock ? new Date(Date.now() + lock) : null })
      .where(eq(users.id, user.id));
    throw new HttpError(401, 'bad_credentials', GENERIC_LOGIN_FAILURE);
  }
  if (user.failedLogins > 0) await db.update(users).set({ failedLogins: 0, lockedUntil: null }).where(eq(users.id, user.id));
  return toSessionUser((await loadSessionUser(db, user.id))!);
}

/** Ends every session of a user on the server (password change, disabled account). */
export async function endSessionsOf(db: Db, userId: number) {
  await db.delete(sessions).where(sql`JSON_VALUE(${sessions.data}, '$.passport.user') = ${userId}`);
}

export async function requestPasswordReset(ctx: AppContext, email: string) {
  const [user] = await ctx.db
    .select({ id: users.id, name: users.name, email: users.email })
    .from(users)
    .where(and(eq(users.email, email), eq(users.disabled, false)));
  if (!user) return;
  const token = await issueToken(ctx.db, user.id, 'reset');
  await ctx.mailer.send(resetMail(user.email, user.name, `${ctx.config.publicUrl}/set-password?token=${token}&kind=reset`));
}

export async function setPasswordWithToken(db: Db, token: string, password: string) {
  const used = await consumeToken(db, token);
  if (!used) throw new HttpError(400, 'bad_token', 'That link has expired or was already used. Ask for a new one.');
  const passwordHash = await hashPassword(password);
  await db
    .update(users)
    .set({ passwordHash, passwordChangedAt: new Date(), failedLogins: 0, lockedUntil: null })
    .where(eq(users.id, used.userId));
  await revokeTokensOf(db, used.userId);
  await endSessionsOf(db, used.userId);
  return used;
}
